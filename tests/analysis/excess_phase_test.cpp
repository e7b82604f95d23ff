// The excess-phase delay of the bipolar model (spec section 4): the current
// gain of a transistor with excess_phase_delay = tau over the same
// transistor without it is the network's transfer 1 / (1 + s tau + (s tau)^2/3)
// (the second-order Bessel delay network, Thomson, Proc. IEE 1949), whose
// phase is -omega tau to first order: a delay tau multiplies a phasor by
// exp(-j omega tau) (the shift theorem of the Fourier transform). The model
// has no charges and infinite Early voltage, so the gain has no other
// frequency dependence; values our own.
#include <gtest/gtest.h>

#include <array>
#include <boost/numeric/odeint.hpp>
#include <cmath>
#include <numbers>

#include "analysis/response_checks.hpp"
#include "stage/frequency.hpp"
#include "stage/transient.hpp"

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

// In time: the collector current is the transport current through the
// network, tau^2/3 i'' + tau i' + i = i_t (its transfer function read as an
// ODE). With no charges the junction follows the base current at once, and
// for this ideal model i_t = beta_F i_B to 1e-10 (the reverse terms IS/beta_R
// against milliamperes), so a ramp of the base current from 10 to 20 uA
// over 0.2 tau gives a collector current that a Dormand-Prince integration
// of the ODE (Boost.Odeint) reproduces: an underdamped second-order response
// (damping ratio sqrt(3)/2) that rises from 1.5 to 3 mA with a small
// overshoot.
TEST(ExcessPhase, TransientFollowsTheDelayNetworksEquation) {
  constexpr double kBeta = 150, kLow = 10e-6, kHigh = 20e-6, kRampAt = 2 * kDelay,
                   kRamp = 0.2 * kDelay;
  stage::Circuit c = current_gain_stage(kDelay);
  stage::CurrentSource& drive = std::get<stage::CurrentSource>(c.find("iin")->data);
  drive.wave = stage::PiecewiseWave{{{0, kLow}, {kRampAt, kLow}, {kRampAt + kRamp, kHigh}}};
  stage::TransientOptions o;
  o.stop = 12 * kDelay;
  o.max_step = kDelay / 100;
  o.signals = {stage::SignalRef::current("rc")};
  stage::SolverOptions tight;
  tight.relative_tolerance = 1e-7;
  const auto r = stage::run_transient(c, o, tight);

  const auto base_current = [&](double t) {
    if (t <= kRampAt) return kLow;
    if (t >= kRampAt + kRamp) return kHigh;
    return kLow + (kHigh - kLow) * (t - kRampAt) / kRamp;
  };
  using State = std::array<double, 2>;  // i, tau i'
  const auto rhs = [&](const State& y, State& dy, double t) {
    dy[0] = y[1] / kDelay;
    dy[1] = 3 * (kBeta * base_current(t) - y[0] - y[1]) / kDelay;
  };
  namespace odeint = boost::numeric::odeint;
  State y{kBeta * kLow, 0};
  std::vector<double> reference;
  odeint::integrate_times(
      odeint::make_dense_output(1e-14, 1e-12, odeint::runge_kutta_dopri5<State>()), rhs, y,
      r.time.begin(), r.time.end(), kDelay / 1000,
      [&](const State& s, double) { reference.push_back(s[0]); });
  ASSERT_EQ(reference.size(), r.time.size());
  const auto& ic = r.signal("rc.current");
  double worst = 0, peak = 0;
  for (std::size_t k = 0; k < ic.size(); ++k) {
    worst = std::max(worst, std::abs(ic[k] - reference[k]));
    peak = std::max(peak, ic[k]);
  }
  // TR-BDF2 at these steps and tolerances: 1e-5 of the 1.5 mA step (found
  // 2.4e-6).
  const double step = kBeta * (kHigh - kLow);
  EXPECT_LT(worst, 1e-5 * step);
  // A step's overshoot is exp(-pi zeta / sqrt(1 - zeta^2)) = 0.43 % at zeta =
  // sqrt(3)/2 (second-order step response, any control text); the 0.2 tau
  // ramp lowers it by under 1 % of itself.
  const double zeta = std::sqrt(3.0) / 2;
  const double overshoot = std::exp(-std::numbers::pi * zeta / std::sqrt(1 - zeta * zeta));
  EXPECT_NEAR((peak - kBeta * kHigh) / step, overshoot, 0.01 * overshoot);
}

}  // namespace
