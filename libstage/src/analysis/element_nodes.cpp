// Node names of each element kind.
#include "analysis/element_nodes.hpp"

#include <type_traits>

namespace stage::analysis {

std::vector<std::string> element_nodes(const ElementData& data) {
  return std::visit(
      [](const auto& e) -> std::vector<std::string> {
        using E = std::decay_t<decltype(e)>;
        if constexpr (std::is_same_v<E, VoltageSource> ||
                      std::is_same_v<E, CurrentControlledVoltageSource>) {
          return {e.p, e.n};
        } else if constexpr (std::is_same_v<E, VoltageControlledVoltageSource>) {
          return {e.p, e.n, e.control_p, e.control_n};
        } else if constexpr (std::is_same_v<E, VoltageControlledCurrentSource>) {
          return {e.a, e.b, e.control_p, e.control_n};
        } else if constexpr (std::is_same_v<E, Diode>) {
          return {e.anode, e.cathode};
        } else if constexpr (std::is_same_v<E, Bipolar>) {
          std::vector<std::string> nodes{e.collector, e.base, e.emitter};
          if (e.substrate) nodes.push_back(*e.substrate);
          return nodes;
        } else {
          // The kinds whose terminals are `a` and `b`, listed so that a new
          // kind fails to compile here until its terminals are named.
          static_assert(std::is_same_v<E, Resistor> || std::is_same_v<E, Capacitor> ||
                        std::is_same_v<E, Inductor> || std::is_same_v<E, CurrentSource> ||
                        std::is_same_v<E, CurrentControlledCurrentSource>);
          return {e.a, e.b};
        }
      },
      data);
}

}  // namespace stage::analysis
