// Second-order circuits: the series RLC step response (underdamped and
// overdamped) against the textbook solutions, and an LC tank over 100
// periods: the trapezoidal rule keeps its energy, BDF2 damps it by exactly
// its amplification factor.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>

#include "reference.hpp"
#include "stage/transient.hpp"

namespace {

using stage::testing::max_error;

constexpr double kV = 1.0, kL = 10e-3, kC = 1e-6;  // w0 = 1/sqrt(LC) = 1e4 rad/s

stage::Circuit series_rlc(double r) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", kV});
  c.add("r1", stage::Resistor{"in", "a", r});
  c.add("l1", stage::Inductor{"a", "b", kL, std::nullopt});
  c.add("c1", stage::Capacitor{"b", "gnd", kC, std::nullopt});
  return c;
}

stage::TransientResult step_response(const stage::Circuit& c, double stop,
                                     stage::Integration integration) {
  stage::TransientOptions o;
  o.stop = stop;
  o.start = stage::TransientStart::zero;
  return stage::run_transient(c, o, stage::testing::solver(integration, 1e-5));
}

class SeriesRlc : public ::testing::TestWithParam<stage::Integration> {};

// Underdamped, R = 20 ohm: alpha = R/2L = 1e3, wd = sqrt(w0^2 - alpha^2);
// v_C = V [1 - e^{-alpha t} (cos wd t + alpha/wd sin wd t)]
// (Nilsson & Riedel, Electric Circuits, section 8.5, step response of a
// series RLC). Over 8 ringing periods the local errors (relative_tolerance
// 1e-5 of the peak charge, a few hundred to a thousand steps) add up to
// measured 8e-4 V (trapezoidal) and 1.2e-3 V (BDF2, whose numerical damping
// adds to the ringing's error); the bound is 0.2 % of V.
TEST_P(SeriesRlc, UnderdampedStep) {
  const double alpha = 1e3, w0 = 1e4, wd = std::sqrt(w0 * w0 - alpha * alpha);
  const auto r = step_response(series_rlc(20.0), 5e-3, GetParam());
  const auto exact = [&](double t) {
    return kV * (1 - std::exp(-alpha * t) * (std::cos(wd * t) + alpha / wd * std::sin(wd * t)));
  };
  EXPECT_LT(max_error(r, "b", exact), 2e-3 * kV);
}

// Overdamped, R = 1 kohm: s1,2 = -alpha +- sqrt(alpha^2 - w0^2);
// v_C = V [1 + (s2 e^{s1 t} - s1 e^{s2 t}) / (s1 - s2)] (same section).
TEST_P(SeriesRlc, OverdampedStep) {
  const double alpha = 5e4, w0 = 1e4, root = std::sqrt(alpha * alpha - w0 * w0);
  const double s1 = -alpha + root, s2 = -alpha - root;
  const auto r = step_response(series_rlc(1e3), 5.0 / -s1, GetParam());
  const auto exact = [&](double t) {
    return kV * (1 + (s2 * std::exp(s1 * t) - s1 * std::exp(s2 * t)) / (s1 - s2));
  };
  EXPECT_LT(max_error(r, "b", exact), 2e-4 * kV);
}

INSTANTIATE_TEST_SUITE_P(Formulas, SeriesRlc,
                         ::testing::Values(stage::Integration::tr_bdf2,
                                           stage::Integration::trapezoidal,
                                           stage::Integration::bdf2),
                         stage::testing::integration_name);

// LC tank from a capacitor charged to 1 V, L = 1 mH, C = 1 uF, 200 steps a
// period once the first steps have grown to max_step.
struct Tank {
  static constexpr double l = 1e-3, c = 1e-6;
  double w = 1 / std::sqrt(l * c), period = 2 * std::numbers::pi / w, step = period / 200;
  stage::TransientResult result;

  explicit Tank(stage::Integration integration) {
    stage::Circuit circuit;
    circuit.add("c1", stage::Capacitor{"top", "gnd", c, 1.0});
    circuit.add("l1", stage::Inductor{"top", "gnd", l, std::nullopt});
    stage::TransientOptions o;
    o.stop = 100 * period;
    o.max_step = step;
    o.start = stage::TransientStart::zero;
    result = stage::run_transient(circuit, o, stage::testing::solver(integration));
  }
  // sqrt(2 E / C) with E = C v^2/2 + L i^2/2: the amplitude of the voltage.
  double amplitude(std::size_t k) const {
    const double v = result.signal("top")[k], i = result.signal("l1.current")[k];
    return std::sqrt(v * v + l / c * i * i);
  }
  // First index from which every step is max_step (the first steps grow to it).
  std::size_t constant_from() const {
    std::size_t k = 1;
    while (std::abs(result.time[k] - result.time[k - 1] - step) > 1e-9 * step) ++k;
    return k;
  }
};

// For a linear system the trapezoidal rule is the implicit midpoint rule,
// which conserves quadratic invariants exactly (Hairer, Lubich & Wanner,
// Geometric Numerical Integration, Theorem IV.2.1): the energy is held to
// rounding and Newton's tolerance at every step size, so 0.01 % over 100
// periods must hold with room to spare.
TEST(LcTank, TrapezoidalKeepsItsAmplitude) {
  const Tank tank(stage::Integration::trapezoidal);
  for (std::size_t k = 0; k < tank.result.time.size(); ++k) {
    ASSERT_NEAR(tank.amplitude(k), 1.0, 1e-4) << "at t = " << tank.result.time[k];
  }
}

// BDF2 on y' = i w y: the principal root of its characteristic polynomial
// (3/2 - z) r^2 - 2 r + 1/2 = 0, z = i w h, r = (2 + sqrt(1 + 2z)) / (3 - 2z)
// (Hairer & Wanner, Solving ODEs II, section V.1, stability of BDF2), scales
// the amplitude by |r| per constant step. Over N steps the decay is
// 1 - |r|^N; the parasitic root (|r| ~ 1/3) has died out after 20 steps.
TEST(LcTank, Bdf2DampsByItsAmplificationFactor) {
  const Tank tank(stage::Integration::bdf2);
  const std::complex<double> z(0.0, tank.w * tank.step);
  const double r = std::abs((2.0 + std::sqrt(1.0 + 2.0 * z)) / (3.0 - 2.0 * z));
  const std::size_t first = tank.constant_from() + 20;
  std::size_t last = first;
  while (last + 1 < tank.result.time.size() &&
         std::abs(tank.result.time[last + 1] - tank.result.time[last] - tank.step) <
             1e-9 * tank.step) {
    ++last;
  }
  ASSERT_GT(last - first, 15000u);  // most of the 20000 steps are at the constant step
  const double predicted = 1.0 - std::pow(r, static_cast<double>(last - first));
  const double measured = 1.0 - tank.amplitude(last) / tank.amplitude(first);
  EXPECT_GT(predicted, 1e-3);  // the damping is there to be measured
  EXPECT_NEAR(measured, predicted, 1e-2 * predicted);
}

}  // namespace
