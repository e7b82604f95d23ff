// One Device per Element: picks the class, numbers its nodes and branches.
#include "devices/factory.hpp"

#include "devices/controlled.hpp"
#include "devices/passive.hpp"
#include "devices/semiconductors.hpp"
#include "devices/sources.hpp"
#include "mna/topology.hpp"
#include "stage/errors.hpp"

namespace stage::devices {
namespace {

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

}  // namespace

std::unique_ptr<mna::Device> make_device(const Element& element, const Circuit& circuit,
                                         mna::Topology& t) {
  const std::string& name = element.name;
  struct Visitor {
    const std::string& name;
    const Circuit& circuit;
    mna::Topology& t;

    std::unique_ptr<mna::Device> operator()(const Resistor& e) {
      return std::make_unique<ResistorDevice>(name, t.node(e.a), t.node(e.b), e.resistance);
    }
    std::unique_ptr<mna::Device> operator()(const Capacitor& e) {
      return std::make_unique<CapacitorDevice>(name, t.node(e.a), t.node(e.b), e.capacitance,
                                               e.initial_voltage);
    }
    std::unique_ptr<mna::Device> operator()(const Inductor& e) {
      const auto a = t.node(e.a), b = t.node(e.b);
      return std::make_unique<InductorDevice>(name, a, b, t.branch(name), e.inductance,
                                              e.initial_current);
    }
    std::unique_ptr<mna::Device> operator()(const VoltageSource& e) {
      const auto p = t.node(e.p), n = t.node(e.n);
      return std::make_unique<VoltageSourceDevice>(
          name, p, n, t.branch(name), SourceValue(e.dc, e.wave, e.ac_magnitude, e.ac_phase_deg));
    }
    std::unique_ptr<mna::Device> operator()(const CurrentSource& e) {
      const auto a = t.node(e.a), b = t.node(e.b);
      return std::make_unique<CurrentSourceDevice>(
          name, a, b, SourceValue(e.dc, e.wave, e.ac_magnitude, e.ac_phase_deg));
    }
    std::unique_ptr<mna::Device> operator()(const VoltageControlledVoltageSource& e) {
      const auto p = t.node(e.p), n = t.node(e.n);
      const auto cp = t.node(e.control_p), cn = t.node(e.control_n);
      return std::make_unique<VcvsDevice>(name, p, n, cp, cn, t.branch(name), e.gain);
    }
    std::unique_ptr<mna::Device> operator()(const VoltageControlledCurrentSource& e) {
      const auto a = t.node(e.a), b = t.node(e.b);
      const auto cp = t.node(e.control_p), cn = t.node(e.control_n);
      return std::make_unique<VccsDevice>(name, a, b, cp, cn, e.gain);
    }
    std::unique_ptr<mna::Device> operator()(const CurrentControlledCurrentSource& e) {
      const auto a = t.node(e.a), b = t.node(e.b);
      return std::make_unique<CccsDevice>(name, a, b, e.sense, e.gain);
    }
    std::unique_ptr<mna::Device> operator()(const CurrentControlledVoltageSource& e) {
      const auto p = t.node(e.p), n = t.node(e.n);
      return std::make_unique<CcvsDevice>(name, p, n, t.branch(name), e.sense, e.gain);
    }
    std::unique_ptr<mna::Device> operator()(const Diode& e) {
      return make_diode(name, e, find_model(circuit.diode_models(), e.model, name), t);
    }
    std::unique_ptr<mna::Device> operator()(const Bipolar& e) {
      return make_bipolar(name, e, find_model(circuit.bipolar_models(), e.model, name), t);
    }
  };
  return std::visit(Visitor{name, circuit, t}, element.data);
}

}  // namespace stage::devices
