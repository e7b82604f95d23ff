// The textbook AC load line of a single-transistor stage (see
// LoadLineEstimate in stage/headroom.hpp).
#pragma once

#include <map>
#include <optional>
#include <string>

#include "mna/device.hpp"
#include "stage/headroom.hpp"

namespace stage::analysis {

// The circuit's one transistor (any kind that amplifies); nothing when it
// has none or several.
const Element* only_transistor(const Circuit& circuit);

// The load-line estimate of a circuit with exactly one transistor (any kind
// that amplifies), at `frequency`, from each device's conduction at the bias
// point; nothing for other circuits.
std::optional<LoadLineEstimate> estimate_load_line(
    const Circuit& circuit, const SolverOptions& solver,
    const std::map<std::string, mna::Conduction>& at_bias, double frequency);

}  // namespace stage::analysis
