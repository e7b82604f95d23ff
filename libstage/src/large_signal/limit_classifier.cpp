// The limit classifier (see limit_classifier.hpp): the devices' operating
// points at an extreme of the output, read against the bias point and the
// facts of the circuit found once (rails, emitter impedances, pairs).
#include "large_signal/limit_classifier.hpp"

#include <algorithm>
#include <cmath>
#include <variant>

#include "common/si_format.hpp"
#include "mna/system.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

constexpr double kRailMargin = 0.02;  // of the rail voltage, at least kRailMarginVolts
constexpr double kRailMarginVolts = 0.05;
constexpr double kCutoffFraction = 0.5;   // of the bias current: turning off
constexpr double kTakeOver = 2.0;         // of the bias current: carrying the side
constexpr double kStarvedFraction = 0.1;  // of a bias diode's current: starved
// Keeps a current ratio, and the logarithm of a gain share, finite where a
// transistor's current or gm is zero.
constexpr double kPositiveFloor = 1e-300;

// Every device's operating point at the extreme (the state there, as a
// transient point: not a DC evaluation).
mna::OperatingPointReport devices_at(const mna::System& system, const Extreme& extreme) {
  mna::EvalRequest at = system.request(extreme.state.data());
  at.dc = false;
  at.time = extreme.time;
  mna::OperatingPointReport report;
  for (const auto& d : system.devices()) d->report(at, report);
  return report;
}

std::optional<LimitCause> newly_saturated(const mna::OperatingPointReport& report,
                                          const BiasResult& bias, const std::string& detail) {
  for (const auto& q : report.bipolars) {
    if (q.region == Region::saturation && bias.bipolar(q.name).region != Region::saturation) {
      return LimitCause{Mechanism::saturation, q.name, detail};
    }
  }
  return std::nullopt;
}

// A diode that conducted at the bias point, starved: the network biasing
// the drive has run out of current.
std::optional<LimitCause> starved_diode(const mna::OperatingPointReport& report,
                                        const BiasResult& bias) {
  for (const auto& d : report.diodes) {
    const double biased = bias.diode(d.name).current;
    if (biased > 0 && d.current < kStarvedFraction * biased) {
      return LimitCause{Mechanism::current_limit, d.name,
                        d.name + " carries " + text::si(d.current, "A") + " at the peak, " +
                            text::si(biased, "A") + " at the bias point"};
    }
  }
  return std::nullopt;
}

// The impedance each bipolar's emitter sees with that transistor taken out
// (zero where it is grounded or taking it out floats a node).
std::map<std::string, double> emitter_impedances(const Circuit& circuit, double frequency) {
  std::map<std::string, double> impedance;
  for (const Element& e : circuit.elements()) {
    const auto* q = std::get_if<Bipolar>(&e.data);
    if (q == nullptr) continue;
    try {
      impedance[e.name] =
          impedance_without(circuit, e.name, q->emitter, kGround, frequency).value_or(0.0);
    } catch (const NumericalError&) {
      impedance[e.name] = 0;
    }
  }
  return impedance;
}

// Every (npn, pnp) whose emitters share a node or reach one node through
// one resistor each.
std::set<std::pair<std::string, std::string>> complementary_pairs(const Circuit& circuit) {
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
  std::set<std::pair<std::string, std::string>> pairs;
  for (const Element& e : circuit.elements()) {
    const auto* q = std::get_if<Bipolar>(&e.data);
    if (q == nullptr || q->polarity != Polarity::npn) continue;
    for (const Element& other : circuit.elements()) {
      const auto* p = std::get_if<Bipolar>(&other.data);
      if (p != nullptr && p->polarity == Polarity::pnp && share_output(q->emitter, p->emitter)) {
        pairs.emplace(e.name, other.name);
      }
    }
  }
  return pairs;
}

}  // namespace

// The transistors the rules single out at one extreme.
struct LimitClassifier::Suspects {
  // Some transistor carries more than kTakeOver times its bias current.
  bool taken_over = false;
  // The one carrying the side (taken over), else the one whose gain departs
  // most from its small-signal value; its score is that ratio or departure.
  const BipolarOperatingPoint* blamed = nullptr;
  double blamed_score = 0;
  const BipolarOperatingPoint* faded = nullptr;  // the lowest current against its bias
};

LimitClassifier::LimitClassifier(const Circuit& circuit, const mna::System& system,
                                 const BiasResult& bias, const std::string& input, double frequency,
                                 double output_reference)
    : system_(system),
      bias_(bias),
      output_reference_(output_reference),
      rails_(supply_rails(circuit, input)),
      emitter_impedance_(emitter_impedances(circuit, frequency)),
      pairs_(complementary_pairs(circuit)) {}

LimitCause LimitClassifier::classify(const Extreme& extreme) const {
  const mna::OperatingPointReport report = devices_at(system_, extreme);
  const Suspects s = suspects(report);
  const std::string detail = s.blamed == nullptr ? "" : currents(*s.blamed);
  if (auto cause = newly_saturated(report, bias_, detail)) return *cause;
  if (auto cause = at_rail(extreme, detail)) return *cause;
  if (auto cause = starved_diode(report, bias_)) return *cause;
  if (!s.taken_over) {
    if (auto cause = turning_off(report, s)) return *cause;
    if (s.blamed != nullptr) {
      return {Mechanism::distortion, s.blamed->name,
              detail + "; its incremental gain " + text::percent(std::expm1(s.blamed_score)) +
                  " away from its small-signal value"};
    }
  }
  return {Mechanism::distortion, s.blamed == nullptr ? "" : s.blamed->name, detail};
}

std::optional<LimitCause> LimitClassifier::pair_handing_over(const Extreme& maximum,
                                                             const Extreme& minimum) const {
  // The transistor carrying the output at an extreme: the one whose current
  // rose furthest above its bias.
  const auto carrier = [&](const Extreme& extreme) {
    std::optional<BipolarOperatingPoint> best;
    for (const auto& q : devices_at(system_, extreme).bipolars) {
      if (!best || current_ratio(q) > current_ratio(*best)) best = q;
    }
    return best;
  };
  const auto up = carrier(maximum);
  const auto down = carrier(minimum);
  if (!up || !down || !paired(up->name, down->name)) return std::nullopt;
  return LimitCause{Mechanism::crossover, up->name + " and " + down->name,
                    up->name + " carries the positive half, " + down->name + " the negative"};
}

bool LimitClassifier::paired(const std::string& a, const std::string& b) const {
  return pairs_.count({a, b}) > 0 || pairs_.count({b, a}) > 0;
}

LimitClassifier::Suspects LimitClassifier::suspects(const mna::OperatingPointReport& report) const {
  Suspects s;
  for (const auto& q : report.bipolars) s.taken_over = s.taken_over || current_ratio(q) > kTakeOver;
  for (const auto& q : report.bipolars) {
    const double score = s.taken_over ? current_ratio(q) : gain_departure(q);
    if (s.blamed == nullptr || score > s.blamed_score) {
      s.blamed = &q;
      s.blamed_score = score;
    }
    if (s.faded == nullptr || current_ratio(q) < current_ratio(*s.faded)) s.faded = &q;
  }
  return s;
}

std::optional<LimitCause> LimitClassifier::at_rail(const Extreme& extreme,
                                                   const std::string& detail) const {
  for (const Rail& r : rails_) {
    const double margin = std::max(kRailMarginVolts, kRailMargin * std::abs(r.voltage));
    if (std::abs(extreme.value + output_reference_ - r.voltage) < margin) {
      return LimitCause{Mechanism::rail, r.source, detail};
    }
  }
  return std::nullopt;
}

// With no transistor taken over: a pair handing over, then a transistor
// newly cut off, then the one whose current fell furthest.
std::optional<LimitCause> LimitClassifier::turning_off(const mna::OperatingPointReport& report,
                                                       const Suspects& s) const {
  for (const auto& fading : report.bipolars) {
    if (fading.region == Region::cutoff || current_ratio(fading) >= 1) continue;
    for (const auto& rising : report.bipolars) {
      if (current_ratio(rising) > 1 && paired(fading.name, rising.name)) {
        return LimitCause{Mechanism::crossover, fading.name,
                          currents(fading) + "; " + currents(rising)};
      }
    }
  }
  for (const auto& q : report.bipolars) {
    if (q.region == Region::cutoff && bias_.bipolar(q.name).region != Region::cutoff) {
      return LimitCause{Mechanism::cutoff, q.name, currents(q)};
    }
  }
  if (s.faded != nullptr && current_ratio(*s.faded) < kCutoffFraction) {
    return LimitCause{Mechanism::cutoff, s.faded->name, currents(*s.faded)};
  }
  return std::nullopt;
}

std::string LimitClassifier::currents(const BipolarOperatingPoint& q) const {
  return q.name + " collector current " + text::si(std::abs(q.collector_current), "A") +
         " at the peak, " + text::si(std::abs(bias_.bipolar(q.name).collector_current), "A") +
         " at the bias point";
}

// |IC| at the peak over |IC| at the bias point.
double LimitClassifier::current_ratio(const BipolarOperatingPoint& q) const {
  const double biased = std::abs(bias_.bipolar(q.name).collector_current);
  return biased > 0 ? std::max(std::abs(q.collector_current), kPositiveFloor) / biased : 1.0;
}

// A transistor's share of its stage's gain goes as gm / (1 + gm Ze), Ze the
// impedance its emitter sees (degeneration, or a follower's load): a
// follower whose current swings widely keeps its gain, a common-emitter
// stage whose current swings less does not. |log| of that share at the peak
// over its share at the bias point.
double LimitClassifier::gain_departure(const BipolarOperatingPoint& q) const {
  const auto ze = emitter_impedance_.find(q.name);
  const double z = ze == emitter_impedance_.end() ? 0.0 : ze->second;
  const auto share = [&](double gm) { return std::max(gm / (1 + gm * z), kPositiveFloor); };
  return std::abs(std::log(share(q.gm) / share(bias_.bipolar(q.name).gm)));
}

}  // namespace stage::analysis
