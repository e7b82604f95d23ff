// Whether a solution lies where the device models hold, for every analysis
// that reports one: the bias point after Newton, each accepted time step.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "mna/system.hpp"

namespace stage::analysis {

// Asks every device whether solution `at` lies in its model's range (see
// mna::ModelRangeFindings). Throws NumericalError naming each device whose
// equations do not hold there, the message opening with `what_failed`;
// returns one warning per device that is only far outside its
// characterised range.
std::vector<std::string> check_model_ranges(const mna::System& system, const mna::EvalRequest& at,
                                            std::string_view what_failed);

}  // namespace stage::analysis
