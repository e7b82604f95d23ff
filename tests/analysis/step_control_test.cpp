// Step control: the error against an exact solution follows the tolerance
// as the method's order predicts, and a linear circuit at a constant step
// never refactors its matrix.
#include <gtest/gtest.h>

#include <cmath>

#include "reference.hpp"
#include "stage/transient.hpp"

namespace {

constexpr double kTau = 1e-3, kV = 5.0;

stage::Circuit rc() {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", kV});
  c.add("r1", stage::Resistor{"in", "out", 1e3});
  c.add("c1", stage::Capacitor{"out", "gnd", 1e-6});
  return c;
}

using stage::testing::solver;

class StepControl : public ::testing::TestWithParam<stage::Integration> {};

// With the local error per step held to a tolerance eps and a method of
// order p, h ~ eps^{1/(p+1)} and the global error ~ N eps ~ eps^{p/(p+1)}
// (Hairer, Nørsett & Wanner, Solving ODEs I, section II.4): halving eps
// divides the error by 2^{2/3} = 1.587 for p = 2. Steps move in discrete
// jumps (a step grows only by 1.5 or more), so single halvings scatter;
// over four halvings the mean factor is held to 7 %.
TEST_P(StepControl, ErrorFollowsTheToleranceAsTheOrderPredicts) {
  stage::TransientOptions o;
  o.stop = 5 * kTau;
  o.max_step = o.stop;  // the tolerance alone sets the step
  o.start = stage::TransientStart::zero;
  const auto exact = [](double t) { return kV * (1 - std::exp(-t / kTau)); };
  std::vector<double> errors;
  for (double tolerance = 1e-4; tolerance > 5e-6; tolerance /= 2) {
    errors.push_back(stage::testing::max_error(
        stage::run_transient(rc(), o, solver(GetParam(), tolerance)), "out", exact));
  }
  ASSERT_EQ(errors.size(), 5u);
  for (std::size_t k = 1; k < errors.size(); ++k) {
    EXPECT_GT(errors[k - 1] / errors[k], 1.3) << "halving " << k;
    EXPECT_LT(errors[k - 1] / errors[k], 1.9) << "halving " << k;
  }
  const double mean_factor = std::pow(errors.front() / errors.back(), 0.25);
  EXPECT_NEAR(mean_factor, std::pow(2.0, 2.0 / 3.0), 0.07 * std::pow(2.0, 2.0 / 3.0));
}

// The factorisation count does not grow with the number of constant steps:
// the Jacobian G + a C is unchanged, so it is factored only while the first
// steps grow to max_step and when the last ones are cut to land on `stop`
// (which may cost one more or one fewer between runs; a requirement of the
// design).
TEST_P(StepControl, LinearConstantStepNeverRefactors) {
  const auto run = [&](double stop) {
    stage::TransientOptions o;
    o.stop = stop;
    o.max_step = kTau / 100;
    return stage::run_transient(rc(), o, solver(GetParam(), 1e-3));
  };
  const auto short_run = run(kTau), long_run = run(10 * kTau);
  EXPECT_GT(long_run.accepted_steps, short_run.accepted_steps + 800);
  EXPECT_LE(long_run.factorizations, short_run.factorizations + 1);
  EXPECT_LT(long_run.factorizations, 20);  // over 1000 steps
  EXPECT_EQ(long_run.rejected_steps, 0);
}

INSTANTIATE_TEST_SUITE_P(Formulas, StepControl,
                         ::testing::Values(stage::Integration::tr_bdf2,
                                           stage::Integration::trapezoidal,
                                           stage::Integration::bdf2),
                         stage::testing::integration_name);

// resample() puts every signal on a uniform grid; the quadratic
// interpolation of e^{-t/tau} between samples h apart errs by at most
// h^3 / (9 sqrt 3 tau^3) of the value (Lagrange remainder).
TEST(Resample, UniformGridThroughQuadraticInterpolation) {
  stage::TransientOptions o;
  o.stop = 5 * kTau;
  o.resample_step = kTau / 10;
  o.start = stage::TransientStart::zero;
  const auto r = stage::run_transient(rc(), o, solver(stage::Integration::trapezoidal, 1e-5));
  ASSERT_EQ(r.time.size(), 51u);
  EXPECT_DOUBLE_EQ(r.time[10], kTau);
  EXPECT_EQ(r.signal("out").size(), 51u);
  EXPECT_LT(
      stage::testing::max_error(r, "out", [](double t) { return kV * (1 - std::exp(-t / kTau)); }),
      5e-4);
}

}  // namespace
