// Stamps of the resistor, capacitor and inductor.
#include "devices/passive.hpp"

#include "mna/topology.hpp"
#include "mna/topology_check.hpp"

namespace stage::devices {

ResistorDevice::ResistorDevice(std::string name, mna::Index a, mna::Index b, double resistance)
    : Device(std::move(name)), a_(a), b_(b), conductance_(1.0 / resistance) {}

void ResistorDevice::declare(mna::PatternBuilder& pattern) {
  slots_.declare(pattern, a_, b_, a_, b_);
}

bool ResistorDevice::set_value(double resistance) {
  conductance_ = 1.0 / resistance;
  return true;
}

void ResistorDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double i = conductance_ * (request.x[a_] - request.x[b_]);
  out.f[a_] += i;
  out.f[b_] -= i;
  slots_.add(out.g, conductance_);
}

void ResistorDevice::describe_topology(mna::TopologyCheck& check) const {
  check.conducts(a_, b_, name());
}

std::optional<double> ResistorDevice::reported_current(const mna::EvalRequest& at) const {
  return conductance_ * (at.x[a_] - at.x[b_]);
}

CapacitorDevice::CapacitorDevice(std::string name, mna::Index a, mna::Index b, double capacitance,
                                 std::optional<double> initial_voltage)
    : Device(std::move(name)),
      a_(a),
      b_(b),
      capacitance_(capacitance),
      initial_voltage_(initial_voltage) {}

void CapacitorDevice::declare(mna::PatternBuilder& pattern) {
  slots_.declare(pattern, a_, b_, a_, b_);
}

bool CapacitorDevice::set_value(double capacitance) {
  capacitance_ = capacitance;
  return true;
}

void CapacitorDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double q = capacitance_ * (request.x[a_] - request.x[b_]);
  out.q[a_] += q;
  out.q[b_] -= q;
  slots_.add(out.c, capacitance_);
}

void CapacitorDevice::describe_topology(mna::TopologyCheck& check) const {
  check.capacitive(a_, b_, name());
}

std::optional<mna::InitialCondition> CapacitorDevice::initial_condition() const {
  if (!initial_voltage_) return std::nullopt;
  return mna::InitialCondition{a_, b_, *initial_voltage_};
}

InductorDevice::InductorDevice(std::string name, mna::Index a, mna::Index b, mna::Index branch,
                               double inductance, std::optional<double> initial_current)
    : Device(std::move(name)),
      a_(a),
      b_(b),
      k_(branch),
      inductance_(inductance),
      initial_current_(initial_current) {}

void InductorDevice::declare(mna::PatternBuilder& pattern) {
  slots_.declare(pattern, a_, b_, k_);
  kk_ = pattern.entry(k_, k_);
}

bool InductorDevice::set_value(double inductance) {
  inductance_ = inductance;
  return true;
}

void InductorDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double i = request.x[k_];
  out.f[a_] += i;
  out.f[b_] -= i;
  out.f[k_] += request.x[a_] - request.x[b_];
  out.q[k_] -= inductance_ * i;
  slots_.add(out.g, 1.0);
  out.c[kk_] -= inductance_;
}

void InductorDevice::describe_topology(mna::TopologyCheck& check) const {
  check.fixes_voltage(a_, b_, name());
}

std::optional<double> InductorDevice::reported_current(const mna::EvalRequest& at) const {
  return at.x[k_];
}

std::optional<mna::InitialCondition> InductorDevice::initial_condition() const {
  if (!initial_current_) return std::nullopt;
  return mna::InitialCondition{k_, mna::kGroundIndex, *initial_current_};
}

std::unique_ptr<mna::Device> make_device(const std::string& name, const Resistor& e, const Circuit&,
                                         mna::Topology& t) {
  return std::make_unique<ResistorDevice>(name, t.node(e.a), t.node(e.b), e.resistance);
}

std::unique_ptr<mna::Device> make_device(const std::string& name, const Capacitor& e,
                                         const Circuit&, mna::Topology& t) {
  return std::make_unique<CapacitorDevice>(name, t.node(e.a), t.node(e.b), e.capacitance,
                                           e.initial_voltage);
}

std::unique_ptr<mna::Device> make_device(const std::string& name, const Inductor& e, const Circuit&,
                                         mna::Topology& t) {
  const auto a = t.node(e.a), b = t.node(e.b);
  return std::make_unique<InductorDevice>(name, a, b, t.branch(name), e.inductance,
                                          e.initial_current);
}

}  // namespace stage::devices
