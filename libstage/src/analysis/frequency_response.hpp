// The small-signal sweep at a bias point already solved: what a prepared
// simulation runs for `analyze frequency` (stage/simulation.hpp).
#pragma once

#include <vector>

#include "mna/system.hpp"
#include "stage/frequency.hpp"

namespace stage::analysis {

// Linearises `system` at solution x (n + 1 entries) and sweeps it; `bias` is
// that point's report, kept in the result. The options have been checked
// with frequency_options_error.
FrequencyResult frequency_response(const Circuit& circuit, const mna::System& system,
                                   const std::vector<double>& x, BiasResult bias,
                                   const FrequencyOptions& options);

}  // namespace stage::analysis
