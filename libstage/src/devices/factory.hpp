// Turns an element of a Circuit into its Device.
#pragma once

#include <memory>

#include "mna/device.hpp"
#include "stage/circuit.hpp"

namespace stage::mna {
class Topology;
}

namespace stage::devices {

// Allocates the element's internal nodes and branch unknowns in `topology`.
// Throws an invalid_request Error for an unknown model name.
std::unique_ptr<mna::Device> make_device(const Element& element, const Circuit& circuit,
                                         mna::Topology& topology);

}  // namespace stage::devices
