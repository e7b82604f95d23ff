// One Device per Element: the overload of make_device for its kind, which
// each device file declares beside its class.
#include "devices/factory.hpp"

#include "devices/controlled.hpp"
#include "devices/passive.hpp"
#include "devices/semiconductors.hpp"
#include "devices/sources.hpp"

namespace stage::devices {

std::unique_ptr<mna::Device> make_device(const Element& element, const Circuit& circuit,
                                         mna::Topology& topology) {
  return std::visit([&](const auto& e) { return make_device(element.name, e, circuit, topology); },
                    element.data);
}

}  // namespace stage::devices
