// Linear DC operating points against results worked by hand.
#include <gtest/gtest.h>

#include "stage/bias.hpp"
#include "stage/errors.hpp"

namespace {

using stage::Circuit;

// Voltage divider: v = V * R2 / (R1 + R2) (Ohm's law).
TEST(LinearDc, DividerAndSourceCurrent) {
  Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 10.0});
  c.add("r1", stage::Resistor{"in", "mid", 3e3});
  c.add("r2", stage::Resistor{"mid", "gnd", 1e3});
  const auto bias = stage::run_bias(c);
  EXPECT_NEAR(bias.voltage("mid"), 2.5, 1e-12);
  // The source delivers 10 V / 4 kOhm = 2.5 mA out of its positive terminal.
  EXPECT_NEAR(bias.current("v1"), 2.5e-3, 1e-15);
  EXPECT_NEAR(bias.supplies.front().power, 25e-3, 1e-14);
  EXPECT_LT(bias.max_kcl_residual, 1e-15);
}

}  // namespace
