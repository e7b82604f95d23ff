// Small-signal fixtures: junction capacitance and transition frequency.
//
// Junction capacitance is read from the device's reported small-signal
// capacitance at a reverse-biased DC point (c_mu for base–collector with
// base and emitter grounded, c_pi for base–emitter with base and collector
// grounded, the diode's capacitance), not from a frequency analysis: it is
// the very dQ/dV the frequency analysis stamps, it isolates the one junction
// that a terminal measurement would see in parallel with the others, and it
// costs one DC point, which keeps capacitance fits fast.
//
// Transition frequency is measured as a handbook defines it: the
// short-circuit common-emitter current gain h21 = ic / ib (AC base current
// in, collector held by a DC source, so AC-shorted) from the frequency
// analysis at a frequency f in the -20 dB/decade region, extrapolated to
// |h21| = 1 as fT = f |h21(f)|. Unless the curve holds a `frequency`, f is
// the geometric mean of the beta corner and the hybrid-pi estimate of fT at
// that bias, where the extrapolation is most exact (both corrections are
// about 1/(2 beta)).
#include <cmath>

#include "common/constants.hpp"
#include "curves/fixtures.hpp"
#include "stage/errors.hpp"
#include "stage/frequency.hpp"

namespace stage::curves {
namespace {

using Q = CurveQuantity;

double measurement_frequency(const Curve& reference, const BipolarOperatingPoint& q) {
  if (const auto f = reference.condition(Q::frequency)) return *f;
  const double c = q.c_pi + q.c_mu;
  if (!(c > 0)) {
    throw InputError({reference.file.string(), 0, 0},
                     "curve '" + reference.name +
                         "': the model has no junction or transit-time capacitance, so its "
                         "transition frequency is infinite");
  }
  const double ft_estimate = q.gm / (kTwoPi * c);
  const double beta = q.collector_current / q.base_current;
  return ft_estimate / std::sqrt(beta);
}

double transition_frequency_at(const Curve& reference, const DeviceModel& model,
                               const BipolarOperatingPoint& dc) {
  Circuit c = fixture_circuit(reference, model);
  CurrentSource ib{kGround, "b", dc.base_current};
  ib.ac_magnitude = 1;
  c.add("ib", ib);
  c.add("vce", VoltageSource{"c", kGround, *reference.condition(Q::collector_emitter_voltage)});
  c.add("q", Bipolar{Polarity::npn, "c", "b", kGround, std::nullopt, kDeviceModel, 1});
  FrequencyOptions o;
  o.input = "ib";
  o.output = SignalRef::current("vce");
  o.from = measurement_frequency(reference, dc);
  o.to = o.from * 1.001;  // a one-point grid: the response at `from`
  o.per_decade = 1;
  const FrequencyResult r = run_frequency(c, o, fixture_solver());
  return o.from * std::abs(r.response.front());
}

}  // namespace

std::vector<std::vector<double>> junction_capacitance(const Curve& reference,
                                                      const DeviceModel& model) {
  const Q measured = reference.measured.front();
  Circuit c = fixture_circuit(reference, model);
  if (measured == Q::diode_capacitance) {
    c.add("vr", VoltageSource{"k", kGround, 0});
    c.add("d", Diode{kGround, "k", kDeviceModel, 1});
  } else {
    // The reverse voltage lifts the collector (B–C) or the emitter (B–E).
    const bool bc = measured == Q::base_collector_capacitance;
    c.add("vr", VoltageSource{"x", kGround, 0});
    c.add("q", Bipolar{Polarity::npn, bc ? "x" : kGround, kGround, bc ? kGround : "x", std::nullopt,
                       kDeviceModel, 1});
  }
  std::vector<double> reverse;
  for (const auto& p : reference.points) reverse.push_back(p.swept);
  std::vector<std::vector<double>> values;
  for (const auto& bias : sweep_source(c, "vr", reverse)) {
    if (measured == Q::diode_capacitance) {
      values.push_back({bias.diode("d").capacitance});
    } else {
      const auto& q = bias.bipolar("q");
      values.push_back({measured == Q::base_collector_capacitance ? q.c_mu : q.c_pi});
    }
  }
  return values;
}

std::vector<std::vector<double>> transition_frequency(const Curve& reference,
                                                      const DeviceModel& model) {
  std::vector<std::vector<double>> values;
  for (const auto& bias : forced_collector_current(reference, model)) {
    values.push_back({transition_frequency_at(reference, model, bias.bipolar("q"))});
  }
  return values;
}

}  // namespace stage::curves
