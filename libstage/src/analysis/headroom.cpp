// The headroom search: bracket each limit by doubling the drive, then narrow
// it by false position on the logarithm of the deviation (the deviation
// rises steeply, close to exponentially, past a clipping knee), every run
// shared by the three searches (positive side, negative side, THD).
#include "stage/headroom.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <stdexcept>

#include "analysis/drive_setup.hpp"
#include "analysis/sine_drive.hpp"
#include "mna/system.hpp"
#include "report/format.hpp"
#include "stage/errors.hpp"
#include "stage/frequency.hpp"

namespace stage {
namespace {

constexpr double kTolerance = 0.01;         // each limit's input amplitude to 1 %
constexpr double kFirstOutputSwing = 0.05;  // V: the first run's predicted output peak
constexpr int kMaxDownSteps = 4;
constexpr int kMaxRuns = 60;
constexpr double kRailMargin = 0.02;  // of the rail voltage, at least kRailMarginVolts
constexpr double kRailMarginVolts = 0.05;
constexpr double kCutoffFraction = 0.5;   // of the bias current: turning off
constexpr double kTakeOver = 2.0;         // of the bias current: carrying the side
constexpr double kStarvedFraction = 0.1;  // of a bias diode's current: starved

enum Criterion { kPositive, kNegative, kThd, kCriteria };

std::optional<std::string> options_error(const Circuit& circuit, const HeadroomOptions& o) {
  if (!(o.frequency > 0)) return "the frequency must be positive";
  if (!(o.distortion_limit > 0 && o.distortion_limit < 1)) {
    return "the distortion limit must lie between 0 and 100 %";
  }
  if (o.load && circuit.find(*o.load) == nullptr) return "no element named '" + *o.load + "'";
  return std::nullopt;
}

// The search state: every measurement so far, sorted by amplitude.
class Search {
 public:
  Search(const analysis::SineDrive& drive, double limit, double gain,
         const ProgressCallback& progress)
      : drive_(drive), limit_(limit), small_signal_gain_(gain), progress_(progress) {}

  const analysis::DriveMeasurement& at(double amplitude) {
    auto it = runs_.find(amplitude);
    if (it != runs_.end()) return it->second;
    if (progress_) {
      progress_("headroom: run " + std::to_string(runs_.size() + 1) + ", input amplitude " +
                report::si(amplitude, "V"));
    }
    if (static_cast<int>(runs_.size()) >= kMaxRuns) {
      throw NumericalError(
          "the headroom search did not converge in " + std::to_string(kMaxRuns) + " transient runs",
          {});
    }
    const auto& m = runs_.emplace(amplitude, drive_.measure(amplitude)).first->second;
    large_signal_gain_ = std::max(large_signal_gain_, m.fundamental / amplitude);
    return m;
  }

  double value(Criterion c, const analysis::DriveMeasurement& m) const {
    const double predicted = gain() * m.amplitude;
    switch (c) {
      // Clipping is a shortfall: a peak that overshoots the prediction is
      // distortion, which the THD limit judges, not a limit of that side.
      case kPositive:
        return 1.0 - m.positive_peak / predicted;
      case kNegative:
        return 1.0 - m.negative_peak / predicted;
      default:
        return m.thd;
    }
  }
  bool within(Criterion c, const analysis::DriveMeasurement& m) const {
    return value(c, m) <= limit_;
  }

  // The first upward crossing of the limit above the smallest amplitude
  // within it: (largest ok below it, first bad); either may be missing.
  std::pair<const analysis::DriveMeasurement*, const analysis::DriveMeasurement*> bracket(
      Criterion c) const {
    const analysis::DriveMeasurement* ok = nullptr;
    for (const auto& [a, m] : runs_) {
      if (within(c, m)) {
        ok = &m;
      } else if (ok != nullptr) {
        return {ok, &m};
      }
    }
    return {ok, nullptr};
  }

  bool all_bracketed() const {
    for (int c = 0; c < kCriteria; ++c) {
      if (bracket(Criterion(c)).second == nullptr) return false;
    }
    return true;
  }

  // Next amplitude inside a bracket: where log(value) reaches log(limit) on
  // the line through the two ends, kept away from the ends so the bracket
  // always shrinks.
  double next(Criterion c, const analysis::DriveMeasurement& ok,
              const analysis::DriveMeasurement& bad) const {
    const double lo = std::log(std::max(value(c, ok), 1e-12));
    const double hi = std::log(std::max(value(c, bad), 1e-12));
    const double w = bad.amplitude - ok.amplitude;
    double a = ok.amplitude + w * (std::log(limit_) - lo) / (hi - lo);
    const double keep = w < 4 * kTolerance * ok.amplitude ? 0.25 : 0.1;
    return std::clamp(a, ok.amplitude + keep * w, bad.amplitude - keep * w);
  }

  // The gain the peaks are compared with: the small-signal gain, unless the
  // stage has (almost) none at its bias point, as a class-B pair biased off,
  // whose largest large-signal gain seen so far stands in for it.
  double gain() const { return judged_large_signal() ? large_signal_gain_ : small_signal_gain_; }
  bool judged_large_signal() const { return small_signal_gain_ < 0.5 * large_signal_gain_; }
  const std::map<double, analysis::DriveMeasurement>& runs() const { return runs_; }

 private:
  const analysis::SineDrive& drive_;
  double limit_;
  double small_signal_gain_;
  double large_signal_gain_ = 0;
  const ProgressCallback& progress_;
  std::map<double, analysis::DriveMeasurement> runs_;
};

// What stops a side, read from the devices at the waveform's extreme, in
// this order: a transistor newly in saturation; the output at a supply rail;
// a diode that conducted at the bias point carrying less than
// kStarvedFraction of that current (the network that biases the drive has run
// out of current: current_limit); a transistor newly in cutoff or carrying
// less than kCutoffFraction of its bias current, unless another transistor
// has taken over (more than kTakeOver times its bias current, as in a
// push-pull pair, where the idle half turning off is normal); otherwise
// smooth distortion, naming the transistor whose current moved furthest.
LimitCause classify(const mna::System& system, const BiasResult& bias,
                    const std::vector<analysis::Rail>& rails, const analysis::Extreme& extreme,
                    double output_reference) {
  mna::EvalRequest at = system.request(extreme.state.data());
  at.dc = false;
  at.time = extreme.time;
  mna::OperatingPointReport report;
  for (const auto& d : system.devices()) d->report(at, report);

  // |IC| at the peak over |IC| at the bias point, per transistor.
  const auto ratio = [&](const BipolarOperatingPoint& q) {
    const double biased = std::abs(bias.bipolar(q.name).collector_current);
    return biased > 0 ? std::max(std::abs(q.collector_current), 1e-300) / biased : 1.0;
  };
  bool taken_over = false;
  for (const auto& q : report.bipolars) taken_over = taken_over || ratio(q) > kTakeOver;
  // The transistor to name: with a take-over, the one carrying the side;
  // otherwise the one whose current moved furthest either way.
  const BipolarOperatingPoint* furthest = nullptr;
  double furthest_ratio = 1;
  for (const auto& q : report.bipolars) {
    const double r = ratio(q);
    const bool further = taken_over ? r > furthest_ratio
                                    : std::abs(std::log(r)) > std::abs(std::log(furthest_ratio));
    if (furthest == nullptr || further) {
      furthest = &q;
      furthest_ratio = r;
    }
  }
  const std::string detail =
      furthest == nullptr
          ? ""
          : furthest->name + " collector current " +
                report::si(std::abs(furthest->collector_current), "A") + " at the peak, " +
                report::si(std::abs(bias.bipolar(furthest->name).collector_current), "A") +
                " at the bias point";

  for (const auto& q : report.bipolars) {
    if (q.region == "saturation" && bias.bipolar(q.name).region != "saturation") {
      return {"saturation", q.name, detail};
    }
  }
  for (const analysis::Rail& r : rails) {
    const double margin = std::max(kRailMarginVolts, kRailMargin * std::abs(r.voltage));
    if (std::abs(extreme.value + output_reference - r.voltage) < margin) {
      return {"rail", r.source, detail};
    }
  }
  for (const auto& d : report.diodes) {
    const double biased = bias.diode(d.name).current;
    if (biased > 0 && d.current < kStarvedFraction * biased) {
      return {"current_limit", d.name,
              d.name + " carries " + report::si(d.current, "A") + " at the peak, " +
                  report::si(biased, "A") + " at the bias point"};
    }
  }
  if (!taken_over) {
    for (const auto& q : report.bipolars) {
      if (q.region == "cutoff" && bias.bipolar(q.name).region != "cutoff") {
        return {"cutoff", q.name, detail};
      }
    }
    if (furthest != nullptr && furthest_ratio < kCutoffFraction) {
      return {"cutoff", furthest->name, detail};
    }
  }
  return {"distortion", furthest == nullptr ? "" : furthest->name, detail};
}

}  // namespace

HeadroomResult run_headroom(const Circuit& circuit, const HeadroomOptions& options,
                            const ProgressCallback& progress) {
  if (auto why = options_error(circuit, options)) throw std::invalid_argument(*why);
  HeadroomResult result;
  result.options = options;
  result.output = options.output.label();
  result.bias = run_bias(circuit);
  const auto node = [&](const std::string& name) {
    return name == kGround || name.empty() ? 0.0 : result.bias.voltage(name);
  };
  result.bias_output =
      node(options.output.a) -
      (options.output.kind == SignalRef::Kind::node_pair ? node(options.output.b) : 0.0);
  result.small_signal_gain =
      analysis::small_signal_gain(circuit, options.input, options.output, options.frequency);

  const analysis::SineDrive drive(circuit, options.input, options.output, options.frequency);
  Search search(drive, options.distortion_limit, result.small_signal_gain, progress);

  // Bracket: down while the first amplitude is already past a limit, then up
  // by doubling until every limit has been crossed or the drive would carry
  // the output far past the rails.
  double largest_rail = 1.0;
  for (const analysis::Rail& r : analysis::supply_rails(circuit, options.input))
    largest_rail = std::max(largest_rail, std::abs(r.voltage));
  // The first drive aims at a small output swing, and never beyond a twentieth
  // of the largest rail (a stage biased off predicts no output at all).
  double amplitude = options.first_input_amplitude.value_or(
      std::min(kFirstOutputSwing / result.small_signal_gain, largest_rail / 20));
  for (int k = 0; k < kMaxDownSteps; ++k) {
    const auto& m = search.at(amplitude);
    if (search.within(kPositive, m) && search.within(kNegative, m) && search.within(kThd, m)) break;
    amplitude /= 2;
  }
  // A drive whose prediction is half as large again as the largest rail has
  // clipped; beyond that an ideal source only forces junctions into the rails.
  const auto largest_amplitude = [&] { return 1.5 * largest_rail / search.gain(); };
  for (amplitude = search.runs().rbegin()->first * 2;
       !search.all_bracketed() && amplitude / 2 < largest_amplitude(); amplitude *= 2) {
    search.at(std::min(amplitude, largest_amplitude()));
  }

  if (search.judged_large_signal()) {
    result.notes.push_back(
        "the small-signal gain at the bias point is far below the large-signal gain (a stage "
        "biased off, such as class B): peaks are compared with the largest large-signal gain");
  }

  for (int c = 0; c < kCriteria; ++c) {
    for (;;) {
      const auto [ok, bad] = search.bracket(Criterion(c));
      if (ok == nullptr || bad == nullptr) break;
      if (bad->amplitude - ok->amplitude <= kTolerance * ok->amplitude) break;
      search.at(search.next(Criterion(c), *ok, *bad));
    }
  }

  const mna::System system(circuit);
  const auto rails = analysis::supply_rails(circuit, options.input);
  auto side = [&](Criterion c, bool positive) {
    SideLimit s;
    const auto [ok, bad] = search.bracket(c);
    if (ok == nullptr) {
      s.cause = {"distortion", "", ""};
      result.notes.push_back(std::string(positive ? "positive" : "negative") +
                             " side: beyond the limit at every amplitude tried");
      return s;
    }
    s.peak = positive ? ok->positive_peak : ok->negative_peak;
    s.input_amplitude = ok->amplitude;
    s.shortfall = search.value(c, *ok);
    s.found = bad != nullptr;
    const double reference =
        options.output.kind == SignalRef::Kind::node_pair ? node(options.output.b) : 0.0;
    auto cause_in = [&](const analysis::DriveMeasurement& m) {
      return classify(system, result.bias, rails, positive ? m.maximum : m.minimum, reference);
    };
    s.cause = cause_in(bad != nullptr ? *bad : *ok);
    const auto& largest = search.runs().rbegin()->second;
    if (bad != nullptr && largest.amplitude > bad->amplitude) {
      s.at_largest_drive = cause_in(largest);
      s.largest_drive = largest.amplitude;
    }
    return s;
  };
  result.positive = side(kPositive, true);
  result.negative = side(kNegative, false);
  double symmetric = std::min(result.positive.peak, result.negative.peak);
  if (const auto [ok, bad] = search.bracket(kThd); ok != nullptr) {
    if (bad != nullptr) {
      result.thd_limit_input_amplitude = ok->amplitude;
      result.thd_limit_output_amplitude = ok->fundamental;
      symmetric = std::min(symmetric, ok->fundamental);
    }
  } else {
    symmetric = 0;
  }
  result.symmetric_peak_to_peak = 2 * symmetric;
  result.transient_runs = drive.runs();
  result.load_line = estimate_load_line(circuit, result.bias, options.frequency);
  spdlog::debug("headroom: {} transient runs", result.transient_runs);
  return result;
}

}  // namespace stage
