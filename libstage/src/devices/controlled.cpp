// Stamps of the controlled sources.
#include "devices/controlled.hpp"

#include "devices/ammeter.hpp"
#include "mna/topology.hpp"
#include "mna/topology_check.hpp"
#include "stage/errors.hpp"

namespace stage::devices {

mna::Index sensed_branch(mna::PatternBuilder& pattern, const std::string& device,
                         const std::string& sense) {
  const auto branch = pattern.topology().find_branch(sense);
  if (!branch) {
    throw Error(
        ErrorKind::invalid_request,
        "'" + device + "' senses '" + sense + "', which is no element's current or terminal",
        {device, sense});
  }
  return *branch;
}

VcvsDevice::VcvsDevice(std::string name, mna::Index p, mna::Index n, mna::Index cp, mna::Index cn,
                       mna::Index branch, double gain)
    : Device(std::move(name)), p_(p), n_(n), cp_(cp), cn_(cn), k_(branch), gain_(gain) {}

void VcvsDevice::declare(mna::PatternBuilder& pattern) {
  output_.declare(pattern, p_, n_, k_);
  k_cp_ = pattern.entry(k_, cp_);
  k_cn_ = pattern.entry(k_, cn_);
}

void VcvsDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double* x = request.x;
  out.f[p_] -= x[k_];
  out.f[n_] += x[k_];
  out.f[k_] += x[p_] - x[n_] - gain_ * (x[cp_] - x[cn_]);
  output_.add(out.g, -1.0);
  out.g[k_cp_] -= gain_;
  out.g[k_cn_] += gain_;
}

void VcvsDevice::describe_topology(mna::TopologyCheck& check) const {
  check.fixes_voltage(p_, n_, name());
}

std::optional<double> VcvsDevice::reported_current(const mna::EvalRequest& at) const {
  return at.x[k_];
}

VccsDevice::VccsDevice(std::string name, mna::Index a, mna::Index b, mna::Index cp, mna::Index cn,
                       double gain)
    : Device(std::move(name)), a_(a), b_(b), cp_(cp), cn_(cn), gain_(gain) {}

void VccsDevice::declare(mna::PatternBuilder& pattern) {
  slots_.declare(pattern, a_, b_, cp_, cn_);
}

void VccsDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double i = gain_ * (request.x[cp_] - request.x[cn_]);
  out.f[a_] += i;
  out.f[b_] -= i;
  slots_.add(out.g, gain_);
}

void VccsDevice::describe_topology(mna::TopologyCheck& check) const {
  check.forces_current(a_, b_, name());
}

std::optional<double> VccsDevice::reported_current(const mna::EvalRequest& at) const {
  return gain_ * (at.x[cp_] - at.x[cn_]);
}

CccsDevice::CccsDevice(std::string name, mna::Index a, mna::Index b, std::string sense, double gain)
    : Device(std::move(name)), a_(a), b_(b), sense_(std::move(sense)), gain_(gain) {}

void CccsDevice::declare(mna::PatternBuilder& pattern) {
  s_ = sensed_branch(pattern, name(), sense_);
  a_s_ = pattern.entry(a_, s_);
  b_s_ = pattern.entry(b_, s_);
}

void CccsDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double i = gain_ * request.x[s_];
  out.f[a_] += i;
  out.f[b_] -= i;
  out.g[a_s_] += gain_;
  out.g[b_s_] -= gain_;
}

void CccsDevice::describe_topology(mna::TopologyCheck& check) const {
  check.forces_current(a_, b_, name());
}

std::optional<double> CccsDevice::reported_current(const mna::EvalRequest& at) const {
  return gain_ * at.x[s_];
}

CcvsDevice::CcvsDevice(std::string name, mna::Index p, mna::Index n, mna::Index branch,
                       std::string sense, double gain)
    : Device(std::move(name)), p_(p), n_(n), k_(branch), sense_(std::move(sense)), gain_(gain) {}

void CcvsDevice::declare(mna::PatternBuilder& pattern) {
  s_ = sensed_branch(pattern, name(), sense_);
  output_.declare(pattern, p_, n_, k_);
  k_s_ = pattern.entry(k_, s_);
}

void CcvsDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double* x = request.x;
  out.f[p_] -= x[k_];
  out.f[n_] += x[k_];
  out.f[k_] += x[p_] - x[n_] - gain_ * x[s_];
  output_.add(out.g, -1.0);
  out.g[k_s_] -= gain_;
}

void CcvsDevice::describe_topology(mna::TopologyCheck& check) const {
  check.fixes_voltage(p_, n_, name());
}

std::optional<double> CcvsDevice::reported_current(const mna::EvalRequest& at) const {
  return at.x[k_];
}

std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const VoltageControlledVoltageSource& e, const Circuit&,
                                         mna::Topology& t) {
  const auto p = t.node(e.p), n = t.node(e.n);
  const auto cp = t.node(e.control_p), cn = t.node(e.control_n);
  return std::make_unique<VcvsDevice>(name, p, n, cp, cn, t.branch(name), e.gain);
}

std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const VoltageControlledCurrentSource& e, const Circuit&,
                                         mna::Topology& t) {
  const auto a = t.node(e.a), b = t.node(e.b);
  const auto cp = t.node(e.control_p), cn = t.node(e.control_n);
  return std::make_unique<VccsDevice>(name, a, b, cp, cn, e.gain);
}

std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const CurrentControlledCurrentSource& e,
                                         const Circuit& circuit, mna::Topology& t) {
  const auto a = t.node(e.a), b = t.node(e.b);
  return std::make_unique<CccsDevice>(name, a, b, sensed_branch_owner(circuit, e.sense), e.gain);
}

std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const CurrentControlledVoltageSource& e,
                                         const Circuit& circuit, mna::Topology& t) {
  const auto p = t.node(e.p), n = t.node(e.n);
  return std::make_unique<CcvsDevice>(name, p, n, t.branch(name),
                                      sensed_branch_owner(circuit, e.sense), e.gain);
}

}  // namespace stage::devices
