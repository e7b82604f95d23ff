// First-order circuits against their exponentials: an RC charging from zero,
// an RC discharging from its initial voltage, an RL switching on; both
// integration formulas and both starts.
#include <gtest/gtest.h>

#include <cmath>

#include "reference.hpp"
#include "stage/transient.hpp"

namespace {

using stage::testing::max_error;

constexpr double kR = 1e3, kC = 1e-6, kTau = kR * kC;  // 1 ms
constexpr double kV = 5.0;

stage::Circuit rc(std::optional<double> initial, double source) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", source});
  c.add("r1", stage::Resistor{"in", "out", kR});
  c.add("c1", stage::Capacitor{"out", "gnd", kC, initial});
  return c;
}

stage::TransientOptions zero_start(double stop) {
  stage::TransientOptions o;
  o.stop = stop;
  o.start = stage::TransientStart::zero;
  return o;
}

class FirstOrder : public ::testing::TestWithParam<stage::Integration> {};

// Charging from zero: v(t) = V (1 - e^{-t/RC}) (first-order linear ODE).
// The local error is held to relative_tolerance (1e-4) of the charge per step
// and accumulates over the ~10^2 steps of 5 tau with the decay e^{-t/RC}, so
// the global error stays within a few 1e-4 V of the 5 V swing; 2e-3 V is
// 0.04 % of it.
TEST_P(FirstOrder, RcChargesAlongItsExponential) {
  auto c = rc(std::nullopt, kV);
  const auto r = stage::run_transient(c, zero_start(5 * kTau), stage::testing::solver(GetParam()));
  EXPECT_LT(max_error(r, "out", [](double t) { return kV * (1 - std::exp(-t / kTau)); }), 2e-3);
  // The source delivers (V - v)/R: V/R e^{-t/RC}.
  EXPECT_LT(max_error(r, "v1.current", [](double t) { return kV / kR * std::exp(-t / kTau); }),
            2e-6);
  EXPECT_DOUBLE_EQ(r.time.back(), 5 * kTau);
}

// Discharging from initial = 3 V into a 0 V source: v(t) = 3 e^{-t/RC}.
TEST_P(FirstOrder, RcDischargesFromItsInitialVoltage) {
  auto c = rc(3.0, 0.0);
  const auto r = stage::run_transient(c, zero_start(5 * kTau), stage::testing::solver(GetParam()));
  // Held by the consistent start, whose two steps of tau = 1e-9 of the run
  // move the charge by 2 tau v' (transient_start.cpp):
  // 2 * 1e-9 * 5 ms * 3 V / 1 ms = 3e-8 V.
  EXPECT_NEAR(r.signal("out").front(), 3.0, 3.1e-8);
  EXPECT_LT(max_error(r, "out", [](double t) { return 3.0 * std::exp(-t / kTau); }), 1.5e-3);
}

// RL switched on: i(t) = V/R (1 - e^{-t R/L}).
TEST_P(FirstOrder, RlCurrentRisesAlongItsExponential) {
  constexpr double kL = 10e-3, kTauL = kL / kR;  // 10 us
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", kV});
  c.add("r1", stage::Resistor{"in", "mid", kR});
  c.add("l1", stage::Inductor{"mid", "gnd", kL, std::nullopt});
  const auto r = stage::run_transient(c, zero_start(5 * kTauL), stage::testing::solver(GetParam()));
  const double full = kV / kR;
  EXPECT_LT(max_error(r, "l1.current", [&](double t) { return full * (1 - std::exp(-t / kTauL)); }),
            4e-4 * full);
}

// start = bias: a circuit at its operating point stays there (the bias point
// is a steady state; the RC sits at V).
TEST_P(FirstOrder, BiasStartIsSteady) {
  auto c = rc(std::nullopt, kV);
  stage::TransientOptions o;
  o.stop = 2 * kTau;
  const auto r = stage::run_transient(c, o, stage::testing::solver(GetParam()));
  EXPECT_LT(max_error(r, "out", [](double) { return kV; }), 1e-9);
}

// A step through a pulse source: the corners at 1 ms and at the end of its
// edge are landed on exactly and the response after it is
// V (1 - e^{-(t - 1 ms)/RC}) (rise 1 ns level to level: the
// response to the ramp differs from the step's by at most V rise / (2 RC)).
TEST_P(FirstOrder, PulseCornersAreLandedOn) {
  stage::Circuit c = rc(std::nullopt, 0.0);
  auto& source = std::get<stage::VoltageSource>(c.find("v1")->data);
  const stage::PulseWave pulse{.low = 0.0,
                               .high = kV,
                               .period = 2.0,
                               .high_time = 1.0,
                               .rise = 0.8e-9,
                               .fall = 0.8e-9,
                               .delay = 1e-3};
  source.wave = pulse;
  stage::TransientOptions o;
  o.stop = 6e-3;
  const auto r = stage::run_transient(c, o, stage::testing::solver(GetParam()));
  EXPECT_NE(std::find(r.time.begin(), r.time.end(), 1e-3), r.time.end());
  const double edge_end = 1e-3 + stage::pulse_shape(pulse).rise;
  EXPECT_NE(std::find(r.time.begin(), r.time.end(), edge_end), r.time.end());
  const auto exact = [](double t) {
    return t < 1e-3 ? 0.0 : kV * (1 - std::exp(-(t - 1e-3) / kTau));
  };
  EXPECT_LT(max_error(r, "out", exact), 2e-3);
}

INSTANTIATE_TEST_SUITE_P(Formulas, FirstOrder,
                         ::testing::Values(stage::Integration::tr_bdf2,
                                           stage::Integration::trapezoidal,
                                           stage::Integration::bdf2),
                         stage::testing::integration_name);

}  // namespace
