// The stage report: one wide frequency sweep, the headroom search, and two
// sine drives (half and full symmetric headroom) for distortion and power.
#include "stage/characterize.hpp"

#include <algorithm>
#include <cmath>

#include "analysis/drive_setup.hpp"
#include "analysis/sine_drive.hpp"

namespace stage {
namespace {

constexpr double kHeadroomLimit = 0.01;  // the stage report judges headroom at 1 %
constexpr double kDecadesBelow = 3, kDecadesAbove = 4;
constexpr int kPointsPerDecade = 20;

// Mean of a sampled signal over [from, to] by the trapezoidal rule.
double period_mean(const std::vector<double>& time, const std::vector<double>& values, double from,
                   double to) {
  double area = 0;
  for (std::size_t k = 1; k < time.size(); ++k) {
    const double a = std::max(time[k - 1], from), b = std::min(time[k], to);
    if (b <= a) continue;
    const double span = time[k] - time[k - 1];
    const auto at = [&](double t) {
      return values[k - 1] + (values[k] - values[k - 1]) * (t - time[k - 1]) / span;
    };
    area += 0.5 * (at(a) + at(b)) * (b - a);
  }
  return area / (to - from);
}

// The signals a swing's power is computed from: each supply's current, and
// the load's current and the voltage across it.
struct PowerProbes {
  std::vector<analysis::Rail> rails;
  std::optional<SignalRef> load_current, load_voltage;

  std::vector<SignalRef> signals() const {
    std::vector<SignalRef> s;
    for (const auto& r : rails) s.push_back(SignalRef::current(r.source));
    if (load_current) s.insert(s.end(), {*load_current, *load_voltage});
    return s;
  }
};

PowerProbes power_probes(const Circuit& circuit, const CharacterizeOptions& o) {
  PowerProbes p{analysis::supply_rails(circuit, o.input), {}, {}};
  if (o.load) {
    const Element* e = circuit.find(*o.load);
    if (const auto* r = e ? std::get_if<Resistor>(&e->data) : nullptr) {
      p.load_current = SignalRef::current(*o.load);
      p.load_voltage = SignalRef::pair(r->a, r->b);
    }
  }
  return p;
}

SwingPower swing_power(const analysis::SineDrive& drive, const PowerProbes& probes,
                       double amplitude, double frequency) {
  const analysis::DriveMeasurement m = drive.measure(amplitude);
  const auto& t = m.transient.time;
  const double to = t.back(), from = to - 1.0 / frequency;
  SwingPower s;
  s.input_amplitude = amplitude;
  s.output_amplitude = m.fundamental;
  s.thd = m.thd;
  for (const auto& r : probes.rails) {
    // A DC rail: its power is its voltage times its mean delivered current.
    s.supply_power +=
        r.source_voltage * period_mean(t, m.transient.signal(r.source + ".current"), from, to);
  }
  if (probes.load_current) {
    const auto& i = m.transient.signal(probes.load_current->label());
    const auto& v = m.transient.signal(probes.load_voltage->label());
    std::vector<double> p(i.size());
    for (std::size_t k = 0; k < p.size(); ++k) p[k] = v[k] * i[k];
    // Signal power only: a load that also carries the bias current (class A
    // with the load as emitter resistor) takes DC power that is no output.
    s.load_power =
        period_mean(t, p, from, to) - period_mean(t, v, from, to) * period_mean(t, i, from, to);
  }
  s.dissipation = s.supply_power - s.load_power;
  s.efficiency = s.supply_power > 0 ? s.load_power / s.supply_power : 0;
  return s;
}

}  // namespace

CharacterizeResult run_characterize(const Circuit& circuit, const CharacterizeOptions& options,
                                    const ProgressCallback& progress) {
  CharacterizeResult r;
  r.options = options;
  r.output = options.output.label();

  FrequencyOptions f;
  f.from = options.frequency * std::pow(10.0, -kDecadesBelow);
  f.to = options.frequency * std::pow(10.0, kDecadesAbove);
  f.per_decade = kPointsPerDecade;
  f.input = options.input;
  f.output = options.output;
  f.load = options.load;
  f.at = options.frequency;
  r.frequency = run_frequency(analysis::with_only_ac_input(circuit, options.input), f);
  r.bias = r.frequency.bias;
  r.gain = std::pow(10.0, *r.frequency.figures.gain_at_dB / 20.0);
  const auto& fs = r.frequency.frequencies;
  const auto nearest = std::min_element(fs.begin(), fs.end(), [&](double a, double b) {
    return std::abs(std::log(a / options.frequency)) < std::abs(std::log(b / options.frequency));
  });
  const auto at = static_cast<std::size_t>(nearest - fs.begin());
  r.input_impedance = r.frequency.input_impedance[at];
  if (!r.frequency.output_impedance.empty()) r.output_impedance = r.frequency.output_impedance[at];

  HeadroomOptions h{options.input, options.output, options.frequency, kHeadroomLimit, options.load};
  r.headroom = run_headroom(circuit, h, progress);

  double full = std::min(r.headroom.positive.input_amplitude, r.headroom.negative.input_amplitude);
  if (r.headroom.thd_limit_input_amplitude)
    full = std::min(full, *r.headroom.thd_limit_input_amplitude);
  if (full > 0) {
    const PowerProbes probes = power_probes(circuit, options);
    const analysis::SineDrive drive(circuit, options.input, options.output, options.frequency,
                                    probes.signals());
    if (progress) progress("characterize: power at full and half swing");
    r.full_swing = swing_power(drive, probes, full, options.frequency);
    r.half_swing = swing_power(drive, probes, full / 2, options.frequency);
  }
  return r;
}

}  // namespace stage
