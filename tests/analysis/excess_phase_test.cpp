// The excess-phase delay of the bipolar model (spec section 4): the current
// gain of a transistor with excess_phase_delay = tau over the same
// transistor without it is the network's transfer 1 / (1 + s tau + (s tau)^2/3)
// (the second-order Bessel delay network, Thomson, Proc. IEE 1949), whose
// phase is -omega tau to first order: a delay tau multiplies a phasor by
// exp(-j omega tau) (the shift theorem of the Fourier transform). The model
// has no charges and infinite Early voltage, so the gain has no other
// frequency dependence; values our own.
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "analysis/response_checks.hpp"
#include "stage/frequency.hpp"

namespace {

using stage::test::Complex;

constexpr double kDelay = 1e-9;  // s
// LU rounding only: the ratio of two responses of the same linear network.
constexpr double kTight = 1e-9;

// 10 uA (DC) and the AC input into the base; the collector current through
// a 1 ohm sense resistor from a fixed supply is the output.
stage::Circuit current_gain_stage(double delay) {
  stage::BipolarModel m;
  m.saturation_current = 1e-15;
  m.beta_forward = 150;
  m.excess_phase_delay = delay;
  stage::Circuit c;
  c.add_model("npn", m);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 5.0});
  c.add("iin", stage::CurrentSource{"gnd", "b", 10e-6, 1.0});
  c.add("rc", stage::Resistor{"vcc", "c", 1.0});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "c", "b", "gnd", {}, "npn"});
  return c;
}

stage::FrequencyResult current_gain(double delay) {
  stage::FrequencyOptions o;
  o.from = 1e6;
  o.to = 1e9;
  o.per_decade = 10;
  o.input = "iin";
  o.output = stage::SignalRef::current("rc");
  stage::SolverOptions tight;
  tight.relative_tolerance = 1e-10;  // so that the two bias points compare closely
  return stage::run_frequency(current_gain_stage(delay), o, tight);
}

TEST(ExcessPhase, LeavesTheBiasPointAlone) {
  // At DC the network passes the transport current unchanged: the two bias
  // points agree within the solver's relative tolerance (1e-10 here).
  const auto with = current_gain(kDelay).bias.bipolar("q1");
  const auto without = current_gain(0).bias.bipolar("q1");
  EXPECT_NEAR(with.collector_current, without.collector_current, 1e-9 * without.collector_current);
  EXPECT_NEAR(with.gm, without.gm, 1e-9 * without.gm);
}

TEST(ExcessPhase, CurrentGainFollowsTheBesselDelayNetwork) {
  const auto with = current_gain(kDelay);
  const auto without = current_gain(0);
  ASSERT_EQ(with.frequencies.size(), without.frequencies.size());
  for (std::size_t i = 0; i < with.frequencies.size(); ++i) {
    const double f = with.frequencies[i];
    const Complex s_tau = stage::test::jw(f) * kDelay;
    const Complex bessel = 1.0 / (1.0 + s_tau + s_tau * s_tau / 3.0);
    stage::test::expect_response(with.response[i] / without.response[i], bessel, kTight,
                                 "gain ratio", f);
  }
}

TEST(ExcessPhase, PhaseOfTheCurrentGainShiftsByOmegaTimesDelay) {
  const auto with = current_gain(kDelay);
  const auto without = current_gain(0);
  int checked = 0;
  for (std::size_t i = 0; i < with.frequencies.size(); ++i) {
    const double omega_tau = 2 * std::numbers::pi * with.frequencies[i] * kDelay;
    if (omega_tau > 0.1) continue;
    const double shift = std::arg(with.response[i] / without.response[i]);
    // The network's phase is -atan(x / (1 - x^2/3)) = -x + x^5/45 + ...
    // (x = omega tau; its Taylor series): the delay holds to fifth order.
    EXPECT_NEAR(shift, -omega_tau, std::pow(omega_tau, 5) / 45 + 1e-12) << omega_tau;
    ++checked;
  }
  EXPECT_GE(checked, 10);
}

}  // namespace
