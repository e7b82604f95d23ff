// Power-up: a transient from the zero state (start = zero) of a circuit
// whose supply forces charges at t = 0, a chain of charge-storing emitter
// followers. The start's charge derivative used to carry the supply's
// switch-on impulse, and every first step was rejected down to the minimum;
// and the trapezoidal rule's charge derivative on the supply's row rang and
// held the step small to the end.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>

#include "follower_chain.hpp"
#include "reference.hpp"
#include "stage/bias.hpp"
#include "stage/transient.hpp"

namespace {

using stage::Integration;

class PowerUp : public ::testing::TestWithParam<Integration> {};

constexpr int kStages = 2;

// Two capacitor-coupled followers as a designer powers them up: the source
// straight into the first coupling capacitor (so its current carries the
// switch-on impulse), 100k/100k dividers, 4.7k emitter resistors, and a
// charge-storing transistor with generic textbook-typical values (not any
// real part). The coupling capacitors are 10 nF and the output's 100 nF
// into 10 kohm, so the slowest time constant is 1 ms: after 20 ms what is
// left of the power-up is e^-20 of a few volts, ~1e-8 V, and every node
// must sit on the DC operating point from run_bias within 10 uV, ten times
// the integrator's 1 uV absolute tolerance (DC operating point reference).
stage::Circuit powered_followers() {
  stage::BipolarModel npn = stage::testing::chain_transistor(0);
  npn.knee_current_forward = 0.1;
  npn.cs_capacitance = 2e-12;
  npn.reverse_transit_time = 20e-9;
  stage::Circuit c;
  c.add_model("npn", npn);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
  c.add("vin", stage::VoltageSource{"e0", "gnd", 0.0});
  for (int k = 1; k <= kStages; ++k) {
    const std::string s = std::to_string(k), before = "e" + std::to_string(k - 1);
    c.add("c" + s, stage::Capacitor{before, "b" + s, 10e-9});
    c.add("rt" + s, stage::Resistor{"vcc", "b" + s, 100e3});
    c.add("rb" + s, stage::Resistor{"b" + s, "gnd", 100e3});
    c.add("q" + s, stage::Bipolar{stage::Polarity::npn, "vcc", "b" + s, "e" + s, {}, "npn"});
    c.add("re" + s, stage::Resistor{"e" + s, "gnd", 4.7e3});
  }
  c.add("cout", stage::Capacitor{"e" + std::to_string(kStages), "out", 100e-9});
  c.add("rl", stage::Resistor{"out", "gnd", 10e3});
  return c;
}

stage::TransientResult power_up(Integration integration) {
  stage::TransientOptions o;
  o.stop = 20e-3;
  o.start = stage::TransientStart::zero;
  return stage::run_transient(powered_followers(), o, stage::testing::solver(integration));
}

TEST_P(PowerUp, FollowersFromZeroSettleOnTheirBiasPoint) {
  const stage::Circuit c = powered_followers();
  const stage::TransientResult r = power_up(GetParam());
  RecordProperty("accepted_steps", r.accepted_steps);
  RecordProperty("rejected_steps", r.rejected_steps);

  const stage::BiasResult bias = stage::run_bias(c);
  // It did power up from zero: the first coupling capacitor starts near
  // 0 V, not at its bias value of about -5.5 V. Only the charge the
  // supply's switch-on forces through the junction capacitances (a few pF x
  // 12 V, tens of pC) reaches its 10 nF, tens of uV: below 1e-3 of the bias
  // value (hand estimate).
  const auto c1_voltage = [&](double e0, double b1) { return e0 - b1; };
  EXPECT_LT(std::abs(c1_voltage(r.signal("e0").front(), r.signal("b1").front())),
            1e-3 * std::abs(c1_voltage(bias.voltage("e0"), bias.voltage("b1"))));
  double worst = 0;
  for (int k = 1; k <= kStages; ++k) {
    for (const std::string& node : {"b" + std::to_string(k), "e" + std::to_string(k)}) {
      worst = std::max(worst, std::abs(r.signal(node).back() - bias.voltage(node)));
    }
  }
  worst = std::max(worst, std::abs(r.signal("out").back() - bias.voltage("out")));
  RecordProperty("worst_difference_V", std::to_string(worst));
  EXPECT_LT(worst, 10e-6);  // DC operating point from run_bias
}

// The supply's row holds only junction charges set by the nodes around it,
// so the trapezoidal rule's charge derivative there rang with factor -1 for
// ever after the switch-on and held the step at 0.7 us for the whole 20 ms
// (28,659 steps against BDF2's 228). Damped, it takes steps of the size its
// accuracy allows: with the same order and a smaller error constant than
// BDF2 (h^3/12 against 2h^3/9; Hairer, Norsett & Wanner, Solving ODEs I,
// section III.2) it needs no more steps on this smooth settling than BDF2;
// the factor 1.5 allows for the start and the damped steps (common
// practice). A step count, not a time.
TEST(PowerUpSteps, TrapezoidalRuleNeedsNoMoreStepsThanBdf2) {
  const stage::TransientResult trapezoidal = power_up(Integration::trapezoidal);
  const stage::TransientResult bdf2 = power_up(Integration::bdf2);
  RecordProperty("trapezoidal_steps", trapezoidal.accepted_steps);
  RecordProperty("trapezoidal_damped_steps", trapezoidal.damped_steps);
  RecordProperty("bdf2_steps", bdf2.accepted_steps);
  EXPECT_LE(trapezoidal.accepted_steps, 1.5 * bdf2.accepted_steps);  // error constants above
}

INSTANTIATE_TEST_SUITE_P(EveryMethod, PowerUp,
                         ::testing::Values(Integration::tr_bdf2, Integration::trapezoidal,
                                           Integration::bdf2),
                         stage::testing::integration_name);

}  // namespace
