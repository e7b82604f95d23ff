// Which fixture computes which curve, the DC fixtures of the transistor and
// the diode, and what they share: the circuit around the device under test,
// the tight solver, and grouping an output family by its base current.
//
// Transistor DC fixtures (npn, emitter grounded unless said otherwise):
//   forward_gummel  VBE source swept, VCE source held; IC, IB of the device.
//   output_family   base current source held, VCE source swept, per IB.
//   current_gain    IC forced at the held VCE by adjusting the VBE source
//                   (forced_collector_current below). Gain = IC / IB.
//   saturation      IC forced into the collector through a 0 V sense source;
//                   a current-controlled source drives IC / forced_beta into
//                   the base. The IC source is swept; VCE and VBE read.
#include "curves/fixtures.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <stdexcept>

#include "devices/physical_constants.hpp"
#include "stage/errors.hpp"

namespace stage::curves {

SolverOptions fixture_solver() {
  SolverOptions s;
  s.relative_tolerance = 1e-10;
  s.voltage_tolerance = 1e-12;
  s.current_tolerance = 1e-15;
  s.max_newton_iterations = 300;
  return s;
}

Circuit fixture_circuit(const Curve& reference, const DeviceModel& model) {
  Circuit c;
  c.title = "fixture for curve " + reference.name;
  c.temperature = reference.condition(CurveQuantity::temperature).value_or(kRoomTemperature);
  std::visit([&](const auto& parameters) { c.add_model(kDeviceModel, parameters); },
             model.parameters);
  return c;
}

std::vector<BiasResult> sweep_source(const Circuit& circuit, const std::string& source,
                                     const std::vector<double>& values) {
  SweepOptions options;
  options.target = SweepOptions::Target::source;
  options.name = source;
  options.values = values;
  std::vector<BiasResult> points;
  for (auto& p : run_sweep(circuit, options, fixture_solver()).points)
    points.push_back(std::move(p.bias));
  return points;
}

namespace {

using Q = CurveQuantity;

std::vector<double> swept_values(const Curve& reference) {
  std::vector<double> values;
  for (const auto& p : reference.points) values.push_back(p.swept);
  return values;
}

double bipolar_value(const BipolarOperatingPoint& q, CurveQuantity quantity) {
  switch (quantity) {
    case Q::collector_current:
      return q.collector_current;
    case Q::base_current:
      return q.base_current;
    case Q::current_gain:
      return q.collector_current / q.base_current;
    case Q::collector_emitter_voltage:
      return q.vce;
    case Q::base_emitter_voltage:
      return q.vbe;
    default:
      throw std::logic_error("not a DC transistor quantity");
  }
}

std::vector<std::vector<double>> read_out(const Curve& reference,
                                          const std::vector<BiasResult>& points) {
  std::vector<std::vector<double>> values;
  for (const auto& bias : points) {
    std::vector<double> row;
    for (CurveQuantity q : reference.measured) row.push_back(bipolar_value(bias.bipolar("q"), q));
    values.push_back(row);
  }
  return values;
}

Bipolar device(std::string c, std::string b, std::string e) {
  return Bipolar{
      Polarity::npn, std::move(c), std::move(b), std::move(e), std::nullopt, kDeviceModel, 1};
}

std::vector<BiasResult> gummel(const Curve& reference, const DeviceModel& model) {
  Circuit c = fixture_circuit(reference, model);
  c.add("vbe", VoltageSource{"b", kGround, 0});
  c.add("vce", VoltageSource{"c", kGround, *reference.condition(Q::collector_emitter_voltage)});
  c.add("q", device("c", "b", kGround));
  return sweep_source(c, "vbe", swept_values(reference));
}

// One sweep of VCE per base current, in the order the base currents first
// appear; the results go back to the reference's point order.
std::vector<BiasResult> output_family(const Curve& reference, const DeviceModel& model) {
  std::map<double, std::vector<std::size_t>> groups;
  std::vector<double> order;
  for (std::size_t i = 0; i < reference.points.size(); ++i) {
    const double ib =
        reference.stepped ? reference.points[i].step : *reference.condition(Q::base_current);
    if (!groups.count(ib)) order.push_back(ib);
    groups[ib].push_back(i);
  }
  std::vector<BiasResult> results(reference.points.size());
  for (double ib : order) {
    Circuit c = fixture_circuit(reference, model);
    c.add("ib", CurrentSource{kGround, "b", ib});
    c.add("vce", VoltageSource{"c", kGround, 0});
    c.add("q", device("c", "b", kGround));
    std::vector<double> values;
    for (std::size_t i : groups[ib]) values.push_back(reference.points[i].swept);
    auto points = sweep_source(c, "vce", values);
    for (std::size_t k = 0; k < points.size(); ++k) results[groups[ib][k]] = std::move(points[k]);
  }
  return results;
}

std::vector<BiasResult> saturation(const Curve& reference, const DeviceModel& model) {
  Circuit c = fixture_circuit(reference, model);
  c.add("ic", CurrentSource{kGround, "x", 0});
  c.add("sense", VoltageSource{"c", "x", 0});
  c.add("drive", CurrentControlledCurrentSource{kGround, "b", "sense",
                                                1 / *reference.condition(Q::forced_beta)});
  c.add("q", device("c", "b", kGround));
  return sweep_source(c, "ic", swept_values(reference));
}

std::vector<std::vector<double>> diode_forward(const Curve& reference, const DeviceModel& model) {
  Circuit c = fixture_circuit(reference, model);
  c.add("vf", VoltageSource{"a", kGround, 0});
  c.add("d", Diode{"a", kGround, kDeviceModel, 1});
  std::vector<std::vector<double>> values;
  for (const auto& bias : sweep_source(c, "vf", swept_values(reference))) {
    values.push_back({bias.diode("d").current});
  }
  return values;
}

void require_model_kind(const Curve& reference, const DeviceModel& model, bool bipolar) {
  if (model.is_bipolar() == bipolar) return;
  throw InputError({reference.file.string(), 0, 0},
                   "curve '" + reference.name + "' is a " + (bipolar ? "transistor" : "diode") +
                       " curve, but model '" + model.name + "' is a " +
                       (model.is_bipolar() ? "transistor" : "diode") + " model");
}

}  // namespace

// Newton on VBE, all points at once: each pass is one DC sweep of the VBE
// source (the previous point the guess), then VBE moves by
// ln(IC_target / IC) * IC / gm, which is exact for an exponential IC(VBE).
// (A circuit that forces IC directly needs an emitter held only by the
// junctions, which has no DC solution from a cold start.)
std::vector<BiasResult> forced_collector_current(const Curve& reference, const DeviceModel& model) {
  Circuit c = fixture_circuit(reference, model);
  c.add("vbe", VoltageSource{"b", kGround, 0});
  c.add("vce", VoltageSource{"c", kGround, *reference.condition(Q::collector_emitter_voltage)});
  c.add("q", device("c", "b", kGround));
  const auto& m = std::get<BipolarModel>(model.parameters);
  const double vt = devices::thermal_voltage(c.temperature) * m.emission_forward;
  std::vector<double> vbe;
  for (const auto& p : reference.points)
    vbe.push_back(vt * std::log1p(p.swept / m.saturation_current));
  constexpr int kMaxPasses = 60;
  // The Newton tolerance (1e-10 of VBE) leaves IC uncertain by about
  // 1e-10 * VBE / VT, a few parts in 1e9.
  constexpr double kRelative = 1e-9;
  for (int pass = 0; pass < kMaxPasses; ++pass) {
    auto points = sweep_source(c, "vbe", vbe);
    double worst = 0;
    for (std::size_t i = 0; i < points.size(); ++i) {
      const auto& q = points[i].bipolar("q");
      const double target = reference.points[i].swept;
      const double ic = std::max(q.collector_current, target * 1e-6);
      worst = std::max(worst, std::abs(ic / target - 1));
      // Limited to 4 thermal voltages a pass, like junction limiting.
      vbe[i] += std::clamp(std::log(target / ic) * ic / q.gm, -4 * vt, 4 * vt);
    }
    if (worst < kRelative) return points;
  }
  throw NumericalError(ErrorKind::no_convergence,
                       "curve '" + reference.name +
                           "': the collector current could not be "
                           "reached by adjusting VBE",
                       {"q"});
}

std::vector<std::vector<double>> simulate(const Curve& reference, const DeviceModel& model) {
  switch (reference.kind) {
    case CurveKind::forward_gummel:
      require_model_kind(reference, model, true);
      return read_out(reference, gummel(reference, model));
    case CurveKind::current_gain:
      require_model_kind(reference, model, true);
      return read_out(reference, forced_collector_current(reference, model));
    case CurveKind::output_family:
      require_model_kind(reference, model, true);
      return read_out(reference, output_family(reference, model));
    case CurveKind::saturation:
      require_model_kind(reference, model, true);
      return read_out(reference, saturation(reference, model));
    case CurveKind::junction_capacitance:
      require_model_kind(reference, model,
                         reference.measured.front() != CurveQuantity::diode_capacitance);
      return junction_capacitance(reference, model);
    case CurveKind::transition_frequency:
      require_model_kind(reference, model, true);
      return transition_frequency(reference, model);
    case CurveKind::diode_forward:
      require_model_kind(reference, model, false);
      return diode_forward(reference, model);
  }
  throw std::logic_error("unknown curve kind");
}

}  // namespace stage::curves
