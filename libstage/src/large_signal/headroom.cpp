// The headroom search: bracket each limit by stepping the drive up to where
// the runs so far predict it is crossed, then narrow it by safeguarded
// interpolation on the curve the criterion follows (near a limit the
// shortfall and the THD grow like a power of the drive), each bracket closed
// to 1 % by runs placed just past the predicted crossing; find where each
// side stops growing by halving the interval where its incremental gain
// first collapses and the one below it. Every run is shared by all the
// searches (headroom_runs), and the limit classifier says what stops each
// side.
#include "stage/headroom.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cmath>
#include <iterator>
#include <limits>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "circuit/element_kinds.hpp"
#include "common/si_format.hpp"
#include "large_signal/drive_setup.hpp"
#include "large_signal/headroom_runs.hpp"
#include "large_signal/headroom_search.hpp"
#include "large_signal/limit_classifier.hpp"
#include "large_signal/load_line.hpp"
#include "large_signal/sine_drive.hpp"
#include "simulation/simulation_access.hpp"
#include "stage/errors.hpp"
#include "stage/validate.hpp"

namespace stage {

HeadroomResult run_headroom(const Circuit& circuit, const HeadroomOptions& options,
                            const SolverOptions& solver, const ProgressCallback& progress) {
  if (auto p = validate(circuit, options)) {
    throw Error(ErrorKind::invalid_request, p->message, {p->subject});
  }
  const analysis::SineDrive drive(analysis::with_only_ac_input(circuit, options.input), solver,
                                  options.input, options.output, options.frequency,
                                  options.settle_periods);
  return analysis::headroom_search(circuit, drive, options, progress);
}

namespace analysis {
namespace {

// Each limit's drive is narrowed to 1 %: finer than a designer reads a
// swing, and every narrowing step costs a transient run.
constexpr double kTolerance = 0.01;
// The clip level's drive to 5 %: the peak is flat there by definition, so
// 5 % of drive moves it by far less than 5 %.
constexpr double kClipTolerance = 0.05;
// V: the first run's predicted output peak, small against a junction's
// 0.6 V and any rail, so the first run is within every limit for most stages.
constexpr double kFirstOutputSwing = 0.05;
// A stage biased off predicts almost no output, hence a huge first drive:
// its predicted peak is held to the largest rail over this.
constexpr double kFirstSwingRailDivisor = 20;
// A first drive already past a limit is lowered at most this often, to at
// most a sixteenth of it; a side still past it there is reported beyond it
// at every amplitude tried.
constexpr int kMaxDownSteps = 4;
constexpr double kMostLowered = 1.0 / 16;
// Lowering aims this far below where the first run predicts the limit (a
// shortfall or THD growing at least in proportion to the drive), so that
// the run lands within it.
constexpr double kBelowPrediction = 0.8;
// Stepping up aims this far past the first open limit's predicted crossing
// (a shortfall steepens toward a knee, so the prediction falls short), by a
// factor of at least kLeastStep (a step is worth a run) and at most
// kBracketFactor (the prediction is an extrapolation), or by kBracketFactor
// when nothing is predicted; once every limit is crossed, straight to the
// largest drive allowed, where a side still growing is read, and whose
// interval with the run below it is halved when a side has stopped growing
// in it.
constexpr double kPastPrediction = 1.15;
constexpr double kLeastStep = 1.25;
constexpr double kBracketFactor = 4.0;
// The exponent of the power law a prediction follows is held to this range
// (a side's shortfall grows at least like the drive, and a knee seen from
// far below is no steeper than this).
constexpr double kLeastExponent = 1.0;
constexpr double kMostExponent = 4.0;
// A drive whose prediction is this many times the largest rail has
// clipped; beyond it an ideal source only forces junctions into the rails.
constexpr double kClippedPredictionRails = 1.5;
// Rails below 1 V bound the drive as a 1 V rail would: a circuit with no
// rail at all would otherwise be allowed no drive.
constexpr double kSmallestRail = 1.0;
// Inside a bracket, a run goes to the predicted crossing but no closer to
// either end than this fraction of the tolerance, so that a good prediction
// closes the bracket with the next run...
constexpr double kToleranceStep = 0.9;
// ...moved this fraction of the tolerance toward the end the last run left
// in place (doubled while runs keep leaving it there)...
constexpr double kNudge = 0.45;
// ...and when kRunsToHalve runs have not halved the bracket (the criterion
// is not following the curve), the next one halves it, on the logarithm of
// the drive: never far worse than bisection.
constexpr std::size_t kRunsToHalve = 3;
constexpr double kLeastShrink = 0.5;
// Relative rounding under which the largest drive is the rails' bound.
constexpr double kSameDrive = 1e-9;

double node_voltage(const BiasResult& bias, const std::string& name) {
  return name == kGround || name.empty() ? 0.0 : bias.voltage(name);
}

// The output's reference node at the bias point: node b of a node pair, else 0 V.
double output_reference(const BiasResult& bias, const SignalRef& output) {
  return output.kind == SignalRef::Kind::node_pair ? node_voltage(bias, output.b) : 0.0;
}

// The result's figures at the bias point: the output there and the
// small-signal gain the peaks are predicted with.
HeadroomResult bias_figures(const SineDrive& drive, const HeadroomOptions& options) {
  HeadroomResult result;
  result.options = options;
  result.output = options.output.label();
  result.bias = drive.simulation().bias();
  result.bias_output =
      node_voltage(result.bias, options.output.a) - output_reference(result.bias, options.output);
  result.small_signal_gain =
      small_signal_gain(drive.simulation(), options.input, options.output, options.frequency);
  return result;
}

// How hard the search may drive the input: never to a prediction of
// kClippedPredictionRails times the largest rail, nor, for a voltage input,
// beyond what a driver on the rails can deliver.
class DriveBound {
 public:
  DriveBound(const Circuit& circuit, const std::string& input) {
    const std::vector<Rail> rails = supply_rails(circuit, input);
    for (const Rail& r : rails) largest_rail_ = std::max(largest_rail_, std::abs(r.voltage));
    // Half the span between the lowest and the highest rail (ground counts
    // as one): an ideal voltage source driven past the rails only forces
    // junctions into them; a current input has no such bound.
    const Element* e = circuit.find(input);
    if (e == nullptr || !kinds::has_role(e->data, kinds::Role::independent_source) ||
        !kinds::has_role(e->data, kinds::Role::holds_voltage)) {
      return;
    }
    double lowest = 0, highest = 0;
    for (const Rail& r : rails) {
      lowest = std::min(lowest, r.voltage);
      highest = std::max(highest, r.voltage);
    }
    if (highest > lowest) rail_bound_ = 0.5 * (highest - lowest);
  }

  double largest_rail() const { return largest_rail_; }

  // The largest input amplitude while the peaks are predicted with `gain`.
  double largest(double gain) const {
    return std::min(kClippedPredictionRails * largest_rail_ / gain,
                    rail_bound_.value_or(std::numeric_limits<double>::infinity()));
  }

  // Why `amplitude`, the largest drive the search reached, is the largest
  // allowed: words for a note.
  std::string why_largest(double amplitude) const {
    static_assert(kClippedPredictionRails == 1.5, "the words below name it");
    return rail_bound_ && amplitude >= *rail_bound_ * (1 - kSameDrive)
               ? ", what a driver on these rails can deliver: half the span between the lowest "
                 "and highest rail"
               : ", where the prediction is 1.5 times the largest rail";
  }

 private:
  double largest_rail_ = kSmallestRail;
  std::optional<double> rail_bound_;
};

// The first drive: the options', else one whose predicted peak is
// kFirstOutputSwing (at most a fraction of the largest rail), within the bound.
double first_amplitude(const HeadroomOptions& options, const HeadroomRuns& runs,
                       const DriveBound& bound) {
  return std::min(
      options.first_input_amplitude.value_or(
          std::min(kFirstOutputSwing / runs.gain(), bound.largest_rail() / kFirstSwingRailDivisor)),
      bound.largest(runs.gain()));
}

// The logarithm of the drive where criterion `c` is predicted to reach its
// limit, extrapolated from runs `a` and `b` (a below b): a power of the drive
// (the exponent held to [kLeastExponent, kMostExponent]) when both values are
// positive, else a straight line against the logarithm of the drive (a side
// whose peak overshoots at small drives). Nothing when the value does not
// rise from `a` to `b`.
std::optional<double> extrapolated_crossing(const HeadroomRuns& runs, Criterion c,
                                            const DriveMeasurement& a, const DriveMeasurement& b) {
  const double va = runs.value(c, a), vb = runs.value(c, b);
  if (!(vb > va)) return std::nullopt;
  const double xa = std::log(a.amplitude), xb = std::log(b.amplitude);
  const double limit = runs.limit(c);
  if (va > 0) {
    const double exponent =
        std::clamp(std::log(vb / va) / (xb - xa), kLeastExponent, kMostExponent);
    return xb + std::log(limit / vb) / exponent;
  }
  return xa + (xb - xa) * (limit - va) / (vb - va);
}

// The logarithm of the drive where criterion `c` is predicted to reach its
// limit inside its bracket (ok, bad): the value's logarithm (a power law)
// when every run used is positive, else the value itself, taken against the
// logarithm of the drive; interpolated on the parabola through the ends and
// the run nearest them outside, else on the line through the ends.
double interpolated_crossing(const HeadroomRuns& runs, Criterion c, const DriveMeasurement& ok,
                             const DriveMeasurement& bad) {
  const auto& measured = runs.measured();
  const auto below = measured.find(ok.amplitude), above = measured.find(bad.amplitude);
  const DriveMeasurement* third = nullptr;
  if (below != measured.begin()) third = &std::prev(below)->second;
  if (std::next(above) != measured.end() &&
      (third == nullptr || std::log(std::next(above)->first / bad.amplitude) <
                               std::log(ok.amplitude / third->amplitude))) {
    third = &std::next(above)->second;
  }
  const bool power_law = runs.value(c, ok) > 0 && (third == nullptr || runs.value(c, *third) > 0);
  const auto g = [&](const DriveMeasurement& m) {
    return power_law ? std::log(runs.value(c, m)) : runs.value(c, m);
  };
  const double target = power_law ? std::log(runs.limit(c)) : runs.limit(c);
  const double x0 = std::log(ok.amplitude), x1 = std::log(bad.amplitude), h = x1 - x0;
  const double g0 = g(ok), g1 = g(bad);
  const double slope = (g1 - g0) / h;
  const double secant = x0 + (target - g0) / slope;
  if (third == nullptr) return secant;
  // The parabola g0 + slope u + curvature u (u - h), u = x - x0, crosses the
  // target once in (0, h), as the ends lie either side of it.
  const double x2 = std::log(third->amplitude);
  const double curvature = ((g(*third) - g1) / (x2 - x1) - slope) / (x2 - x0);
  const double b = slope - curvature * h, offset = g0 - target;
  // Its roots q / curvature and offset / q (the stable pair, Numerical Recipes 5.6).
  const double q =
      -0.5 * (b + std::copysign(std::sqrt(std::max(b * b - 4 * curvature * offset, 0.0)), b));
  for (const double u : {offset / q, q / curvature}) {
    if (u > 0 && u < h) return x0 + u;
  }
  return secant;
}

// Down while the first amplitude is already past a limit, to a little below
// where the run predicts it (its value growing at least like the drive).
double lowered_start(HeadroomRuns& runs, double first) {
  double amplitude = first;
  for (int k = 0; k < kMaxDownSteps && amplitude > first * kMostLowered; ++k) {
    const auto& m = runs.at(amplitude);
    double factor = 1;
    for (const Criterion c : {kPositive, kNegative, kThd}) {
      if (!runs.within(c, m)) factor = std::min(factor, runs.limit(c) / runs.value(c, m));
    }
    if (factor == 1) break;
    amplitude = std::max(amplitude * kBelowPrediction * factor, first * kMostLowered);
  }
  return amplitude;
}

// The next drive up from the largest run while a limit is open:
// kPastPrediction past the first open limit's predicted crossing, on the
// curve through the two largest runs, a step of [kLeastStep,
// kBracketFactor]; kBracketFactor when nothing is predicted.
double next_drive_up(const HeadroomRuns& runs) {
  const DriveMeasurement& top = runs.largest();
  double step = kBracketFactor;
  if (runs.measured().size() >= 2) {
    const DriveMeasurement& below = std::next(runs.measured().rbegin())->second;
    for (int c = 0; c < kCriteria; ++c) {
      if (runs.bracket(Criterion(c)).second != nullptr) continue;
      if (const auto x = extrapolated_crossing(runs, Criterion(c), below, top)) {
        step = std::min(step, kPastPrediction * std::exp(*x) / top.amplitude);
      }
    }
  }
  return top.amplitude * std::max(step, kLeastStep);
}

// Bracket: down while the first amplitude is already past a limit, then up
// until every limit has been crossed, then to the drive's bound unless both
// sides have stopped growing by then.
void bracket_limits(HeadroomRuns& runs, const DriveBound& bound, double first) {
  runs.at(lowered_start(runs, first));
  const auto done = [&] {
    return runs.all_bracketed() && runs.plateau(true) && runs.plateau(false);
  };
  const auto largest = [&] { return bound.largest(runs.gain()); };
  while (!done() && runs.largest().amplitude < largest() * (1 - kSameDrive)) {
    runs.at(runs.all_bracketed() ? largest() : std::min(next_drive_up(runs), largest()));
  }
}

// Criterion `c` narrowed until its bracket is within kTolerance. Each run
// goes to the interpolated crossing, moved toward the end the last run left
// in place (so that a good prediction lands on the other side of the
// crossing and closes the bracket: kNudge tolerances, doubled for every
// further run that leaves the same end in place, as the Illinois variant of
// false position halves a stale end's weight) and kept kToleranceStep
// tolerances from either end; or halfway, on the logarithm of the drive,
// when the last kRunsToHalve runs have not halved the bracket or it is
// narrower than two such steps.
void narrow_limit(HeadroomRuns& runs, Criterion c) {
  const double tolerance = std::log1p(kTolerance);
  const double step = kToleranceStep * tolerance;
  std::vector<double> widths;
  const DriveMeasurement* last_ok = nullptr;
  double nudge = 0;
  for (;;) {
    const auto [ok, bad] = runs.bracket(c);
    if (ok == nullptr || bad == nullptr) return;
    if (bad->amplitude - ok->amplitude <= kTolerance * ok->amplitude) return;
    const double lo = std::log(ok->amplitude), hi = std::log(bad->amplitude);
    const double width = hi - lo;
    if (last_ok != nullptr) {
      // Negative: toward ok, which the last run left in place.
      const double toward = last_ok == ok ? -1 : 1;
      nudge = nudge * toward > 0 ? 2 * nudge : toward * kNudge * tolerance;
    }
    double next = 0.5 * (lo + hi);
    const bool halving = widths.size() < kRunsToHalve ||
                         width <= kLeastShrink * widths[widths.size() - kRunsToHalve];
    if (width > 2 * step && halving) {
      next = std::clamp(interpolated_crossing(runs, c, *ok, *bad) + nudge, lo + step, hi - step);
    }
    widths.push_back(width);
    last_ok = ok;
    runs.at(std::exp(next));
  }
}

// A side's plateau interval halved (on the logarithm of the drive) until it
// is within kClipTolerance, and so the interval just below it, where the
// side still rose: the side stops growing within those two, so its clip
// level does not depend on how widely the runs below it were spaced.
void narrow_plateau(HeadroomRuns& runs, bool positive) {
  const auto wide = [](const DriveMeasurement& lo, const DriveMeasurement& hi) {
    return hi.amplitude - lo.amplitude > kClipTolerance * lo.amplitude;
  };
  for (;;) {
    const auto flat = runs.plateau(positive);
    if (!flat) return;
    const DriveMeasurement &lo = *flat->first, &hi = *flat->second;
    const auto at = runs.measured().find(lo.amplitude);
    const DriveMeasurement* rising =
        at == runs.measured().begin() ? nullptr : &std::prev(at)->second;
    if (wide(lo, hi)) {
      runs.at(std::sqrt(lo.amplitude * hi.amplitude));
    } else if (rising != nullptr && wide(*rising, lo)) {
      runs.at(std::sqrt(rising->amplitude * lo.amplitude));
    } else {
      return;
    }
  }
}

// Every bracketed limit narrowed to kTolerance, then every plateau (and
// the rising interval below it) to kClipTolerance.
void narrow(HeadroomRuns& runs) {
  // The lowest bracket first: the runs narrowing one limit often fall in
  // the next one's bracket and narrow it too.
  std::vector<std::pair<double, Criterion>> by_drive;
  for (int c = 0; c < kCriteria; ++c) {
    if (const auto ok = runs.bracket(Criterion(c)).first)
      by_drive.emplace_back(ok->amplitude, Criterion(c));
  }
  std::sort(by_drive.begin(), by_drive.end());
  for (const auto& [drive, c] : by_drive) narrow_limit(runs, c);
  for (const bool positive : {true, false}) narrow_plateau(runs, positive);
}

// What each side's figures are read from once the runs are done, and the
// notes they add to.
struct Findings {
  const HeadroomRuns& runs;
  const LimitClassifier& classifier;
  const DriveBound& bound;
  const std::string& input;
  std::vector<std::string>& notes;

  LimitCause cause(bool positive, const DriveMeasurement& m) const {
    return classifier.classify(positive ? m.maximum : m.minimum);
  }
};

// A side's clip level: where it stopped growing, else its peak at the
// largest drive tried.
ClipLevel clip_level(bool positive, const Findings& f) {
  const std::string name = positive ? "positive" : "negative";
  const DriveMeasurement& largest = f.runs.largest();
  ClipLevel clip;
  if (const auto flat = f.runs.plateau(positive)) {
    clip = {side_peak(positive, *flat->second), flat->second->amplitude,
            f.cause(positive, *flat->second), true};
  } else {
    clip = {
        side_peak(positive, largest),
        largest.amplitude,
        {Mechanism::drive_limit, f.input,
         "still growing at " + text::si(largest.amplitude, "V") + " of drive, the largest allowed"},
        false};
    f.notes.push_back(name + " side: still growing at the largest drive allowed (" +
                      text::si(largest.amplitude, "V") + f.bound.why_largest(largest.amplitude) +
                      "); its clip level is its peak there");
  }
  const DriveMeasurement& clipped = f.runs.measured().at(clip.input_amplitude);
  if (!clipped.settled) {
    f.notes.push_back(
        name + " side: its clip level is approximate: at " + text::si(clipped.amplitude, "V") +
        " of drive, after " + std::to_string(clipped.periods) + " periods, " + clipped.unsettled +
        "; a larger settle_periods (now " + std::to_string(clipped.periods) + ") lets it settle");
  }
  return clip;
}

// A side's figures: its clip level, its 1 dB compression point, and its
// largest peak within the distortion limit with what stops it there.
SideLimit side_limit(Criterion c, Criterion compression, const Findings& f) {
  const bool positive = positive_side(c);
  SideLimit s;
  s.clip = clip_level(positive, f);
  if (const auto [ok, bad] = f.runs.bracket(compression); ok != nullptr && bad != nullptr) {
    s.compression_1dB_peak = side_peak(positive, *ok);
    s.compression_1dB_input_amplitude = ok->amplitude;
  }
  const auto [ok, bad] = f.runs.bracket(c);
  if (ok == nullptr) {
    s.cause = {Mechanism::distortion, "", ""};
    f.notes.push_back(std::string(positive ? "positive" : "negative") +
                      " side: beyond the limit at every amplitude tried");
    return s;
  }
  s.peak = side_peak(positive, *ok);
  s.input_amplitude = ok->amplitude;
  s.shortfall = f.runs.value(c, *ok);
  s.found = bad != nullptr;
  s.cause = f.cause(positive, bad != nullptr ? *bad : *ok);
  const DriveMeasurement& largest = f.runs.largest();
  if (bad != nullptr && largest.amplitude > bad->amplitude) {
    s.at_largest_drive = f.cause(positive, largest);
    s.largest_drive = largest.amplitude;
  }
  return s;
}

// The swing within every limit: the side that clips first, and twice the
// smallest of the two sides' peaks and the THD-limited amplitude (none when
// the THD is past its limit from the smallest drive).
void symmetric_figures(const HeadroomRuns& runs, HeadroomResult& result) {
  const SideLimit& clips_first =
      result.positive.clip.peak <= result.negative.clip.peak ? result.positive : result.negative;
  result.symmetric_clip_peak = clips_first.clip.peak;
  result.symmetric_clip_input_amplitude = clips_first.clip.input_amplitude;
  double symmetric = std::min(result.positive.peak, result.negative.peak);
  const auto [thd_ok, thd_bad] = runs.bracket(kThd);
  if (thd_ok != nullptr && thd_bad != nullptr) {
    symmetric = std::min(symmetric, thd_ok->fundamental);
  } else if (thd_ok == nullptr) {
    symmetric = 0;
  }
  result.symmetric_peak_to_peak = 2 * symmetric;
}

// Where the THD reaches its limit, and what makes it pass the limit, read
// at the first run past it (the smallest drive, when the THD is past it
// from the start).
void thd_limit(const Findings& f, HeadroomResult& result) {
  const auto [ok, bad] = f.runs.bracket(kThd);
  if (ok != nullptr && bad != nullptr) {
    result.thd_limit_input_amplitude = ok->amplitude;
    result.thd_limit_output_amplitude = ok->fundamental;
  }
  const DriveMeasurement* past = ok == nullptr ? &f.runs.smallest() : bad;
  if (past == nullptr) return;
  // A complementary pair biased off hands the output from one half to the
  // other through a dead zone each period: its distortion is crossover.
  // Which halves carry is read at the largest drive, where the currents
  // stand clear of the leakage. Otherwise the THD is blamed like the side
  // that falls shorter.
  if (f.runs.judged_large_signal()) {
    const DriveMeasurement& largest = f.runs.largest();
    result.thd_limit_cause = f.classifier.pair_handing_over(largest.maximum, largest.minimum);
    if (result.thd_limit_cause) return;
  }
  const bool positive = f.runs.value(kPositive, *past) >= f.runs.value(kNegative, *past);
  result.thd_limit_cause = f.cause(positive, *past);
}

// The runs as figures, and the transistor's path at the largest drive within
// every limit and at the symmetric clip level, for the load-line picture.
void keep_runs(const HeadroomRuns& runs, HeadroomResult& result) {
  for (const auto& [amplitude, m] : runs.measured()) {
    result.runs.push_back({amplitude, m.positive_peak, m.negative_peak, m.thd});
  }
  if (!result.load_line) return;
  const auto path_at = [&](double amplitude) -> std::optional<LoadLinePath> {
    const auto run = runs.measured().find(amplitude);
    if (amplitude <= 0 || run == runs.measured().end()) return std::nullopt;
    return LoadLinePath{amplitude, run->second.transistor_path};
  };
  double clean = std::min(result.positive.input_amplitude, result.negative.input_amplitude);
  if (result.thd_limit_input_amplitude) clean = std::min(clean, *result.thd_limit_input_amplitude);
  result.load_line->clean_path = path_at(clean);
  result.load_line->clip_path = path_at(result.symmetric_clip_input_amplitude);
}

}  // namespace

HeadroomResult headroom_search(const Circuit& circuit, const SineDrive& drive,
                               const HeadroomOptions& options, const ProgressCallback& progress) {
  HeadroomResult result = bias_figures(drive, options);
  HeadroomRuns runs(drive, options.distortion_limit, result.small_signal_gain, options.max_runs,
                    progress);
  const LimitClassifier classifier(
      circuit, drive.simulation().solver(), SimulationAccess::system(drive.simulation()),
      SimulationAccess::bias_point(drive.simulation()), options.input, options.frequency,
      output_reference(result.bias, options.output));
  const DriveBound bound(circuit, options.input);

  bracket_limits(runs, bound, first_amplitude(options, runs, bound));
  if (runs.judged_large_signal()) {
    result.notes.push_back(
        "the small-signal gain at the bias point is far below the large-signal gain (a stage "
        "biased off, such as class B): peaks are compared with the largest large-signal gain");
  }
  narrow(runs);

  result.largest_drive_allowed = bound.largest(runs.gain());
  const Findings found{runs, classifier, bound, options.input, result.notes};
  result.positive = side_limit(kPositive, kPositive1dB, found);
  result.negative = side_limit(kNegative, kNegative1dB, found);
  symmetric_figures(runs, result);
  thd_limit(found, result);
  result.transient_runs = drive.runs();
  result.counters = drive.simulation().counters();
  result.load_line = estimate_load_line(circuit, drive.simulation().solver(), classifier.at_bias(),
                                        options.frequency);
  keep_runs(runs, result);
  spdlog::debug("headroom: {} transient runs", result.transient_runs);
  return result;
}

}  // namespace analysis

std::string_view to_string(Mechanism mechanism) {
  switch (mechanism) {
    case Mechanism::saturation:
      return "saturation";
    case Mechanism::cutoff:
      return "cutoff";
    case Mechanism::rail:
      return "rail";
    case Mechanism::current_limit:
      return "current_limit";
    case Mechanism::crossover:
      return "crossover";
    case Mechanism::drive_limit:
      return "drive_limit";
    case Mechanism::distortion:
      return "distortion";
  }
  return "distortion";
}

}  // namespace stage
