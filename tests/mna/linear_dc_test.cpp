// Linear DC operating points against results worked by hand: dividers,
// superposition, Thevenin equivalents, a Wheatstone bridge, an R-2R ladder
// and each controlled source. Every solution's KCL residual is checked too.
#include <gtest/gtest.h>

#include <cmath>

#include "stage/bias.hpp"

namespace {

using stage::Circuit;
using stage::Resistor;
using stage::VoltageSource;

// Rounding of a solve with well-conditioned small matrices: a few ulps of the
// largest voltage; KCL residuals are then a few ulps of the branch currents.
constexpr double kVoltageTolerance = 1e-12;
constexpr double kResidualTolerance = 1e-15;

// Voltage divider: v = V R2 / (R1 + R2) (Ohm's law).
TEST(LinearDc, DividerAndSourceCurrent) {
  Circuit c;
  c.add("v1", VoltageSource{"in", "gnd", 10.0});
  c.add("r1", Resistor{"in", "mid", 3e3});
  c.add("r2", Resistor{"mid", "gnd", 1e3});
  const auto bias = stage::run_bias(c);
  EXPECT_NEAR(bias.voltage("mid"), 2.5, kVoltageTolerance);
  // The source delivers 10 V / 4 kOhm = 2.5 mA out of its positive terminal.
  EXPECT_NEAR(bias.current("v1"), 2.5e-3, 1e-15);
  EXPECT_NEAR(bias.supplies.front().power, 25e-3, 1e-14);
  EXPECT_NEAR(bias.current("r1"), 2.5e-3, 1e-15);
  EXPECT_LT(bias.max_kcl_residual, kResidualTolerance);
  EXPECT_EQ(bias.newton_iterations, 1);
}

// Superposition (hand analysis): a 12 V source through 2 k and a 1 mA current
// source into node m, with 4 k from m to ground.
// From the voltage source alone: 12 * 4/6 = 8 V; from the current source
// alone: 1 mA * (2k || 4k) = 1.3333 V; together 9.3333 V.
TEST(LinearDc, Superposition) {
  Circuit c;
  c.add("v1", VoltageSource{"a", "gnd", 12.0});
  c.add("r1", Resistor{"a", "m", 2e3});
  c.add("r2", Resistor{"m", "gnd", 4e3});
  c.add("i1", stage::CurrentSource{"gnd", "m", 1e-3});
  const auto bias = stage::run_bias(c);
  EXPECT_NEAR(bias.voltage("m"), 8.0 + 4.0 / 3.0, kVoltageTolerance);
  // The current source delivers I * (v(m) - v(gnd)).
  EXPECT_NEAR(bias.supplies.back().power, 1e-3 * (8.0 + 4.0 / 3.0), 1e-15);
  EXPECT_LT(bias.max_kcl_residual, kResidualTolerance);
}

// Thevenin (hand analysis): the network of Superposition seen from m has
// Vth = 9.3333 V and Rth = 2k || 4k = 1333.3 ohm; a 1 k load then sits at
// Vth * 1k / (1k + Rth).
TEST(LinearDc, TheveninEquivalentPredictsLoadedVoltage) {
  Circuit c;
  c.add("v1", VoltageSource{"a", "gnd", 12.0});
  c.add("r1", Resistor{"a", "m", 2e3});
  c.add("r2", Resistor{"m", "gnd", 4e3});
  c.add("i1", stage::CurrentSource{"gnd", "m", 1e-3});
  c.add("rl", Resistor{"m", "gnd", 1e3});
  const double vth = 8.0 + 4.0 / 3.0, rth = 2e3 * 4e3 / 6e3;
  EXPECT_NEAR(stage::run_bias(c).voltage("m"), vth * 1e3 / (1e3 + rth), kVoltageTolerance);
}

// A balanced Wheatstone bridge (R1/R2 = R3/R4) carries no current in its
// detector arm, whatever that arm's resistance.
TEST(LinearDc, BalancedWheatstoneBridge) {
  Circuit c;
  c.add("v1", VoltageSource{"top", "gnd", 5.0});
  c.add("r1", Resistor{"top", "left", 1e3});
  c.add("r2", Resistor{"left", "gnd", 2.2e3});
  c.add("r3", Resistor{"top", "right", 4.7e3});
  c.add("r4", Resistor{"right", "gnd", 4.7e3 * 2.2});
  c.add("detector", Resistor{"left", "right", 100.0});
  const auto bias = stage::run_bias(c);
  EXPECT_NEAR(bias.current("detector"), 0.0, 1e-15);
  EXPECT_NEAR(bias.voltage("left"), 5.0 * 2.2 / 3.2, kVoltageTolerance);
}

// An R-2R ladder DAC: with bit k driven to Vref and the others grounded, the
// output is Vref * 2^k / 2^N (the ladder's exact binary weights, any
// textbook on data converters). Bits run from the 2R leg at the far end (k = 0).
TEST(LinearDc, R2RLadderBinaryWeights) {
  constexpr int kBits = 8;
  constexpr double kR = 10e3, kVref = 2.56;
  for (int k = 0; k < kBits; ++k) {
    Circuit c;
    c.add("termination", Resistor{"n0", "gnd", 2 * kR});
    for (int b = 0; b < kBits; ++b) {
      const std::string node = "n" + std::to_string(b), bit = "b" + std::to_string(b);
      c.add("leg" + std::to_string(b), Resistor{node, bit, 2 * kR});
      c.add("v" + std::to_string(b), VoltageSource{bit, "gnd", b == k ? kVref : 0.0});
      if (b + 1 < kBits)
        c.add("rung" + std::to_string(b), Resistor{node, "n" + std::to_string(b + 1), kR});
    }
    const auto bias = stage::run_bias(c);
    const double expected = kVref * std::ldexp(1.0, k) / std::ldexp(1.0, kBits);
    EXPECT_NEAR(bias.voltage("n" + std::to_string(kBits - 1)), expected, kVoltageTolerance) << k;
    EXPECT_LT(bias.max_kcl_residual, kResidualTolerance);
  }
}

// Controlled sources, each against its defining equation (spec section 3).
TEST(LinearDc, VoltageControlledVoltageSource) {
  Circuit c;
  c.add("v1", VoltageSource{"in", "gnd", 0.25});
  c.add("e1", stage::VoltageControlledVoltageSource{"out", "gnd", "in", "gnd", -8.0});
  c.add("rl", Resistor{"out", "gnd", 1e3});
  const auto bias = stage::run_bias(c);
  EXPECT_NEAR(bias.voltage("out"), -2.0, kVoltageTolerance);
  // It delivers v(out)/RL = -2 mA out of its positive terminal.
  EXPECT_NEAR(bias.current("e1"), -2e-3, 1e-15);
}

TEST(LinearDc, VoltageControlledCurrentSource) {
  Circuit c;
  c.add("v1", VoltageSource{"in", "gnd", 0.5});
  // 2 mS * 0.5 V = 1 mA from gnd through the source into out, across 2 k.
  c.add("g1", stage::VoltageControlledCurrentSource{"gnd", "out", "in", "gnd", 2e-3});
  c.add("rl", Resistor{"out", "gnd", 2e3});
  EXPECT_NEAR(stage::run_bias(c).voltage("out"), 2.0, kVoltageTolerance);
}

TEST(LinearDc, CurrentControlledCurrentSource) {
  Circuit c;
  c.add("v1", VoltageSource{"in", "gnd", 1.0});
  c.add("r1", Resistor{"in", "gnd", 1e3});  // v1 delivers 1 mA
  c.add("f1", stage::CurrentControlledCurrentSource{"gnd", "out", "v1", 50.0});
  c.add("rl", Resistor{"out", "gnd", 100.0});
  // 50 * 1 mA into out across 100 ohm.
  EXPECT_NEAR(stage::run_bias(c).voltage("out"), 5.0, kVoltageTolerance);
}

TEST(LinearDc, CurrentControlledVoltageSource) {
  Circuit c;
  c.add("v1", VoltageSource{"in", "gnd", 3.0});
  c.add("r1", Resistor{"in", "gnd", 1.5e3});  // v1 delivers 2 mA
  c.add("h1", stage::CurrentControlledVoltageSource{"out", "gnd", "v1", 1e3});
  c.add("rl", Resistor{"out", "gnd", 10e3});
  EXPECT_NEAR(stage::run_bias(c).voltage("out"), 2.0, kVoltageTolerance);
}

// An inductor is a short at DC carrying the loop current; a capacitor is open.
TEST(LinearDc, InductorShortCapacitorOpen) {
  Circuit c;
  c.add("v1", VoltageSource{"in", "gnd", 6.0});
  c.add("l1", stage::Inductor{"in", "mid", 1e-3});
  c.add("r1", Resistor{"mid", "gnd", 3e3});
  c.add("c1", stage::Capacitor{"mid", "gnd", 1e-6});
  const auto bias = stage::run_bias(c);
  EXPECT_NEAR(bias.voltage("mid"), 6.0, kVoltageTolerance);
  EXPECT_NEAR(bias.current("l1"), 2e-3, 1e-15);
}

}  // namespace
