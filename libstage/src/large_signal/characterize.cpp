// The stage report: one wide frequency sweep, the headroom search, and three
// sine drives (full swing at the symmetric clip level, half of it, and the
// edge of the 1 % limit) for distortion and a power ledger that must balance.
#include "stage/characterize.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "analysis/step_interpolant.hpp"
#include "circuit/element_kinds.hpp"
#include "common/constants.hpp"
#include "common/si_format.hpp"
#include "large_signal/drive_setup.hpp"
#include "large_signal/headroom_search.hpp"
#include "large_signal/sine_drive.hpp"
#include "stage/errors.hpp"
#include "stage/validate.hpp"

namespace stage {
namespace {

constexpr double kHeadroomLimit = 0.01;  // the stage report judges headroom at 1 %
constexpr double kDecadesBelow = 3, kDecadesAbove = 4;
constexpr int kPointsPerDecade = 20;
// A swing's powers must balance to this fraction of the power delivered:
// Tellegen's theorem makes the terminal powers sum to zero at every step up
// to Newton's tolerance; what is left is the quadrature of the charges' share
// over about 400 steps a period (common practice for a power audit).
constexpr double kBalanceTolerance = 1e-3;

// The load's current and the voltage across it, recorded for its DC part.
struct LoadProbes {
  std::string load;  // empty without a resistor load
  std::optional<SignalRef> current, voltage;

  std::vector<SignalRef> signals() const {
    if (!current) return {};
    return {*current, *voltage};
  }
};

LoadProbes load_probes(const Circuit& circuit, const CharacterizeOptions& o) {
  LoadProbes p;
  if (o.load) {
    const Element* e = circuit.find(*o.load);
    if (e != nullptr && kinds::has_role(e->data, kinds::Role::one_port)) {
      const std::vector<std::string> ends = kinds::nodes(e->data);
      p.load = *o.load;
      p.current = SignalRef::current(*o.load);
      p.voltage = SignalRef::pair(ends[0], ends[1]);
    }
  }
  return p;
}

// Sorts each element's mean power into the ledger's accounts and checks that
// they balance. `row` names the swing in a failure.
SwingPower swing_power(const Circuit& circuit, const analysis::SineDrive& drive,
                       const LoadProbes& load, const std::string& input, double amplitude,
                       double frequency, const std::string& row) {
  const analysis::DriveMeasurement m = drive.measure(amplitude);
  SwingPower s;
  s.input_amplitude = amplitude;
  s.output_amplitude = m.fundamental;
  s.thd = m.thd;
  s.settled = m.settled;
  s.unsettled = m.unsettled;
  s.rating_violations = m.transient.rating_violations;
  for (const auto& [name, absorbed] : m.element_power) {
    const Element* element = circuit.find(name);
    const auto plays = [&](kinds::Role role) {
      return element != nullptr && kinds::has_role(element->data, role);
    };
    if (name == input) {
      s.drive_power -= absorbed;
    } else if (plays(kinds::Role::independent_source)) {
      s.supply_power -= absorbed;
    } else if (plays(kinds::Role::stores_energy)) {
      s.stored_power += absorbed;
    } else if (name == load.load) {
      // Signal power only: a load that also carries the bias current (class A
      // with the load as emitter resistor) takes DC power that is no output.
      const TransientResult& t = m.transient;
      const double to = t.time.back(), from = to - 1.0 / frequency;
      const auto dc_part = [&](const SignalRef& ref) {
        return analysis::mean(t, analysis::signal_named(t, ref.label()), from, to);
      };
      const double dc = dc_part(*load.voltage) * dc_part(*load.current);
      s.load_power = absorbed - dc;
      s.dissipation += dc;
    } else {
      s.dissipation += absorbed;
    }
  }
  const double delivered = s.supply_power + s.drive_power;
  const double imbalance = delivered - s.load_power - s.dissipation - s.stored_power;
  s.energy_residual = imbalance / std::max(std::abs(s.supply_power) + std::abs(s.drive_power),
                                           std::numeric_limits<double>::min());
  const auto figures = [&] {
    return "supplies " + text::si(s.supply_power, "W") + ", drive " + text::si(s.drive_power, "W") +
           ", load " + text::si(s.load_power, "W") + ", dissipated " +
           text::si(s.dissipation, "W") + ", stored " + text::si(s.stored_power, "W");
  };
  if (!(std::abs(s.energy_residual) <= kBalanceTolerance)) {
    throw NumericalError(ErrorKind::energy_imbalance,
                         "the " + row + " swing's powers do not balance (" + figures() +
                             ", off by " + text::si(imbalance, "W") + ")",
                         {});
  }
  if (!(s.supply_power > 0)) {
    throw NumericalError(ErrorKind::energy_imbalance,
                         "at the " + row + " swing the supplies absorb power (" + figures() +
                             "): the drive feeds them",
                         {input});
  }
  s.efficiency = s.load_power / s.supply_power;
  return s;
}

}  // namespace

CharacterizeResult run_characterize(const Circuit& circuit, const CharacterizeOptions& options,
                                    const SolverOptions& solver, const ProgressCallback& progress) {
  if (auto p = validate(circuit, options))
    throw Error(ErrorKind::invalid_request, p->message, {p->subject});
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
  // One drive, one prepared simulation: the frequency sweep, the headroom
  // search and the power rows share its system and its bias point.
  const LoadProbes load = load_probes(circuit, options);
  const analysis::SineDrive drive(analysis::with_only_ac_input(circuit, options.input), solver,
                                  options.input, options.output, options.frequency,
                                  options.settle_periods, load.signals(), true);
  r.frequency = drive.simulation().frequency(f);
  r.bias = r.frequency.bias;
  r.gain = amplitude_ratio_from_db(*r.frequency.figures.gain_at_dB);
  const auto& fs = r.frequency.frequencies;
  const auto nearest = std::min_element(fs.begin(), fs.end(), [&](double a, double b) {
    return std::abs(std::log(a / options.frequency)) < std::abs(std::log(b / options.frequency));
  });
  const auto at = static_cast<std::size_t>(nearest - fs.begin());
  r.input_impedance = r.frequency.input_impedance[at];
  if (!r.frequency.output_impedance.empty()) r.output_impedance = r.frequency.output_impedance[at];

  HeadroomOptions h{options.input, options.output, options.frequency, kHeadroomLimit, options.load};
  h.settle_periods = options.settle_periods;
  r.headroom = analysis::headroom_search(circuit, drive, h, progress);
  const auto power_at = [&](double amplitude, const std::string& row) {
    return swing_power(circuit, drive, load, options.input, amplitude, options.frequency, row);
  };
  if (progress) progress("characterize: power at full and half swing");
  if (const double full = r.headroom.symmetric_clip_input_amplitude; full > 0) {
    r.full_swing = power_at(full, "full");
    r.half_swing = power_at(full / 2, "half");
  }
  double within =
      std::min(r.headroom.positive.input_amplitude, r.headroom.negative.input_amplitude);
  if (r.headroom.thd_limit_input_amplitude)
    within = std::min(within, *r.headroom.thd_limit_input_amplitude);
  // Only where a side meets its limit: a class-B pair's sides never do, and
  // its THD passes the limit at microvolts, where no one runs it.
  if (within > 0 && (r.headroom.positive.found || r.headroom.negative.found)) {
    r.limit_swing = power_at(within, "within-limit");
  }
  return r;
}

bool CharacterizeResult::exceeds_ratings() const {
  if (!bias.rating_violations.empty()) return true;
  for (const auto* swing : {&half_swing, &full_swing, &limit_swing}) {
    if (*swing && !(*swing)->rating_violations.empty()) return true;
  }
  return false;
}

}  // namespace stage
