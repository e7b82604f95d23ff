// Constructors of the semiconductor devices (diode, bipolar transistor), kept
// apart from the linear elements so the factory needs only this header.
#pragma once

#include <map>
#include <memory>
#include <string>

#include "mna/device.hpp"
#include "stage/bias.hpp"
#include "stage/circuit.hpp"
#include "stage/errors.hpp"

namespace stage::mna {
class Topology;
}

namespace stage::devices {

std::unique_ptr<mna::Device> make_diode(const std::string& name, const Diode& element,
                                        const DiodeModel& model, mna::Topology& topology);

std::unique_ptr<mna::Device> make_bipolar(const std::string& name, const Bipolar& element,
                                          const BipolarModel& model, mna::Topology& topology);

// The factory's overloads (see devices/passive.hpp): the model by name from
// the circuit's models of the kind.
std::unique_ptr<mna::Device> make_device(const std::string& name, const Diode& e,
                                         const Circuit& circuit, mna::Topology& topology);
std::unique_ptr<mna::Device> make_device(const std::string& name, const Bipolar& e,
                                         const Circuit& circuit, mna::Topology& topology);

// The model `name` of `models`; an invalid_request Error naming `element`
// when there is none.
template <class Model>
const Model& find_model(const std::map<std::string, Model>& models, const std::string& name,
                        const std::string& element) {
  auto it = models.find(name);
  if (it == models.end()) {
    throw Error(
        ErrorKind::invalid_request,
        "element '" + element + "' uses model '" + name + "', which is not defined for its kind",
        {element, name});
  }
  return it->second;
}

}  // namespace stage::devices
