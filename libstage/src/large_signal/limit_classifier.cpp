// The limit classifier (see limit_classifier.hpp): the devices' operating
// points at an extreme of the output, read against the bias point and the
// facts of the circuit found once (rails, emitter impedances, pairs). It
// reads every device through mna::Conduction and every element through its
// kind's descriptor, so a new transistor kind is classified without a change
// here.
#include "large_signal/limit_classifier.hpp"

#include <algorithm>
#include <cmath>
#include <variant>

#include "circuit/element_kinds.hpp"
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

// Every device's conduction at a solution, by device name.
Readings readings_at(const mna::System& system, const mna::EvalRequest& at) {
  Readings readings;
  for (const auto& d : system.devices()) {
    if (auto c = d->conduction(at)) readings.push_back({d->name(), *c});
  }
  return readings;
}

// At an extreme: the state there, as a transient point (not a DC evaluation).
Readings readings_at(const mna::System& system, const Extreme& extreme) {
  mna::EvalRequest at = system.request(extreme.state.data());
  at.dc = false;
  at.time = extreme.time;
  return readings_at(system, at);
}

// The impedance each transistor's common terminal (emitter) sees with that
// transistor taken out (zero where it is grounded or taking it out floats a
// node).
std::map<std::string, double> common_impedances(const Circuit& circuit, const SolverOptions& solver,
                                                double frequency) {
  std::map<std::string, double> impedance;
  for (const Element& e : circuit.elements()) {
    const auto amplifier = kinds::amplifier(e.data);
    if (!amplifier) continue;
    try {
      impedance[e.name] =
          impedance_without(circuit, solver, e.name, amplifier->common_node, kGround, frequency)
              .value_or(0.0);
    } catch (const NumericalError&) {
      impedance[e.name] = 0;
    }
  }
  return impedance;
}

// Every (n type, p type) pair of transistors whose common terminals
// (emitters) share a node or reach one node through one resistor each.
std::set<std::pair<std::string, std::string>> complementary_pairs(const Circuit& circuit) {
  // Nodes one resistor away from each node, for emitter resistors.
  std::multimap<std::string, std::string> through_resistor;
  for (const Element& e : circuit.elements()) {
    if (std::holds_alternative<Resistor>(e.data)) {
      const auto ends = kinds::nodes(e.data);
      through_resistor.emplace(ends[0], ends[1]);
      through_resistor.emplace(ends[1], ends[0]);
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
    const auto n = kinds::amplifier(e.data);
    if (!n || n->polarity != 1) continue;
    for (const Element& other : circuit.elements()) {
      const auto p = kinds::amplifier(other.data);
      if (p && p->polarity == -1 && share_output(n->common_node, p->common_node)) {
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
  const Reading* blamed = nullptr;
  double blamed_score = 0;
  const Reading* faded = nullptr;  // the lowest current against its bias
};

LimitClassifier::LimitClassifier(const Circuit& circuit, const SolverOptions& solver,
                                 const mna::System& system, const std::vector<double>& bias_point,
                                 const std::string& input, double frequency,
                                 double output_reference)
    : system_(system),
      output_reference_(output_reference),
      rails_(supply_rails(circuit, input)),
      common_impedance_(common_impedances(circuit, solver, frequency)),
      pairs_(complementary_pairs(circuit)) {
  for (const Reading& r : readings_at(system, system.request(bias_point.data()))) {
    at_bias_.emplace(r.name, r.at);
  }
  for (const Element& e : circuit.elements()) {
    if (const auto amplifier = kinds::amplifier(e.data)) {
      main_terminal_.emplace(e.name, amplifier->main_terminal);
    }
  }
}

LimitCause LimitClassifier::classify(const Extreme& extreme) const {
  const Readings readings = readings_at(system_, extreme);
  const Suspects s = suspects(readings);
  const std::string detail = s.blamed == nullptr ? "" : currents(*s.blamed);
  if (auto cause = newly_saturated(readings, detail)) return *cause;
  if (auto cause = at_rail(extreme, detail)) return *cause;
  if (auto cause = starved(readings)) return *cause;
  if (!s.taken_over) {
    if (auto cause = turning_off(readings, s)) return *cause;
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
    std::optional<Reading> best;
    for (const Reading& r : readings_at(system_, extreme)) {
      if (r.at.amplifies && (!best || current_ratio(r) > current_ratio(*best))) best = r;
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

const mna::Conduction& LimitClassifier::biased(const Reading& r) const {
  return at_bias_.at(r.name);
}

LimitClassifier::Suspects LimitClassifier::suspects(const Readings& readings) const {
  Suspects s;
  for (const Reading& r : readings) {
    s.taken_over = s.taken_over || (r.at.amplifies && current_ratio(r) > kTakeOver);
  }
  for (const Reading& r : readings) {
    if (!r.at.amplifies) continue;
    const double score = s.taken_over ? current_ratio(r) : gain_departure(r);
    if (s.blamed == nullptr || score > s.blamed_score) {
      s.blamed = &r;
      s.blamed_score = score;
    }
    if (s.faded == nullptr || current_ratio(r) < current_ratio(*s.faded)) s.faded = &r;
  }
  return s;
}

std::optional<LimitCause> LimitClassifier::newly_saturated(const Readings& readings,
                                                           const std::string& detail) const {
  for (const Reading& r : readings) {
    if (r.at.state == mna::Conduction::State::saturated &&
        biased(r).state != mna::Conduction::State::saturated) {
      return LimitCause{Mechanism::saturation, r.name, detail};
    }
  }
  return std::nullopt;
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

// A steering device (a bias diode) that conducted at the bias point, starved:
// the network biasing the drive has run out of current.
std::optional<LimitCause> LimitClassifier::starved(const Readings& readings) const {
  for (const Reading& r : readings) {
    if (r.at.amplifies) continue;
    const double bias_current = biased(r).current;
    if (bias_current > 0 && r.at.current < kStarvedFraction * bias_current) {
      return LimitCause{Mechanism::current_limit, r.name,
                        r.name + " carries " + text::si(r.at.current, "A") + " at the peak, " +
                            text::si(bias_current, "A") + " at the bias point"};
    }
  }
  return std::nullopt;
}

// With no transistor taken over: a pair handing over, then a transistor
// newly cut off, then the one whose current fell furthest.
std::optional<LimitCause> LimitClassifier::turning_off(const Readings& readings,
                                                       const Suspects& s) const {
  using State = mna::Conduction::State;
  for (const Reading& fading : readings) {
    if (!fading.at.amplifies || fading.at.state == State::cut_off || current_ratio(fading) >= 1) {
      continue;
    }
    for (const Reading& rising : readings) {
      if (rising.at.amplifies && current_ratio(rising) > 1 && paired(fading.name, rising.name)) {
        return LimitCause{Mechanism::crossover, fading.name,
                          currents(fading) + "; " + currents(rising)};
      }
    }
  }
  for (const Reading& r : readings) {
    if (r.at.amplifies && r.at.state == State::cut_off && biased(r).state != State::cut_off) {
      return LimitCause{Mechanism::cutoff, r.name, currents(r)};
    }
  }
  if (s.faded != nullptr && current_ratio(*s.faded) < kCutoffFraction) {
    return LimitCause{Mechanism::cutoff, s.faded->name, currents(*s.faded)};
  }
  return std::nullopt;
}

// "q1 collector current 12 mA at the peak, 40 mA at the bias point".
std::string LimitClassifier::currents(const Reading& r) const {
  return r.name + " " + std::string(main_terminal_.at(r.name)) + " current " +
         text::si(std::abs(r.at.current), "A") + " at the peak, " +
         text::si(std::abs(biased(r).current), "A") + " at the bias point";
}

// |I| at the peak over |I| at the bias point, of the main current.
double LimitClassifier::current_ratio(const Reading& r) const {
  const double bias_current = std::abs(biased(r).current);
  return bias_current > 0 ? std::max(std::abs(r.at.current), kPositiveFloor) / bias_current : 1.0;
}

// A transistor's share of its stage's gain goes as gm / (1 + gm Ze), Ze the
// impedance its emitter sees (degeneration, or a follower's load): a
// follower whose current swings widely keeps its gain, a common-emitter
// stage whose current swings less does not. |log| of that share at the peak
// over its share at the bias point.
double LimitClassifier::gain_departure(const Reading& r) const {
  const auto ze = common_impedance_.find(r.name);
  const double z = ze == common_impedance_.end() ? 0.0 : ze->second;
  const auto share = [&](double gm) { return std::max(gm / (1 + gm * z), kPositiveFloor); };
  return std::abs(std::log(share(r.at.transconductance) / share(biased(r).transconductance)));
}

}  // namespace stage::analysis
