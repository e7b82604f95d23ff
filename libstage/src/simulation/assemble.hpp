// A circuit assembled into its MNA system: the device factory's devices on
// the system's unknowns and pattern. Above both the devices and the sparse
// layer, so neither depends on the other's construction.
#pragma once

#include <vector>

#include "mna/system.hpp"

namespace stage {

mna::System assemble(const Circuit& circuit,
                     const std::vector<mna::System::DeviceMaker>& extra = {});

}  // namespace stage
