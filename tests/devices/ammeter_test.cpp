// Current-controlled sources sensing an element with no branch current of
// its own (a resistor, a capacitor, a transistor terminal) through the
// ammeter the assembly puts in series with it, against hand analysis and
// exact solutions, and against the old zero-volt source in series.
#include "devices/ammeter.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>

#include "derivative_check.hpp"
#include "stage/bias.hpp"
#include "stage/transient.hpp"
#include "stage/validate.hpp"

namespace {

using stage::Circuit;
using stage::CurrentControlledCurrentSource;
using stage::CurrentControlledVoltageSource;
using stage::Resistor;
using stage::VoltageSource;

// 5 V across r1 = 1 kΩ: 5 mA through it from `in` to gnd (Ohm's law). f1
// mirrors it twice into a 1 kΩ load, h1 turns it into volts at 100 Ω.
// With `old_style`, r1 hangs below a zero-volt source that f1 and h1 sense.
Circuit mirror_of_resistor(bool old_style) {
  Circuit c;
  c.add("v1", VoltageSource{"in", "gnd", 5.0});
  if (old_style) {
    // It delivers out of p: the current from `in` down through r1.
    c.add("vs", VoltageSource{"mid", "in", 0.0});
    c.add("r1", Resistor{"mid", "gnd", 1e3});
  } else {
    c.add("r1", Resistor{"in", "gnd", 1e3});
  }
  const std::string sensed = old_style ? "vs" : "r1";
  c.add("f1", CurrentControlledCurrentSource{"gnd", "out", sensed, 2.0});
  c.add("rl", Resistor{"out", "gnd", 1e3});
  c.add("h1", CurrentControlledVoltageSource{"volts", "gnd", sensed, 100.0});
  c.add("rh", Resistor{"volts", "gnd", 1e3});
  return c;
}

// A linear circuit solves in one Newton step; what is left is rounding in
// the sparse LU, well under 1e-12 of the values here.
constexpr double kRounding = 1e-12;

TEST(SensedResistor, MirrorsItsOhmsLawCurrent) {
  const stage::BiasResult bias = stage::run_bias(mirror_of_resistor(false));
  // i(r1) = 5 V / 1 kΩ = 5 mA; f1 drives 2 · 5 mA into out across 1 kΩ: 10 V.
  EXPECT_NEAR(bias.current("r1"), 5e-3, 5e-3 * kRounding);
  EXPECT_NEAR(bias.voltage("out"), 10.0, 10.0 * kRounding);
  // h1 holds 100 Ω · 5 mA = 0.5 V.
  EXPECT_NEAR(bias.voltage("volts"), 0.5, 0.5 * kRounding);
}

TEST(SensedResistor, TheAmmeterShowsNowhereInTheResults) {
  const stage::BiasResult bias = stage::run_bias(mirror_of_resistor(false));
  std::vector<std::string> nodes, currents, supplies;
  for (const auto& [name, v] : bias.node_voltages) nodes.push_back(name);
  for (const auto& [name, i] : bias.element_currents) currents.push_back(name);
  for (const auto& s : bias.supplies) supplies.push_back(s.name);
  std::sort(nodes.begin(), nodes.end());
  std::sort(currents.begin(), currents.end());
  EXPECT_EQ(nodes, (std::vector<std::string>{"in", "out", "volts"}));
  EXPECT_EQ(currents, (std::vector<std::string>{"f1.current", "h1.current", "r1.current",
                                                "rh.current", "rl.current", "v1.current"}));
  EXPECT_EQ(supplies, std::vector<std::string>{"v1"});
}

TEST(SensedResistor, SameNumbersAsAZeroVoltSourceInSeries) {
  const stage::BiasResult now = stage::run_bias(mirror_of_resistor(false));
  const stage::BiasResult old = stage::run_bias(mirror_of_resistor(true));
  for (const std::string node : {"in", "out", "volts"}) {
    EXPECT_NEAR(now.voltage(node), old.voltage(node), 10.0 * kRounding) << node;
  }
  for (const std::string element : {"v1", "r1", "f1", "h1", "rl"}) {
    EXPECT_NEAR(now.current(element), old.current(element), 10e-3 * kRounding) << element;
  }
}

// A ramp of 1 V/ms across c1 = 1 µF: i = C dv/dt = 1 mA, exactly, from the
// first instant on (the exact solution of i = C dv/dt). Each integration
// formula starts with backward Euler and differentiates a straight line
// without error, so every sample after t = 0 carries 1 mA; f1 mirrors it
// into 1 kΩ: 1 V.
TEST(SensedCapacitor, RampCurrentIsCTimesTheSlope) {
  Circuit c;
  c.add("v1",
        VoltageSource{"in", "gnd", 0.0, 0.0, 0.0, stage::PiecewiseWave{{{0.0, 0.0}, {1e-3, 1.0}}}});
  c.add("c1", stage::Capacitor{"in", "gnd", 1e-6});
  c.add("f1", CurrentControlledCurrentSource{"gnd", "out", "c1", 1.0});
  c.add("rl", Resistor{"out", "gnd", 1e3});
  stage::TransientOptions options;
  options.stop = 1e-3;
  for (const auto method :
       {stage::Integration::tr_bdf2, stage::Integration::trapezoidal, stage::Integration::bdf2}) {
    stage::SolverOptions solver;
    solver.integration = method;
    const stage::TransientResult r = stage::run_transient(c, options, solver);
    const auto& out = r.signal("out");
    ASSERT_GT(r.time.size(), 2u);
    for (std::size_t k = 1; k < r.time.size(); ++k) {
      EXPECT_NEAR(out[k], 1.0, 1e-9) << "t = " << r.time[k];
    }
    // The capacitor's voltage is the source's, ammeter or not.
    EXPECT_NEAR(r.signal("in").back(), 1.0, 1e-9);
  }
}

// A common-emitter stage biased by a base resistor (generic default npn).
Circuit common_emitter() {
  Circuit c;
  c.add_model("m", stage::BipolarModel{});
  c.add("vcc", VoltageSource{"vcc", "gnd", 12.0});
  c.add("rb", Resistor{"vcc", "b", 1e6});
  c.add("rc", Resistor{"vcc", "c", 4.7e3});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "c", "b", "gnd", {}, "m"});
  return c;
}

// Tight enough that two solutions of the same stage agree far below any
// figure a report prints.
stage::SolverOptions tight() {
  stage::SolverOptions s;
  s.relative_tolerance = 1e-10;
  s.voltage_tolerance = 1e-12;
  s.current_tolerance = 1e-15;
  return s;
}

TEST(SensedTransistor, TerminalCurrentsAreTheOperatingPointsOwn) {
  Circuit c = common_emitter();
  for (const std::string terminal : {"collector", "base", "emitter"}) {
    c.add("f_" + terminal, CurrentControlledCurrentSource{"gnd", terminal, "q1." + terminal, 1.0});
    c.add("r_" + terminal, Resistor{terminal, "gnd", 1e3});
  }
  const stage::BiasResult bias = stage::run_bias(c, tight());
  const stage::BipolarOperatingPoint& q = bias.bipolar("q1");
  // The current into the device at each terminal (the record's convention),
  // into 1 kΩ: v = 1 kΩ · i, by Ohm's law.
  EXPECT_GT(q.collector_current, 1e-4);  // the stage is on
  EXPECT_NEAR(bias.voltage("collector") / 1e3, q.collector_current, 1e-9 * q.collector_current);
  EXPECT_NEAR(bias.voltage("base") / 1e3, q.base_current, 1e-9 * q.base_current);
  EXPECT_NEAR(bias.voltage("emitter") / 1e3, q.emitter_current, 1e-9 * q.collector_current);

  // The stage's own figures are those it has with nothing sensing it.
  const stage::BiasResult alone = stage::run_bias(common_emitter(), tight());
  const stage::BipolarOperatingPoint& q_alone = alone.bipolar("q1");
  for (const std::string node : {"vcc", "b", "c"}) {
    EXPECT_NEAR(bias.voltage(node), alone.voltage(node), 1e-9) << node;
  }
  EXPECT_NEAR(q.collector_current, q_alone.collector_current, 1e-9 * q_alone.collector_current);
  EXPECT_NEAR(q.base_current, q_alone.base_current, 1e-9 * q_alone.base_current);
  EXPECT_NEAR(bias.current("vcc"), alone.current("vcc"), 1e-9 * alone.current("vcc"));
}

// The ammeter is linear: its G is its stamp, checked against central
// differences like every device (tests/devices/derivative_check.hpp).
TEST(AmmeterDerivatives, MatchFiniteDifferences) {
  stage::testing::DerivativeCheck check([](stage::mna::Topology& t) {
    const auto node = t.node("n");
    const auto terminal = t.terminal_node("r1", "a");
    return std::make_unique<stage::devices::AmmeterDevice>("r1:a", node, terminal,
                                                           t.branch("r1:a"));
  });
  std::vector<double> x = check.state({{"n", 0.7}}, [](const std::string&) { return 0.3; });
  x[*check.topology().find_branch("r1:a")] = 2e-3;
  const auto result = check.compare(x);
  EXPECT_LT(result.worst, 1e-9) << result.where;  // exact for a linear stamp but rounding
}

TEST(SensedReferences, ValidateNamesTheSourceThatSensesNothing) {
  Circuit c = common_emitter();
  c.add("f1", CurrentControlledCurrentSource{"gnd", "out", "q1.collector", 1.0});
  c.add("rl", Resistor{"out", "gnd", 1e3});
  EXPECT_FALSE(stage::validate(c).has_value());
  for (const std::string bad : {"q2.collector", "q1.gate", "q1", "nothing", "q1.substrate"}) {
    Circuit wrong = c;
    std::get<CurrentControlledCurrentSource>(wrong.find("f1")->data).sense = bad;
    const auto problem = stage::validate(wrong);
    ASSERT_TRUE(problem.has_value()) << bad;
    EXPECT_EQ(problem->subject, "f1") << bad;
  }
}

}  // namespace
