// The junction diode (spec section 4): placeholder until the model lands.
#include <stdexcept>

#include "devices/semiconductors.hpp"

namespace stage::devices {

std::unique_ptr<mna::Device> make_diode(const std::string& name, const Diode&, const DiodeModel&,
                                        mna::Topology&) {
  throw std::logic_error("diode " + name + ": model not implemented yet");
}

}  // namespace stage::devices
