// A bias point is reported only when it is a solution of the models: circuits
// with no solution, or whose only "solution" lies where a junction's
// exponential is no longer evaluated, fail with a NumericalError naming the
// node and elements at fault; a solution far outside a model's characterised
// range stands with a warning naming the device; every reported solution
// passes the KCL check, which rejects a perturbed one.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "analysis/newton.hpp"
#include "analysis/operating_point.hpp"
#include "devices/physical_constants.hpp"
#include "mna/system.hpp"
#include "simulation/assemble.hpp"
#include "stage/bias.hpp"
#include "stage/errors.hpp"

namespace {

using stage::Circuit;

const double kVt = stage::devices::thermal_voltage(stage::kRoomTemperature);

bool names(const std::vector<std::string>& involved, const std::string& name) {
  return std::find(involved.begin(), involved.end(), name) != involved.end();
}

// The NumericalError run_bias throws, or a test failure when it returns.
stage::NumericalError bias_failure(const Circuit& c) {
  try {
    const stage::BiasResult r = stage::run_bias(c);
    ADD_FAILURE() << "a bias point was reported: max KCL residual " << r.max_kcl_residual;
  } catch (const stage::NumericalError& e) {
    return e;
  }
  return stage::NumericalError(stage::ErrorKind::no_convergence, "", {});
}

stage::DiodeModel plain_diode() {
  stage::DiodeModel d;
  d.saturation_current = 1e-14;
  return d;
}

// 1 mA forced backwards through a diode with no breakdown. By the Shockley
// equation (Sedra and Smith, "Microelectronic Circuits", ch. 4) the reverse
// current of such a diode cannot exceed its saturation current, 10 fA here:
// no operating point exists, and the node the source drives runs away.
TEST(SolutionCheck, CurrentForcedBackwardsThroughDiodeHasNoSolution) {
  Circuit c;
  c.add_model("d", plain_diode());
  c.add("i1", stage::CurrentSource{"gnd", "a", 1e-3});
  c.add("d1", stage::Diode{"gnd", "a", "d"});
  const auto e = bias_failure(c);
  EXPECT_EQ(e.kind(), stage::ErrorKind::no_convergence) << e.what();
  EXPECT_TRUE(names(e.involved(), "a")) << e.what();
  EXPECT_TRUE(names(e.involved(), "i1")) << e.what();
  EXPECT_TRUE(names(e.involved(), "d1")) << e.what();
  EXPECT_NE(std::string(e.what()).find("no DC operating point"), std::string::npos) << e.what();
}

// 5 V held straight across a base-emitter junction: the Ebers-Moll current
// IS exp(5 V / VT) is about 1e-15 x e^193 (Ebers and Moll, Proc. IRE 1954):
// nothing in the model's range. The solver's tangent continuation of the
// exponential must not be reported as the transistor's current.
TEST(SolutionCheck, SourceAcrossBaseEmitterIsOutsideTheModel) {
  Circuit c;
  stage::BipolarModel m;
  m.saturation_current = 1e-15;
  c.add_model("n", m);
  c.add("vcc", stage::VoltageSource{"c", "gnd", 10.0});
  c.add("vb", stage::VoltageSource{"b", "gnd", 5.0});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "c", "b", "gnd", {}, "n"});
  const auto e = bias_failure(c);
  EXPECT_EQ(e.kind(), stage::ErrorKind::outside_model) << e.what();
  EXPECT_TRUE(names(e.involved(), "q1")) << e.what();
  EXPECT_NE(std::string(e.what()).find("base–emitter"), std::string::npos) << e.what();
  // Just inside the range the same circuit is an ordinary bias point: at
  // 0.7 V the collector current is IS exp(0.7 / VT) (Ebers-Moll transport
  // model, forward active, no Early effect), to Newton's relative tolerance.
  c.find("vb")->data = stage::VoltageSource{"b", "gnd", 0.7};
  const stage::BiasResult r = stage::run_bias(c);
  const double expected = 1e-15 * (std::exp(0.7 / kVt) - 1);
  EXPECT_NEAR(r.bipolar("q1").collector_current, expected, 1e-4 * expected);
  EXPECT_TRUE(r.warnings.empty());
}

// A small-signal transistor (knee current 50 mA) forced to carry amperes: the
// Gummel-Poon equations still hold, so the point stands, but the result says
// the device is far beyond its model's knee and names it.
TEST(SolutionCheck, TransistorFarBeyondItsKneeIsWarned) {
  Circuit c;
  stage::BipolarModel m;
  m.saturation_current = 1e-14;
  m.beta_forward = 200;
  m.knee_current_forward = 50e-3;
  c.add_model("n", m);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 15.0});
  c.add("rc", stage::Resistor{"vcc", "c", 0.1});
  c.add("ib", stage::CurrentSource{"gnd", "b", 30e-3});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "c", "b", "gnd", {}, "n"});
  const stage::BiasResult r = stage::run_bias(c);
  const double ic = r.bipolar("q1").collector_current;
  ASSERT_GT(ic, 10 * m.knee_current_forward);  // the premise: far past the knee
  ASSERT_EQ(r.warnings.size(), 1u);
  EXPECT_EQ(r.warnings.front().rfind("q1:", 0), 0u) << r.warnings.front();
  // The same circuit with a 0.1 mA base drive sits below the knee (IC about
  // 20 mA) and nothing is said.
  c.find("ib")->data = stage::CurrentSource{"gnd", "b", 1e-4};
  EXPECT_TRUE(stage::run_bias(c).warnings.empty());
}

// The KCL check itself: a solution passes, the same solution with one node
// moved by 1 mV fails, naming that node. Diode and resistor from 5 V: the
// current through 1 kohm changes by 1 uA, a million times the 1 pA current
// tolerance (Ohm's law).
TEST(SolutionCheck, PerturbedSolutionFailsKclAtThatNode) {
  Circuit c;
  c.add_model("d", plain_diode());
  c.add("v1", stage::VoltageSource{"in", "gnd", 5.0});
  c.add("r1", stage::Resistor{"in", "a", 1e3});
  c.add("d1", stage::Diode{"a", "gnd", "d"});
  const stage::mna::System system = stage::assemble(c);
  const stage::SolverOptions solver;
  stage::analysis::NewtonSolver newton(system, solver);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  stage::analysis::solve_operating_point(newton, x);
  EXPECT_NO_THROW(stage::analysis::verify_operating_point(system, solver, x));
  const auto a = system.topology().find_unknown("a");
  ASSERT_TRUE(a.has_value());
  x[static_cast<std::size_t>(*a)] += 1e-3;
  try {
    stage::analysis::verify_operating_point(system, solver, x);
    ADD_FAILURE() << "a perturbed solution passed the KCL check";
  } catch (const stage::NumericalError& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::no_convergence) << e.what();
    EXPECT_TRUE(names(e.involved(), "a")) << e.what();
  }
}

}  // namespace
