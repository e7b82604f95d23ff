// The system of a circuit from the device factory; see assemble.hpp.
#include "simulation/assemble.hpp"

#include "devices/ammeter.hpp"
#include "devices/factory.hpp"

namespace stage {

// A terminal sensed through an ammeter (devices/ammeter.hpp) is made on its
// own node, and its ammeter joins that node to the circuit's after every
// element's device.
mna::System assemble(const Circuit& circuit, const std::vector<mna::System::DeviceMaker>& extra) {
  const std::vector<devices::MeteredTerminal> metered = devices::metered_terminals(circuit);
  const auto make = [&](const Element& element, const Circuit& c, mna::Topology& t) {
    return devices::make_device(devices::with_terminal_nodes(element, metered, t), c, t);
  };
  std::vector<mna::System::DeviceMaker> more;
  for (const devices::MeteredTerminal& m : metered) {
    more.push_back(
        [&circuit, m](mna::Topology& t) { return devices::make_ammeter(m, circuit, t); });
  }
  more.insert(more.end(), extra.begin(), extra.end());
  return mna::System(circuit, make, more);
}

}  // namespace stage
