// TR-BDF2, the default integrator: second order against exact solutions,
// and the circuits of issue 10 where the trapezoidal rule rang or stalled: a
// chain of twenty charge-storing emitter followers, a single follower with
// no base resistance at a 0.2 ns step, and a diode's stored charge.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <numbers>

#include "follower_chain.hpp"
#include "reference.hpp"
#include "stage/transient.hpp"

namespace {

using stage::Integration;

// Largest |a(t) - b(t)| over a's samples, b read by its interpolant.
double largest_difference(const stage::TransientResult& a, const stage::TransientResult& b,
                          const std::string& name) {
  const auto& values = a.signal(name);
  const stage::TransientSignal& other = *std::find_if(
      b.signals.begin(), b.signals.end(), [&](const auto& s) { return s.name == name; });
  double worst = 0;
  for (std::size_t k = 0; k < a.time.size(); ++k) {
    worst = std::max(worst, std::abs(values[k] - stage::interpolate(b, other, a.time[k])));
  }
  return worst;
}

// A run whose step is max_step from the first steps on: a tolerance so
// loose the error test never limits it, and a linear circuit, which Newton
// solves exactly. Every step then scales with max_step.
stage::TransientResult fixed_steps(const stage::Circuit& c, double stop, double max_step) {
  stage::TransientOptions o;
  o.stop = stop;
  o.max_step = max_step;
  o.start = stage::TransientStart::zero;
  return stage::run_transient(c, o, stage::testing::solver(Integration::tr_bdf2, 1.0));
}

// Observed order log2(e(h) / e(h/2)) over three halvings.
std::vector<double> observed_orders(const stage::Circuit& c, double stop, double step,
                                    const std::string& signal,
                                    const std::function<double(double)>& exact) {
  std::vector<double> errors, orders;
  for (int k = 0; k < 4; ++k, step /= 2) {
    errors.push_back(stage::testing::max_error(fixed_steps(c, stop, step), signal, exact));
  }
  for (std::size_t k = 1; k < errors.size(); ++k) {
    orders.push_back(std::log2(errors[k - 1] / errors[k]));
    ::testing::Test::RecordProperty("order_" + std::to_string(k), std::to_string(orders.back()));
  }
  return orders;
}

// RC charging: v = V (1 - e^{-t/RC}) (exact solution). TR-BDF2 is second
// order (Bank et al. 1985; Hosea & Shampine 1996, section 2), so halving
// the step quarters the error: the observed order is 2 within 0.1.
TEST(TrBdf2, RcConvergesAtSecondOrder) {
  const double tau = 1e-3, v = 5.0;
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", v});
  c.add("r1", stage::Resistor{"in", "out", 1e3});
  c.add("c1", stage::Capacitor{"out", "gnd", 1e-6});
  const auto exact = [&](double t) { return v * (1 - std::exp(-t / tau)); };
  for (double order : observed_orders(c, 5 * tau, tau / 10, "out", exact)) {
    EXPECT_NEAR(order, 2.0, 0.1);  // second order (exact solution reference)
  }
  // At a tenth of tau per step the error is already below 1e-3 of V (exact solution).
  EXPECT_LT(stage::testing::max_error(fixed_steps(c, 5 * tau, tau / 10), "out", exact), 1e-3 * v);
}

// Series RLC, R = 20 ohm, L = 10 mH, C = 1 uF, underdamped step response
// v_C = V [1 - e^{-alpha t} (cos wd t + alpha/wd sin wd t)] (Nilsson &
// Riedel, Electric Circuits, section 8.5): order 2 within 0.1 (exact solution).
TEST(TrBdf2, RlcConvergesAtSecondOrder) {
  const double v = 1.0, alpha = 1e3, w0 = 1e4, wd = std::sqrt(w0 * w0 - alpha * alpha);
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", v});
  c.add("r1", stage::Resistor{"in", "a", 20.0});
  c.add("l1", stage::Inductor{"a", "b", 10e-3, std::nullopt});
  c.add("c1", stage::Capacitor{"b", "gnd", 1e-6, std::nullopt});
  const auto exact = [&](double t) {
    return v * (1 - std::exp(-alpha * t) * (std::cos(wd * t) + alpha / wd * std::sin(wd * t)));
  };
  const double period = 2 * std::numbers::pi / wd;
  for (double order : observed_orders(c, 3 * period, period / 50, "b", exact)) {
    EXPECT_NEAR(order, 2.0, 0.1);  // second order (exact solution reference)
  }
}

// The twenty-follower chain: TR-BDF2 against BDF2, both at a relative
// tolerance of 1e-7. A coupling capacitor's charge is ~6 V x 1 uF, so a
// local error of 1e-7 of it is 0.6 uV, and a few hundred steps whose
// errors partly cancel leave each method a few uV from the truth: the
// check at 1e-3 of the 10 mV signal (10 uV) tests two different formulas'
// agreement, not luck. Measured: 3e-6 V.
TEST(TrBdf2, TwentyFollowerChainAgreesWithBdf2) {
  stage::TransientOptions o;
  o.stop = 2e-3;
  o.max_step = 10e-6;
  o.signals = {stage::SignalRef::node("out")};
  const auto run = [&](Integration method, double tolerance) {
    return stage::run_transient(stage::testing::follower_chain(20), o,
                                stage::testing::solver(method, tolerance));
  };
  const auto tr_bdf2 = run(Integration::tr_bdf2, 1e-7), bdf2 = run(Integration::bdf2, 1e-7);
  const double difference = largest_difference(tr_bdf2, bdf2, "out");
  RecordProperty("difference_V", std::to_string(difference));
  EXPECT_LT(difference, 1e-3 * stage::testing::kChainAmplitude);  // BDF2 reference
  // The output follows the 10 mV input with less than unity gain: no ringing
  // garbage beyond it (hand analysis: each follower's gain is below one).
  const auto& out = tr_bdf2.signal("out");
  const auto [low, high] = std::minmax_element(out.begin(), out.end());
  EXPECT_LT(std::max(-*low, *high), stage::testing::kChainAmplitude);

  // The trapezoidal rule at the default tolerance 1e-4 lands on the same
  // answer within 1e-2 of the signal (its local errors are 1e3 times
  // larger, ~0.6 mV of charge-equivalent voltage at most; measured 2e-6 V).
  const auto trapezoidal = run(Integration::trapezoidal, 1e-4);
  const double trapezoidal_difference = largest_difference(trapezoidal, bdf2, "out");
  RecordProperty("trapezoidal_difference_V", std::to_string(trapezoidal_difference));
  EXPECT_LT(trapezoidal_difference, 1e-2 * stage::testing::kChainAmplitude);
}

// One follower with no base resistance at max_step = 0.2 ns: every method
// used to fail Newton's update test on rounding noise (a C = 1e4 S across
// the 1 uF coupling capacitor) thousands of times and stop with "step fell
// below its minimum". It completes without a rejected step and agrees with
// BDF2 at 1e-7 run without the step bound to 1e-3 of the output's peak
// (0.12 nV of a 118 uV peak, far inside the 1 uV absolute voltage
// tolerance; measured 3.6e-4 of the peak).
TEST(TrBdf2, FollowerWithoutBaseResistanceAtATinyStep) {
  stage::TransientOptions o;
  o.stop = 2e-6;
  o.signals = {stage::SignalRef::node("out")};
  stage::Circuit c = stage::testing::follower_chain(1, 0.0);
  o.max_step = 0.2e-9;
  const auto tiny = stage::run_transient(c, o);
  EXPECT_EQ(tiny.rejected_steps, 0);
  o.max_step = 0;
  const auto reference =
      stage::run_transient(c, o, stage::testing::solver(Integration::bdf2, 1e-7));
  const auto& out = reference.signal("out");
  const double peak = std::max(std::abs(*std::min_element(out.begin(), out.end())),
                               std::abs(*std::max_element(out.begin(), out.end())));
  ASSERT_GT(peak, 0.0);
  const double difference = largest_difference(tiny, reference, "out");
  RecordProperty("relative_difference", std::to_string(difference / peak));
  EXPECT_LT(difference, 1e-3 * peak);  // BDF2 reference
}

// A diode with a large stored charge (transit time 1 us, generic values)
// behind 100 ohm, driven by a 1 V, 1 kHz sine: its charge is nearly
// algebraic while it conducts, and the trapezoidal rule's charge changes
// alternate there. Those steps are detected and redone as TR-BDF2 steps,
// and the result agrees with TR-BDF2 to 1e-4 V (TR-BDF2 reference at 1e-7,
// the trapezoidal rule at 1e-6: each within a few 1e-6 V of the truth).
TEST(TrBdf2, TrapezoidalRingingIsDetectedAndDamped) {
  stage::Circuit c;
  stage::DiodeModel d;
  d.junction_capacitance = 1e-9;
  d.transit_time = 1e-6;
  c.add_model("d", d);
  c.add("vs", stage::VoltageSource{"in", "gnd", 0.0, 0.0, 0.0, stage::SineWave{1.0, 1e3}});
  c.add("r1", stage::Resistor{"in", "a", 100.0});
  c.add("d1", stage::Diode{"a", "gnd", "d"});
  stage::TransientOptions o;
  o.stop = 3e-3;
  o.max_step = 1e-5;
  o.signals = {stage::SignalRef::node("a")};
  const auto trapezoidal =
      stage::run_transient(c, o, stage::testing::solver(Integration::trapezoidal, 1e-6));
  EXPECT_GT(trapezoidal.damped_steps, 0);
  const auto reference =
      stage::run_transient(c, o, stage::testing::solver(Integration::tr_bdf2, 1e-7));
  const double difference = largest_difference(trapezoidal, reference, "a");
  RecordProperty("difference_V", std::to_string(difference));
  RecordProperty("damped_steps", trapezoidal.damped_steps);
  EXPECT_LT(difference, 1e-4);  // TR-BDF2 reference
}

}  // namespace
