// Stamps of the independent sources.
#include "devices/sources.hpp"

#include <numbers>

#include "mna/topology.hpp"
#include "mna/topology_check.hpp"

namespace stage::devices {

SourceValue::SourceValue(double dc, std::optional<Waveform> wave, double ac_magnitude,
                         double ac_phase_deg)
    : dc_(dc),
      wave_(std::move(wave)),
      phasor_(std::polar(ac_magnitude, ac_phase_deg * std::numbers::pi / 180.0)) {}

double SourceValue::at(const mna::EvalRequest& request) const {
  const double v = (request.dc || !wave_) ? dc_ : waveform_value(*wave_, request.time);
  return request.source_scale * v;
}

void IndependentSource::corners(double from, double to, std::vector<double>& out) const {
  if (value_.wave()) waveform_corners(*value_.wave(), from, to, out);
}

// Both kinds deliver their current out of `out` and take it back at `back`.
double IndependentSource::delivered_power(const mna::EvalRequest& at) const {
  const Ports where = ports();
  return delivered_current(at) * (at.x[where.out] - at.x[where.back]);
}

VoltageSourceDevice::VoltageSourceDevice(std::string name, mna::Index p, mna::Index n,
                                         mna::Index branch, SourceValue value)
    : IndependentSource(std::move(name), std::move(value)), p_(p), n_(n), k_(branch) {}

void VoltageSourceDevice::declare(mna::PatternBuilder& pattern) {
  slots_.declare(pattern, p_, n_, k_);
}

void VoltageSourceDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double delivered = request.x[k_];
  out.f[p_] -= delivered;
  out.f[n_] += delivered;
  out.f[k_] += request.x[p_] - request.x[n_];
  add_excitation(request, out.f);
  slots_.add(out.g, -1.0);
}

void VoltageSourceDevice::add_excitation(const mna::EvalRequest& request, double* f) const {
  f[k_] -= value_.at(request);
}

void VoltageSourceDevice::ac_excitation(std::complex<double>* b) const { b[k_] += value_.phasor(); }

void VoltageSourceDevice::describe_topology(mna::TopologyCheck& check) const {
  check.fixes_voltage(p_, n_, name());
}

CurrentSourceDevice::CurrentSourceDevice(std::string name, mna::Index a, mna::Index b,
                                         SourceValue value)
    : IndependentSource(std::move(name), std::move(value)), a_(a), b_(b) {}

void CurrentSourceDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  add_excitation(request, out.f);
}

void CurrentSourceDevice::add_excitation(const mna::EvalRequest& request, double* f) const {
  const double i = value_.at(request);
  f[a_] += i;
  f[b_] -= i;
}

void CurrentSourceDevice::ac_excitation(std::complex<double>* b) const {
  b[a_] -= value_.phasor();
  b[b_] += value_.phasor();
}

void CurrentSourceDevice::describe_topology(mna::TopologyCheck& check) const {
  check.forces_current(a_, b_, name());
}

std::unique_ptr<mna::Device> make_device(const std::string& name, const VoltageSource& e,
                                         const Circuit&, mna::Topology& t) {
  const auto p = t.node(e.p), n = t.node(e.n);
  return std::make_unique<VoltageSourceDevice>(
      name, p, n, t.branch(name), SourceValue(e.dc, e.wave, e.ac_magnitude, e.ac_phase_deg));
}

std::unique_ptr<mna::Device> make_device(const std::string& name, const CurrentSource& e,
                                         const Circuit&, mna::Topology& t) {
  const auto a = t.node(e.a), b = t.node(e.b);
  return std::make_unique<CurrentSourceDevice>(
      name, a, b, SourceValue(e.dc, e.wave, e.ac_magnitude, e.ac_phase_deg));
}

}  // namespace stage::devices
