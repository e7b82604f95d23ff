// The nodes an element touches, by name, as written in the circuit: the
// terminals in the order of spec section 3 (first terminal first), then
// controlling nodes. Used to check analysis requests against a circuit.
#pragma once

#include <string>
#include <vector>

#include "stage/circuit.hpp"

namespace stage::analysis {

std::vector<std::string> element_nodes(const ElementData& data);

}  // namespace stage::analysis
