// The junction diode (spec section 4): Shockley current with emission
// coefficient and area, reverse breakdown, series resistance behind an
// internal node, depletion and diffusion charge, temperature scaling.
#include <cmath>
#include <limits>

#include "devices/junction.hpp"
#include "devices/local_stamp.hpp"
#include "devices/physical_constants.hpp"
#include "devices/semiconductors.hpp"
#include "mna/topology.hpp"
#include "mna/topology_check.hpp"

namespace stage::devices {
namespace {

// Model at one temperature and area.
struct DiodeParameters {
  double saturation_current = 0, nvt = 0, vcrit = 0;
  double breakdown_voltage = kInfinity, breakdown_current = 0, vcrit_breakdown = 0;
  double series_conductance = 0;  // 0: no series resistance
  double c0 = 0, phi = 0, grading = 0, fill = 0, transit_time = 0;
};

DiodeParameters scale(const DiodeModel& m, double area, double kelvin) {
  DiodeParameters p;
  const double reference = m.reference_temperature;
  p.nvt = m.emission_coefficient * thermal_voltage(kelvin);
  p.saturation_current =
      area * saturation_current_at(m.saturation_current, kelvin, reference, m.bandgap_energy,
                                   m.saturation_current_temperature_exponent,
                                   m.emission_coefficient);
  p.vcrit = critical_voltage(p.saturation_current, p.nvt);
  p.breakdown_voltage = m.breakdown_voltage;
  p.breakdown_current = area * m.breakdown_current;
  p.vcrit_breakdown = critical_voltage(p.breakdown_current, p.nvt);
  if (m.series_resistance > 0) p.series_conductance = area / m.series_resistance;
  p.phi = junction_potential_at(m.junction_potential, kelvin, reference, m.bandgap_energy);
  p.grading = m.grading;
  p.c0 = area *
         depletion_capacitance_at(m.junction_capacitance, m.junction_potential, p.phi, m.grading);
  p.fill = m.depletion_fill_coefficient;
  p.transit_time = m.transit_time;
  return p;
}

// Local nodes: terminals, then the junction's anode behind the series
// resistance (the anode itself when there is none).
enum : int { kAnode, kCathode, kJunction, kNodes };
using System = LocalSystem<kNodes>;

// The junction evaluated at v_eval (a limited voltage) and linearised back to
// the true junction voltage v, as device.hpp asks, written into `s`; without
// `charges` only f and G.
template <class Sink>
void stamp(Sink& s, const DiodeParameters& p, const std::array<double, kNodes>& x, double v_eval,
           bool charges) {
  const double v = x[kJunction] - x[kCathode];
  const ValueSlope forward = junction_current(p.saturation_current, v_eval, p.nvt);
  double current = forward.value, conductance = forward.slope;
  if (!std::isinf(p.breakdown_voltage)) {
    // Breakdown: -ibv (exp(-(v + bv)/nvt) - exp(-bv/nvt)), which carries ibv
    // at v = -bv and vanishes at v = 0. Same emission as forward conduction.
    const ValueSlope reverse =
        junction_current(p.breakdown_current, -(v_eval + p.breakdown_voltage), p.nvt);
    const ValueSlope at_zero = junction_current(p.breakdown_current, -p.breakdown_voltage, p.nvt);
    current -= reverse.value - at_zero.value;
    conductance += reverse.slope;
  }
  const double dv = v - v_eval;
  add_current(s, 1, kJunction, kCathode, current + conductance * dv,
              {{kJunction, kCathode, conductance}});
  if (p.series_conductance > 0) {
    add_current(s, 1, kAnode, kJunction, p.series_conductance * (x[kAnode] - x[kJunction]),
                {{kAnode, kJunction, p.series_conductance}});
  }
  if (!charges) return;
  // Diffusion charge follows the forward (Shockley) current only: breakdown
  // stores no minority carriers.
  const ValueSlope depletion = depletion_charge(v_eval, p.c0, p.phi, p.grading, p.fill);
  const double charge = depletion.value + p.transit_time * forward.value;
  const double capacitance = depletion.slope + p.transit_time * forward.slope;
  add_charge(s, 1, kJunction, kCathode, charge + capacitance * dv,
             {{kJunction, kCathode, capacitance}});
}

// The whole system, dense, at the true junction voltage: for the pattern and
// the report.
System local_system(const DiodeParameters& p, const std::array<double, kNodes>& x) {
  System s;
  stamp(s, p, x, x[kJunction] - x[kCathode], true);
  return s;
}

class DiodeDevice final : public mna::Device {
 public:
  DiodeDevice(const std::string& name, const Diode& element, const DiodeModel& model,
              mna::Topology& topology)
      : Device(name),
        model_(model),
        area_(element.area),
        scatter_(nodes(name, element, model, topology)),
        params_(scale(model, area_, kRoomTemperature)),
        kelvin_(kRoomTemperature),
        structure_(local_system(params_, {}).used) {}

  void declare(mna::PatternBuilder& pattern) override { scatter_.declare(pattern, structure_); }

  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override {
    if (request.temperature != kelvin_) {
      params_ = scale(model_, area_, request.temperature);
      kelvin_ = request.temperature;
    }
    const auto x = scatter_.gather(request.x);
    double v = x[kJunction] - x[kCathode];
    if (request.limit) {
      v = limit_junction_voltage(v, last_v_, params_.nvt, params_.vcrit);
      if (!std::isinf(params_.breakdown_voltage)) {
        // The breakdown exponential is limited the same way, mirrored.
        const double w_wanted = -(v + params_.breakdown_voltage);
        const double w = limit_junction_voltage(w_wanted, -(last_v_ + params_.breakdown_voltage),
                                                params_.nvt, params_.vcrit_breakdown);
        // Only a real limit moves v: the round trip through -(v + bv) is not
        // exact in floating point, and a spurious change would keep Newton
        // from ever accepting convergence.
        if (w != w_wanted) v = -w - params_.breakdown_voltage;
      }
      if (v != x[kJunction] - x[kCathode]) out.limited = true;
    }
    last_v_ = v;
    if (beyond_exponent_range(v, params_.nvt) ||
        beyond_exponent_range(-(v + params_.breakdown_voltage), params_.nvt)) {
      out.beyond_model_range = true;
    }
    const DirectStamp<kNodes> sink(scatter_, out);
    stamp(sink, params_, x, v, request.charges);
  }

  bool nonlinear() const override { return true; }
  void reset_limiting() override { last_v_ = 0; }

  void describe_topology(mna::TopologyCheck& check) const override {
    const auto& n = scatter_.nodes();
    if (n[kJunction] != n[kAnode]) check.conducts(n[kAnode], n[kJunction], name());
    check.conducts(n[kJunction], n[kCathode], name());
  }

  void check_model_range(const mna::EvalRequest& at, mna::ModelRangeFindings& out) const override {
    const DiodeParameters p = scale(model_, area_, at.temperature);
    const auto x = scatter_.gather(at.x);
    const double v = x[kJunction] - x[kCathode];
    check_exponent_range(name(), "anode–cathode", v, p.nvt, out.invalid);
    if (!std::isinf(p.breakdown_voltage)) {
      check_exponent_range(name(), "breakdown", -(v + p.breakdown_voltage), p.nvt, out.invalid);
    }
  }

  std::optional<mna::Conduction> conduction(const mna::EvalRequest& at) const override {
    BiasResult one;
    report(at, one);
    const DiodeOperatingPoint& op = one.diodes.front();
    mna::Conduction c;
    c.state = op.current > 0 ? mna::Conduction::State::conducting : mna::Conduction::State::cut_off;
    c.current = op.current;
    c.voltage = op.voltage;
    return c;
  }

  void report(const mna::EvalRequest& at, BiasResult& out) const override {
    const DiodeParameters p = scale(model_, area_, at.temperature);
    const auto x = scatter_.gather(at.x);
    const System s = local_system(p, x);
    const std::array<int, kNodes> alias = {kAnode, kCathode,
                                           p.series_conductance > 0 ? int{kJunction} : int{kAnode}};
    const TerminalView view = reduce_to_terminals(s, 2, alias);
    DiodeOperatingPoint op;
    op.name = name();
    op.current = view.current[kAnode];
    op.voltage = x[kAnode] - x[kCathode];
    op.resistance = 1 / view.conductance[kAnode][kAnode];
    op.capacitance = s.c[kJunction][kJunction];
    op.power = view.current[kAnode] * x[kAnode] + view.current[kCathode] * x[kCathode];
    out.diodes.push_back(op);
  }

 private:
  static std::array<mna::Index, kNodes> nodes(const std::string& name, const Diode& element,
                                              const DiodeModel& model, mna::Topology& topology) {
    const mna::Index anode = topology.node(element.anode);
    const mna::Index cathode = topology.node(element.cathode);
    const mna::Index junction =
        model.series_resistance > 0 ? topology.internal_node(name, "anode") : anode;
    return {anode, cathode, junction};
  }

  DiodeModel model_;
  double area_;
  LocalScatter<kNodes> scatter_;
  DiodeParameters params_;
  double kelvin_;
  std::array<std::array<bool, kNodes>, kNodes> structure_;
  double last_v_ = 0;  // junction voltage of the last evaluation, for limiting
};

}  // namespace

std::unique_ptr<mna::Device> make_diode(const std::string& name, const Diode& element,
                                        const DiodeModel& model, mna::Topology& topology) {
  return std::make_unique<DiodeDevice>(name, element, model, topology);
}

std::unique_ptr<mna::Device> make_device(const std::string& name, const Diode& e,
                                         const Circuit& circuit, mna::Topology& t) {
  return make_diode(name, e, find_model(circuit.models().of<DiodeModel>(), e.model, name), t);
}

}  // namespace stage::devices
