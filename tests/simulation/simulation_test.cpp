// The prepared simulation: one system serves bias, frequency and transient
// runs, values change in place, and every result equals the one-shot run on
// the circuit as it then stands (the one-shot functions are the reference:
// they build everything afresh).
#include "stage/simulation.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

#include "large_signal/stages.hpp"
#include "stage/characterize.hpp"
#include "stage/errors.hpp"
#include "stage/headroom.hpp"
#include "stage/reader.hpp"
#include "stage/run.hpp"

namespace {

using stage::Circuit;

// Two bias reports agree node by node within `tolerance` volts.
void expect_same_voltages(const stage::BiasResult& got, const stage::BiasResult& want,
                          double tolerance) {
  ASSERT_EQ(got.node_voltages.size(), want.node_voltages.size());
  for (std::size_t k = 0; k < want.node_voltages.size(); ++k) {
    EXPECT_EQ(got.node_voltages[k].first, want.node_voltages[k].first);
    EXPECT_NEAR(got.node_voltages[k].second, want.node_voltages[k].second, tolerance)
        << want.node_voltages[k].first;
  }
}

stage::FrequencyOptions audio_band() {
  stage::FrequencyOptions o;
  o.from = 10;
  o.to = 100e3;
  o.per_decade = 5;
  o.input = "vin";
  o.output = stage::SignalRef::node("out");
  return o;
}

stage::TransientOptions two_periods() {
  stage::TransientOptions o;
  o.stop = 2e-3;
  o.max_step = 2e-5;
  return o;
}

TEST(Simulation, RunsEveryAnalysisOnOneSystemAsOneShotRunsDo) {
  Circuit c = stage::testing::follower_into_low_load();
  c.find("vin")->data = stage::VoltageSource{
      "in", "gnd", 0.0, 1.0, 0.0, stage::SineWave{0.1, 1e3, 0.0, 0.0, 0.0, 0.0}};
  stage::Simulation simulation(c);

  // The same cold start as the one-shot run: the same iterates, bit for bit.
  expect_same_voltages(simulation.bias(), stage::run_bias(c), 0.0);

  const stage::FrequencyResult h = simulation.frequency(audio_band());
  const stage::FrequencyResult h_once = stage::run_frequency(c, audio_band());
  ASSERT_EQ(h.gain_dB.size(), h_once.gain_dB.size());
  for (std::size_t k = 0; k < h.gain_dB.size(); ++k) EXPECT_EQ(h.gain_dB[k], h_once.gain_dB[k]);

  const stage::TransientResult t = simulation.transient(two_periods());
  const stage::TransientResult t_once = stage::run_transient(c, two_periods());
  ASSERT_EQ(t.time.size(), t_once.time.size());
  EXPECT_EQ(t.signal("out").back(), t_once.signal("out").back());

  // A new emitter resistor moves the bias point. The simulation starts from
  // the last one; the one-shot run from zero. Both stop within Newton's
  // tolerances (solver defaults: 1 uV plus 1e-4 relative per node), so they
  // agree to twice that.
  simulation.set_value("re", 2.2e3);
  Circuit changed = c;
  changed.find("re")->data = stage::Resistor{"emitter", "gnd", 2.2e3};
  const stage::BiasResult moved = simulation.bias();
  const stage::BiasResult moved_once = stage::run_bias(changed);
  expect_same_voltages(moved, moved_once, 2 * (1e-6 + 1e-4 * 12.0));
  // The premise: the change moved the emitter current by more than that.
  EXPECT_GT(std::abs(moved.current("re") - stage::run_bias(c).current("re")), 1e-3);

  const stage::SimulationCounters n = simulation.counters();
  EXPECT_EQ(n.systems_built, 1);
  EXPECT_EQ(n.cold_bias_solves, 1);
  EXPECT_EQ(n.warm_bias_solves, 1);
  EXPECT_EQ(n.bias_reused, 2);  // by the frequency sweep and the transient's start
}

// The headroom search and the stage report run every transient on one
// prepared simulation: one system, one bias point solved from cold, and
// every run (and the small-signal gain, and the limit classifier's reading
// of every device at the bias point) starting from it.
TEST(Simulation, HeadroomAndStageReportSolveOneBiasPoint) {
  const Circuit c = stage::testing::follower_into_low_load();
  stage::HeadroomOptions h;
  h.input = "vin";
  h.output = stage::SignalRef::node("out");
  const stage::HeadroomResult headroom = stage::run_headroom(c, h);
  EXPECT_EQ(headroom.counters.systems_built, 1);
  EXPECT_EQ(headroom.counters.cold_bias_solves, 1);
  EXPECT_EQ(headroom.counters.warm_bias_solves, 0);
  EXPECT_EQ(headroom.counters.bias_reused, headroom.transient_runs + 2);

  stage::CharacterizeOptions o;
  o.input = "vin";
  o.output = stage::SignalRef::node("out");
  o.load = "rl";
  const stage::CharacterizeResult report = stage::run_characterize(c, o);
  EXPECT_EQ(report.headroom.counters.systems_built, 1);
  EXPECT_EQ(report.headroom.counters.cold_bias_solves, 1);
  EXPECT_EQ(report.headroom.counters.warm_bias_solves, 0);
}

TEST(Simulation, SweepLeavesTheSourceAsItWas) {
  const Circuit c = stage::testing::follower_into_low_load();
  stage::Simulation simulation(c);
  stage::SweepOptions o;
  o.target = stage::SweepOptions::Target::source;
  o.name = "vcc";
  o.values = {10.0, 11.0, 12.0, 13.0};
  const stage::SweepResult sweep = simulation.sweep(o);
  ASSERT_EQ(sweep.points.size(), 4u);
  // The 12 V point is the circuit as built: the one-shot bias point, to
  // Newton's tolerances (solver defaults, as above).
  expect_same_voltages(sweep.points[2].bias, stage::run_bias(c), 2 * (1e-6 + 1e-4 * 12.0));
  EXPECT_EQ(std::get<stage::VoltageSource>(simulation.circuit().find("vcc")->data).dc, 12.0);
  EXPECT_EQ(simulation.counters().systems_built, 1);
}

// A sweep that fails part-way (1 mA forced backwards through a diode has no
// solution: its reverse current cannot exceed IS, Shockley) still leaves the
// source at its own value, so the simulation is the circuit it was given.
TEST(Simulation, FailedSweepLeavesTheSourceAsItWas) {
  Circuit c;
  stage::DiodeModel d;
  d.saturation_current = 1e-14;
  c.add_model("d", d);
  c.add("i1", stage::CurrentSource{"gnd", "a", 2e-3});
  c.add("d1", stage::Diode{"a", "gnd", "d"});
  stage::Simulation simulation(c);
  stage::SweepOptions o;
  o.target = stage::SweepOptions::Target::source;
  o.name = "i1";
  o.values = {1e-3, -1e-3};
  EXPECT_THROW(simulation.sweep(o), stage::NumericalError);
  EXPECT_EQ(std::get<stage::CurrentSource>(simulation.circuit().find("i1")->data).dc, 2e-3);
  expect_same_voltages(simulation.bias(), stage::run_bias(c), 2 * (1e-6 + 1e-4 * 1.0));
}

TEST(Simulation, RefusesValuesAnElementCannotTake) {
  stage::Simulation simulation(stage::testing::follower_into_low_load());
  try {
    simulation.set_value("nothing", 1.0);
    ADD_FAILURE() << "an unknown element was set";
  } catch (const stage::Error& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::invalid_request) << e.what();
    EXPECT_EQ(e.involved(), std::vector<std::string>{"nothing"});
  }
  EXPECT_THROW(simulation.set_value("re", -1.0), stage::Error);
  EXPECT_THROW(simulation.set_value("re", std::numeric_limits<double>::quiet_NaN()), stage::Error);
  EXPECT_THROW(simulation.set_value("vcc", std::numeric_limits<double>::infinity()), stage::Error);
  EXPECT_THROW(simulation.set_value("q1", 1.0), stage::Error);
  EXPECT_THROW(simulation.set_temperature(0.0), stage::Error);
  // Nothing was changed by the refused calls: the bias point is the one-shot one.
  expect_same_voltages(simulation.bias(), stage::run_bias(stage::testing::follower_into_low_load()),
                       0.0);
}

// A parameter that changes element values only keeps one system for the
// whole sweep; the values follow the parameter (the emitter current
// through the follower's emitter resistor changes with it).
TEST(Simulation, TakesValuesFromACircuitOfTheSameStructure) {
  const Circuit c = stage::testing::follower_into_low_load();
  stage::Simulation simulation(c);
  Circuit other = c;
  other.find("re")->data = stage::Resistor{"emitter", "gnd", 470.0};
  ASSERT_TRUE(simulation.take_values_from(other));
  expect_same_voltages(simulation.bias(), stage::run_bias(other), 2 * (1e-6 + 1e-4 * 12.0));
  Circuit rewired = c;
  rewired.find("re")->data = stage::Resistor{"emitter", "vcc", 470.0};
  EXPECT_FALSE(simulation.take_values_from(rewired));
  EXPECT_EQ(simulation.counters().systems_built, 1);
}

// Solver settings are the simulation's, not the circuit's: given at
// construction they serve every analysis run on it, and a deck's
// `solver(...)` statement reaches the runs of its analyses. The integration
// method a transient reports is the one it was given.
TEST(Simulation, SolverSettingsServeEveryRun) {
  const Circuit c = stage::testing::follower_into_low_load();
  stage::SolverOptions solver;
  solver.integration = stage::Integration::bdf2;
  stage::Simulation simulation(c, solver);
  EXPECT_EQ(simulation.solver().integration, stage::Integration::bdf2);
  EXPECT_EQ(simulation.transient(two_periods()).integration, stage::Integration::bdf2);
  EXPECT_EQ(stage::run_transient(c, two_periods(), solver).integration, stage::Integration::bdf2);
  EXPECT_EQ(stage::run_transient(c, two_periods()).integration, stage::Integration::tr_bdf2);

  const std::string text =
      "vin = voltage(in, gnd, 1 V)\nr1 = resistor(in, out, 1k)\n"
      "c1 = capacitor(out, gnd, 1 uF)\nanalyze transient(stop = 1 ms)\n";
  for (const auto& [statement, method] :
       {std::pair{"", stage::Integration::tr_bdf2},
        std::pair{"solver(integration = trapezoidal)\n", stage::Integration::trapezoidal}}) {
    const stage::Deck deck = stage::read_text(statement + text, "rc.stage");
    const stage::RunResult run = stage::run_deck(deck);
    ASSERT_EQ(run.analyses.size(), 1u);
    EXPECT_EQ(std::get<stage::TransientResult>(run.analyses.front()).integration, method)
        << statement;
  }
}

}  // namespace
