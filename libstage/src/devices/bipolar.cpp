// The bipolar transistor (spec section 4): placeholder until the model lands.
#include <stdexcept>

#include "devices/semiconductors.hpp"

namespace stage::devices {

std::unique_ptr<mna::Device> make_bipolar(const std::string& name, const Bipolar&,
                                          const BipolarModel&, mna::Topology&) {
  throw std::logic_error("bipolar " + name + ": model not implemented yet");
}

}  // namespace stage::devices
