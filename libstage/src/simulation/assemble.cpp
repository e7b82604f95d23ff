// The system of a circuit from the device factory; see assemble.hpp.
#include "simulation/assemble.hpp"

#include "devices/factory.hpp"

namespace stage {

mna::System assemble(const Circuit& circuit, const std::vector<mna::System::DeviceMaker>& extra) {
  return mna::System(circuit, devices::make_device, extra);
}

}  // namespace stage
