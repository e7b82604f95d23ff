// The headroom search: bracket each limit by doubling the drive, then narrow
// it by false position on the logarithm of the deviation (the deviation
// rises steeply, close to exponentially, past a clipping knee); find where
// each side stops growing by halving the interval where its incremental gain
// first collapses. Every run is shared by all the searches.
#include "stage/headroom.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <optional>
#include <set>
#include <stdexcept>

#include "common/si_format.hpp"
#include "large_signal/drive_setup.hpp"
#include "large_signal/headroom_search.hpp"
#include "large_signal/sine_drive.hpp"
#include "mna/system.hpp"
#include "simulation/simulation_access.hpp"
#include "stage/errors.hpp"
#include "stage/frequency.hpp"
#include "stage/validate.hpp"

namespace stage {
namespace {

constexpr double kTolerance = 0.01;         // each limit's input amplitude to 1 %
constexpr double kFirstOutputSwing = 0.05;  // V: the first run's predicted output peak
constexpr int kMaxDownSteps = 4;
// A side has clipped where its peak's incremental gain against the drive
// falls below this fraction of its largest (-14 dB): a common-emitter stage
// that saturates keeps following its input through the emitter at about a
// tenth of its gain, which is clipping to a designer.
constexpr double kPlateauFraction = 0.2;
constexpr double kClipTolerance = 0.05;  // the clip level's drive to 5 %
// 1 dB compression: the peak falls short of the prediction by 10^(-1/20).
const double kOneDbShortfall = 1.0 - std::pow(10.0, -1.0 / 20.0);
constexpr double kRailMargin = 0.02;  // of the rail voltage, at least kRailMarginVolts
constexpr double kRailMarginVolts = 0.05;
constexpr double kCutoffFraction = 0.5;   // of the bias current: turning off
constexpr double kTakeOver = 2.0;         // of the bias current: carrying the side
constexpr double kStarvedFraction = 0.1;  // of a bias diode's current: starved

enum Criterion { kPositive, kNegative, kThd, kPositive1dB, kNegative1dB, kCriteria };

bool positive_side(Criterion c) { return c == kPositive || c == kPositive1dB; }

double side_peak(bool positive, const analysis::DriveMeasurement& m) {
  return positive ? m.positive_peak : m.negative_peak;
}

// The search state: every measurement so far, sorted by amplitude.
class Search {
 public:
  Search(const analysis::SineDrive& drive, double limit, double gain, int max_runs,
         const ProgressCallback& progress)
      : drive_(drive),
        limit_(limit),
        small_signal_gain_(gain),
        max_runs_(max_runs),
        progress_(progress) {}

  const analysis::DriveMeasurement& at(double amplitude) {
    auto it = runs_.find(amplitude);
    if (it != runs_.end()) return it->second;
    if (progress_) {
      progress_("headroom: run " + std::to_string(runs_.size() + 1) + ", input amplitude " +
                text::si(amplitude, "V"));
    }
    if (static_cast<int>(runs_.size()) >= max_runs_) {
      throw NumericalError(ErrorKind::search_exhausted,
                           "the headroom search did not converge in " + std::to_string(max_runs_) +
                               " transient runs",
                           {});
    }
    const auto& m = runs_.emplace(amplitude, drive_.measure(amplitude)).first->second;
    large_signal_gain_ = std::max(large_signal_gain_, m.fundamental / amplitude);
    return m;
  }

  double value(Criterion c, const analysis::DriveMeasurement& m) const {
    const double predicted = gain() * m.amplitude;
    // Clipping is a shortfall: a peak that overshoots the prediction is
    // distortion, which the THD limit judges, not a limit of that side.
    return c == kThd ? m.thd : 1.0 - side_peak(positive_side(c), m) / predicted;
  }
  double limit(Criterion c) const {
    return c == kPositive1dB || c == kNegative1dB ? kOneDbShortfall : limit_;
  }
  bool within(Criterion c, const analysis::DriveMeasurement& m) const {
    return value(c, m) <= limit(c);
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
    double a = ok.amplitude + w * (std::log(limit(c)) - lo) / (hi - lo);
    const double keep = w < 4 * kTolerance * ok.amplitude ? 0.25 : 0.1;
    return std::clamp(a, ok.amplitude + keep * w, bad.amplitude - keep * w);
  }

  // Where a side stops growing: the first pair of neighbouring runs, above
  // the steepest pair, whose peaks rise by less than kPlateauFraction of
  // that steepest incremental gain. (Above the steepest, so that the dead
  // zone of a class-B pair, where the output has not yet started to grow,
  // is not taken for a plateau.)
  using Interval = std::pair<const analysis::DriveMeasurement*, const analysis::DriveMeasurement*>;
  std::optional<Interval> plateau(bool positive) const {
    const auto slope = [&](const auto& lo, const auto& hi) {
      return (side_peak(positive, hi) - side_peak(positive, lo)) / (hi.amplitude - lo.amplitude);
    };
    double steepest = 0;
    auto steepest_at = runs_.end();
    for (auto lo = runs_.begin(), hi = std::next(lo); hi != runs_.end(); ++lo, ++hi) {
      if (const double g = slope(lo->second, hi->second); g > steepest) {
        steepest = g;
        steepest_at = hi;
      }
    }
    if (steepest_at == runs_.end()) return std::nullopt;
    for (auto lo = std::prev(steepest_at), hi = steepest_at; hi != runs_.end(); ++lo, ++hi) {
      if (slope(lo->second, hi->second) < kPlateauFraction * steepest) {
        return Interval{&lo->second, &hi->second};
      }
    }
    return std::nullopt;
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
  int max_runs_;
  double large_signal_gain_ = 0;
  const ProgressCallback& progress_;
  std::map<double, analysis::DriveMeasurement> runs_;
};

// What stops a side, read from the devices at the waveform's extreme, in
// this order: a transistor newly in saturation; the output at a supply rail;
// a diode that conducted at the bias point carrying less than
// kStarvedFraction of that current (the network that biases the drive has run
// out of current: current_limit); unless another transistor has taken over
// (more than kTakeOver times its bias current, as in a push-pull pair at a
// large swing, where the idle half turning off is normal): a push-pull pair
// handing over (one half above its bias current while the other, still
// conducting, is below its own: crossover), then a transistor newly in
// cutoff or carrying less than kCutoffFraction of its bias current;
// otherwise smooth distortion, blamed on the transistor that carries the
// side after a take-over, else on the one whose incremental gain departs
// most from its small-signal value.
mna::OperatingPointReport devices_at(const mna::System& system, const analysis::Extreme& extreme) {
  mna::EvalRequest at = system.request(extreme.state.data());
  at.dc = false;
  at.time = extreme.time;
  mna::OperatingPointReport report;
  for (const auto& d : system.devices()) d->report(at, report);
  return report;
}

// |IC| at the peak over |IC| at the bias point.
double current_ratio(const BiasResult& bias, const BipolarOperatingPoint& q) {
  const double biased = std::abs(bias.bipolar(q.name).collector_current);
  return biased > 0 ? std::max(std::abs(q.collector_current), 1e-300) / biased : 1.0;
}

// What classify needs to know of the circuit, found once per search.
struct StageFacts {
  std::vector<analysis::Rail> rails;
  std::map<std::string, double> emitter_impedance;  // per transistor, ohm
  // Push-pull pairs: an npn and a pnp whose emitters share a node or reach
  // one node through one resistor each (emitter resistors).
  std::set<std::pair<std::string, std::string>> pairs;

  bool paired(const std::string& a, const std::string& b) const {
    return pairs.count({a, b}) > 0 || pairs.count({b, a}) > 0;
  }
};

LimitCause classify(const mna::System& system, const BiasResult& bias, const StageFacts& facts,
                    const analysis::Extreme& extreme, double output_reference) {
  const auto& rails = facts.rails;
  const auto& emitter_impedance = facts.emitter_impedance;
  const mna::OperatingPointReport report = devices_at(system, extreme);
  const auto ratio = [&](const BipolarOperatingPoint& q) { return current_ratio(bias, q); };
  // A transistor's share of its stage's gain goes as gm / (1 + gm Ze), Ze
  // the impedance its emitter sees (degeneration, or a follower's load):
  // a follower whose current swings widely keeps its gain, a common-emitter
  // stage whose current swings less does not.
  const auto gain_departure = [&](const BipolarOperatingPoint& q) {
    const auto ze = emitter_impedance.find(q.name);
    const double z = ze == emitter_impedance.end() ? 0.0 : ze->second;
    const auto share = [&](double gm) { return std::max(gm / (1 + gm * z), 1e-300); };
    return std::abs(std::log(share(q.gm) / share(bias.bipolar(q.name).gm)));
  };
  bool taken_over = false;
  for (const auto& q : report.bipolars) taken_over = taken_over || ratio(q) > kTakeOver;
  const BipolarOperatingPoint* blamed = nullptr;
  const BipolarOperatingPoint* faded = nullptr;
  double blamed_score = 0;
  for (const auto& q : report.bipolars) {
    const double score = taken_over ? ratio(q) : gain_departure(q);
    if (blamed == nullptr || score > blamed_score) {
      blamed = &q;
      blamed_score = score;
    }
    if (faded == nullptr || ratio(q) < ratio(*faded)) faded = &q;
  }
  const auto currents = [&](const BipolarOperatingPoint& q) {
    return q.name + " collector current " + text::si(std::abs(q.collector_current), "A") +
           " at the peak, " + text::si(std::abs(bias.bipolar(q.name).collector_current), "A") +
           " at the bias point";
  };
  const std::string detail = blamed == nullptr ? "" : currents(*blamed);

  for (const auto& q : report.bipolars) {
    if (q.region == Region::saturation && bias.bipolar(q.name).region != Region::saturation) {
      return {Mechanism::saturation, q.name, detail};
    }
  }
  for (const analysis::Rail& r : rails) {
    const double margin = std::max(kRailMarginVolts, kRailMargin * std::abs(r.voltage));
    if (std::abs(extreme.value + output_reference - r.voltage) < margin) {
      return {Mechanism::rail, r.source, detail};
    }
  }
  for (const auto& d : report.diodes) {
    const double biased = bias.diode(d.name).current;
    if (biased > 0 && d.current < kStarvedFraction * biased) {
      return {Mechanism::current_limit, d.name,
              d.name + " carries " + text::si(d.current, "A") + " at the peak, " +
                  text::si(biased, "A") + " at the bias point"};
    }
  }
  if (!taken_over) {
    for (const auto& fading : report.bipolars) {
      if (fading.region == Region::cutoff || ratio(fading) >= 1) continue;
      for (const auto& rising : report.bipolars) {
        if (ratio(rising) > 1 && facts.paired(fading.name, rising.name)) {
          return {Mechanism::crossover, fading.name, currents(fading) + "; " + currents(rising)};
        }
      }
    }
    for (const auto& q : report.bipolars) {
      if (q.region == Region::cutoff && bias.bipolar(q.name).region != Region::cutoff) {
        return {Mechanism::cutoff, q.name, currents(q)};
      }
    }
    if (faded != nullptr && ratio(*faded) < kCutoffFraction) {
      return {Mechanism::cutoff, faded->name, currents(*faded)};
    }
  }
  if (blamed != nullptr && !taken_over) {
    return {Mechanism::distortion, blamed->name,
            detail + "; its incremental gain " + text::percent(std::expm1(blamed_score)) +
                " away from its small-signal value"};
  }
  return {Mechanism::distortion, blamed == nullptr ? "" : blamed->name, detail};
}

// The transistor carrying the output at an extreme: the one whose current
// rose furthest above its bias.
std::optional<BipolarOperatingPoint> carrier(const mna::System& system, const BiasResult& bias,
                                             const analysis::Extreme& extreme) {
  std::optional<BipolarOperatingPoint> best;
  for (const auto& q : devices_at(system, extreme).bipolars) {
    if (!best || current_ratio(bias, q) > current_ratio(bias, *best)) best = q;
  }
  return best;
}

StageFacts stage_facts(const Circuit& circuit, const SolverOptions& solver,
                       const std::string& input, double frequency) {
  StageFacts facts;
  facts.rails = analysis::supply_rails(circuit, input);
  // Nodes one resistor away from each node, for emitter resistors.
  std::multimap<std::string, std::string> through_resistor;
  for (const Element& e : circuit.elements()) {
    if (const auto* r = std::get_if<Resistor>(&e.data)) {
      through_resistor.emplace(r->a, r->b);
      through_resistor.emplace(r->b, r->a);
    }
  }
  const auto share_output = [&](const std::string& a, const std::string& b) {
    if (a == b) return true;
    for (auto [from_a, end_a] = through_resistor.equal_range(a); from_a != end_a; ++from_a) {
      for (auto [from_b, end_b] = through_resistor.equal_range(b); from_b != end_b; ++from_b) {
        if (from_a->second == from_b->second) return true;
      }
    }
    return false;
  };
  for (const Element& e : circuit.elements()) {
    const auto* q = std::get_if<Bipolar>(&e.data);
    if (q == nullptr) continue;
    // The impedance its emitter sees with it taken out (zero where it is
    // grounded or taking it out floats a node).
    try {
      facts.emitter_impedance[e.name] =
          analysis::impedance_without(circuit, solver, e.name, q->emitter, kGround, frequency)
              .value_or(0.0);
    } catch (const NumericalError&) {
      facts.emitter_impedance[e.name] = 0;
    }
    for (const Element& other : circuit.elements()) {
      const auto* p = std::get_if<Bipolar>(&other.data);
      if (p != nullptr && q->polarity == Polarity::npn && p->polarity == Polarity::pnp &&
          share_output(q->emitter, p->emitter)) {
        facts.pairs.emplace(e.name, other.name);
      }
    }
  }
  return facts;
}

// The largest input amplitude a driver on the circuit's rails can deliver:
// half the span between the lowest and the highest rail (ground counts as
// one). An ideal voltage source driven past the rails only forces junctions
// into them; a current input has no such bound.
std::optional<double> rail_drive_bound(const Circuit& circuit,
                                       const std::vector<analysis::Rail>& rails,
                                       const std::string& input) {
  const Element* e = circuit.find(input);
  if (e == nullptr || !std::holds_alternative<VoltageSource>(e->data)) return std::nullopt;
  double lowest = 0, highest = 0;
  for (const analysis::Rail& r : rails) {
    lowest = std::min(lowest, r.voltage);
    highest = std::max(highest, r.voltage);
  }
  if (!(highest > lowest)) return std::nullopt;
  return 0.5 * (highest - lowest);
}

}  // namespace

HeadroomResult run_headroom(const Circuit& circuit, const HeadroomOptions& options,
                            const SolverOptions& solver, const ProgressCallback& progress) {
  if (auto p = validate(circuit, options)) {
    throw Error(ErrorKind::invalid_request, p->message, {p->subject});
  }
  const analysis::SineDrive drive(analysis::with_only_ac_input(circuit, options.input), solver,
                                  options.input, options.output, options.frequency);
  return analysis::headroom_search(circuit, drive, options, progress);
}

namespace analysis {

HeadroomResult headroom_search(const Circuit& circuit, const SineDrive& drive,
                               const HeadroomOptions& options, const ProgressCallback& progress) {
  HeadroomResult result;
  result.options = options;
  result.output = options.output.label();
  result.bias = drive.simulation().bias();
  const auto node = [&](const std::string& name) {
    return name == kGround || name.empty() ? 0.0 : result.bias.voltage(name);
  };
  result.bias_output =
      node(options.output.a) -
      (options.output.kind == SignalRef::Kind::node_pair ? node(options.output.b) : 0.0);
  result.small_signal_gain = analysis::small_signal_gain(drive.simulation(), options.input,
                                                         options.output, options.frequency);
  Search search(drive, options.distortion_limit, result.small_signal_gain, options.max_runs,
                progress);

  const SolverOptions& solver = drive.simulation().solver();
  const StageFacts facts = stage_facts(circuit, solver, options.input, options.frequency);
  const auto& rails = facts.rails;
  double largest_rail = 1.0;
  for (const analysis::Rail& r : rails) largest_rail = std::max(largest_rail, std::abs(r.voltage));
  const std::optional<double> rail_bound = rail_drive_bound(circuit, rails, options.input);
  // A drive whose prediction is half as large again as the largest rail has
  // clipped; beyond that an ideal source only forces junctions into the
  // rails. Nor may it exceed what a driver on the rails can deliver.
  const auto largest_amplitude = [&] {
    return std::min(1.5 * largest_rail / search.gain(),
                    rail_bound.value_or(std::numeric_limits<double>::infinity()));
  };

  // Bracket: down while the first amplitude is already past a limit, then up
  // by doubling until every limit has been crossed and both sides have
  // stopped growing, or the drive reaches its bound.
  // The first drive aims at a small output swing, and never beyond a twentieth
  // of the largest rail (a stage biased off predicts no output at all).
  double amplitude = std::min(options.first_input_amplitude.value_or(std::min(
                                  kFirstOutputSwing / result.small_signal_gain, largest_rail / 20)),
                              largest_amplitude());
  for (int k = 0; k < kMaxDownSteps; ++k) {
    const auto& m = search.at(amplitude);
    if (search.within(kPositive, m) && search.within(kNegative, m) && search.within(kThd, m)) break;
    amplitude /= 2;
  }
  const auto done = [&] {
    return search.all_bracketed() && search.plateau(true) && search.plateau(false);
  };
  for (amplitude = search.runs().rbegin()->first * 2;
       !done() && amplitude / 2 < largest_amplitude(); amplitude *= 2) {
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
  for (const bool positive : {true, false}) {
    for (;;) {
      const auto flat = search.plateau(positive);
      if (!flat || flat->second->amplitude - flat->first->amplitude <=
                       kClipTolerance * flat->first->amplitude) {
        break;
      }
      search.at(std::sqrt(flat->first->amplitude * flat->second->amplitude));
    }
  }

  const mna::System& system = SimulationAccess::system(drive.simulation());
  const double reference =
      options.output.kind == SignalRef::Kind::node_pair ? node(options.output.b) : 0.0;
  const auto& largest = search.runs().rbegin()->second;
  result.largest_drive_allowed = largest_amplitude();
  auto side = [&](Criterion c, Criterion compression) {
    const bool positive = positive_side(c);
    const char* name = positive ? "positive" : "negative";
    auto cause_in = [&](const analysis::DriveMeasurement& m) {
      return classify(system, result.bias, facts, positive ? m.maximum : m.minimum, reference);
    };
    SideLimit s;
    if (const auto flat = search.plateau(positive)) {
      s.clip = {side_peak(positive, *flat->second), flat->second->amplitude,
                cause_in(*flat->second), true};
    } else {
      s.clip = {side_peak(positive, largest),
                largest.amplitude,
                {Mechanism::drive_limit, options.input,
                 "still growing at " + text::si(largest.amplitude, "V") +
                     " of drive, the largest allowed"},
                false};
      result.notes.push_back(
          std::string(name) + " side: still growing at the largest drive allowed (" +
          text::si(largest.amplitude, "V") +
          (rail_bound && largest.amplitude >= *rail_bound * (1 - 1e-9)
               ? ", what a driver on these rails can deliver: half the span between the lowest "
                 "and highest rail"
               : ", where the prediction is 1.5 times the largest rail") +
          "); its clip level is its peak there");
    }
    const analysis::DriveMeasurement& clipped = search.runs().at(s.clip.input_amplitude);
    if (!clipped.settled) {
      result.notes.push_back(std::string(name) + " side: its clip level is approximate: at " +
                             text::si(clipped.amplitude, "V") + " of drive, after " +
                             std::to_string(clipped.periods) + " periods, " + clipped.unsettled);
    }
    if (const auto [ok, bad] = search.bracket(compression); ok != nullptr && bad != nullptr) {
      s.compression_1dB_peak = side_peak(positive, *ok);
      s.compression_1dB_input_amplitude = ok->amplitude;
    }
    const auto [ok, bad] = search.bracket(c);
    if (ok == nullptr) {
      s.cause = {Mechanism::distortion, "", ""};
      result.notes.push_back(std::string(name) +
                             " side: beyond the limit at every amplitude tried");
      return s;
    }
    s.peak = side_peak(positive, *ok);
    s.input_amplitude = ok->amplitude;
    s.shortfall = search.value(c, *ok);
    s.found = bad != nullptr;
    s.cause = cause_in(bad != nullptr ? *bad : *ok);
    if (bad != nullptr && largest.amplitude > bad->amplitude) {
      s.at_largest_drive = cause_in(largest);
      s.largest_drive = largest.amplitude;
    }
    return s;
  };
  result.positive = side(kPositive, kPositive1dB);
  result.negative = side(kNegative, kNegative1dB);
  const SideLimit& clips_first =
      result.positive.clip.peak <= result.negative.clip.peak ? result.positive : result.negative;
  result.symmetric_clip_peak = clips_first.clip.peak;
  result.symmetric_clip_input_amplitude = clips_first.clip.input_amplitude;
  double symmetric = std::min(result.positive.peak, result.negative.peak);
  const auto [thd_ok, thd_bad] = search.bracket(kThd);
  if (thd_ok != nullptr && thd_bad != nullptr) {
    result.thd_limit_input_amplitude = thd_ok->amplitude;
    result.thd_limit_output_amplitude = thd_ok->fundamental;
    symmetric = std::min(symmetric, thd_ok->fundamental);
  } else if (thd_ok == nullptr) {
    symmetric = 0;
  }
  // What makes the THD pass the limit, read at the first run past it (the
  // smallest drive, when the THD is past it from the start).
  const analysis::DriveMeasurement* past =
      thd_ok == nullptr ? &search.runs().begin()->second : thd_bad;
  if (past != nullptr) {
    // A complementary pair biased off hands the output from one half to the
    // other through a dead zone each period: its distortion is crossover.
    // Which halves carry is read at the largest drive, where the currents
    // stand clear of the leakage. Otherwise the THD is blamed like the side
    // that falls shorter.
    const auto up = carrier(system, result.bias, largest.maximum);
    const auto down = carrier(system, result.bias, largest.minimum);
    if (search.judged_large_signal() && up && down && facts.paired(up->name, down->name)) {
      result.thd_limit_cause = {
          Mechanism::crossover, up->name + " and " + down->name,
          up->name + " carries the positive half, " + down->name + " the negative"};
    } else {
      const bool positive = search.value(kPositive, *past) >= search.value(kNegative, *past);
      result.thd_limit_cause =
          classify(system, result.bias, facts, positive ? past->maximum : past->minimum, reference);
    }
  }
  result.symmetric_peak_to_peak = 2 * symmetric;
  result.transient_runs = drive.runs();
  result.counters = drive.simulation().counters();
  result.load_line = estimate_load_line(circuit, result.bias, options.frequency, solver);
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
