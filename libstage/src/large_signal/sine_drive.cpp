// Driving a stage with a sine and reading its last period.
#include "large_signal/sine_drive.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>

#include "analysis/step_interpolant.hpp"
#include "analysis/transient.hpp"
#include "circuit/element_kinds.hpp"
#include "common/si_format.hpp"
#include "large_signal/energy_ledger.hpp"
#include "large_signal/load_line.hpp"
#include "mna/system.hpp"
#include "simulation/simulation_access.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

constexpr int kFirstPeriods = 4;         // simulated before the last period is judged settled
constexpr double kStepsPerPeriod = 400;  // step bound: peaks read to ~3e-5 relative
constexpr int kHarmonics = 9;
// A run continued from where it stopped runs at least this many periods:
// the settle check compares its last two.
constexpr int kLeastContinuation = 2;

// The DC value the sine rides on: the input source's own.
double dc_of(const Circuit& circuit, const std::string& input) {
  return *kinds::own_value(circuit.find(input)->data);
}

// The unit of the input's amplitude: a voltage source's is a voltage.
std::string_view amplitude_unit(const Circuit& circuit, const std::string& input) {
  return kinds::has_role(circuit.find(input)->data, kinds::Role::holds_voltage) ? "V" : "A";
}

}  // namespace

SineDrive::SineDrive(const Circuit& circuit, const SolverOptions& solver, std::string input,
                     SignalRef output, double frequency, int settle_periods,
                     std::vector<SignalRef> record, bool energy_ledger)
    : simulation_(circuit, solver),
      input_(std::move(input)),
      output_(std::move(output)),
      frequency_(frequency),
      input_dc_(dc_of(circuit, input_)),
      settle_periods_(settle_periods),
      record_(std::move(record)),
      energy_ledger_(energy_ledger),
      periods_(std::min(kFirstPeriods, settle_periods)) {
  if (const Element* transistor = only_transistor(circuit)) {
    for (const auto& d : SimulationAccess::system(simulation_).devices()) {
      if (d->name() == transistor->name) transistor_ = d.get();
    }
  }
}

TransientResult SineDrive::run(double amplitude, int periods, const std::vector<double>& start,
                               DriveMeasurement& m, std::vector<double>& end) const {
  // The sine rides on the source's DC value, so the bias point, solved once
  // by the simulation, starts every cold run.
  simulation_.set_waveform(input_, SineWave{amplitude, frequency_, input_dc_});
  const mna::System& system = SimulationAccess::system(simulation_);
  const auto& topology = system.topology();
  const auto node = [&](const std::string& name) {
    const auto index = name.empty() ? std::optional<mna::Index>(0) : topology.find_node(name);
    if (!index) throw Error(ErrorKind::invalid_request, "no node named '" + name + "'", {name});
    return *index;
  };
  const mna::Index p = node(output_.a);
  const mna::Index n = output_.kind == SignalRef::Kind::node_pair ? node(output_.b) : 0;

  TransientOptions options;
  const double period = 1.0 / frequency_;
  options.stop = periods * period;
  options.max_step = period / kStepsPerPeriod;
  options.signals = {output_};
  options.signals.insert(options.signals.end(), record_.begin(), record_.end());

  // The last period, which a step lands on: the ledger integrates it whole
  // steps at a time, and the peaks start on a sample.
  const double window = options.stop - period;
  m.maximum = {0, -std::numeric_limits<double>::infinity(), {}};
  m.minimum = {0, std::numeric_limits<double>::infinity(), {}};
  m.transistor_path.clear();
  std::optional<EnergyLedger> ledger;
  if (energy_ledger_) ledger.emplace(simulation_.circuit(), system).start(window);
  const StepObserver observer = [&](double t, const std::vector<double>& x) {
    if (ledger) ledger->step(t, x);
    if (t < window) return;
    end = x;
    const double v = x[p] - x[n];
    if (v > m.maximum.value) m.maximum = {t, v, x};
    if (v < m.minimum.value) m.minimum = {t, v, x};
    if (transistor_ != nullptr) {
      mna::EvalRequest at = system.request(x.data());
      at.dc = false;
      at.time = t;
      if (const auto c = transistor_->conduction(at)) {
        m.transistor_path.push_back({std::abs(c->voltage), std::abs(c->current)});
      }
    }
  };
  TransientResult result = SimulationAccess::transient(simulation_, options, observer, {window},
                                                       start.empty() ? nullptr : &start);
  // The peaks between the samples: the interpolant's extremes over the
  // steps from the first sample of the last period on (the output is the
  // first signal). The state stays the extreme sample's, for telling what
  // limits each side.
  const TransientSignal& output = result.signals.front();
  const auto& time = result.time;
  for (auto k = static_cast<std::size_t>(std::lower_bound(time.begin(), time.end(), window) -
                                         time.begin());
       k + 1 < time.size(); ++k) {
    const auto [low, high] = step_piece(result, output, k).range();
    m.maximum.value = std::max(m.maximum.value, high);
    m.minimum.value = std::min(m.minimum.value, low);
  }
  m.element_power.clear();
  if (ledger) {
    const std::vector<double> power = ledger->mean_power();
    // Per element: a device no element describes (an ammeter) has none.
    for (std::size_t d = 0; d < power.size(); ++d) {
      const std::string& name = system.devices()[d]->name();
      if (simulation_.circuit().find(name) != nullptr) m.element_power.emplace_back(name, power[d]);
    }
  }
  return result;
}

DriveMeasurement SineDrive::measure(double amplitude) const {
  DriveMeasurement m;
  m.amplitude = amplitude;
  ++runs_;
  // From the bias point, first as long as the last measurement needed: the
  // circuit's time constants do not change with the amplitude.
  std::vector<double> start, end;
  int periods = periods_;
  for (int total = periods;; total += periods) {
    m.transient = run(amplitude, periods, start, m, end);
    m.periods = total;
    const SpectrumResult spectrum = run_spectrum(m.transient, {output_, frequency_, kHarmonics}, 1);
    m.thd = spectrum.thd;
    m.fundamental = spectrum.harmonics.front().amplitude;
    m.average = spectrum.dc;
    periods_ = total;
    if (spectrum.settled || total >= settle_periods_) {
      if (!spectrum.settled) {
        // The results that use this measurement say so; the log is for tracing.
        spdlog::debug("sine drive at {}: {}",
                      text::si(amplitude, amplitude_unit(simulation_.circuit(), input_)),
                      spectrum.message);
        m.settled = false;
        m.unsettled = spectrum.message;
      }
      break;
    }
    // Continued from where it stopped (after whole periods, where the sine
    // is back at its DC value), to twice the length, at least the two
    // periods the settle check compares. The continuation starts with its
    // charges' derivatives at zero, as from a bias point; the limits found
    // on the follower example and the test stages' follower and class-AB
    // pair agreed with those of restarted runs to six digits.
    start = end;
    periods = std::max(std::min(total, settle_periods_ - total), kLeastContinuation);
  }
  m.positive_peak = m.maximum.value - m.average;
  m.negative_peak = m.average - m.minimum.value;
  return m;
}

}  // namespace stage::analysis
