// Model bodies written one parameter per line, as in the spec's section 4:
// a unitless value must not take the next line's parameter name as its unit.
#include <gtest/gtest.h>

#include "stage/reader.hpp"

namespace {

TEST(ModelBody, OneParameterPerLineWithoutCommas) {
  const auto deck = stage::read_text(R"(model small_npn = npn {
  saturation_current = 12 fA
  beta_forward       = 180
  beta_reverse       = 4
  early_voltage_forward = 90 V
}
)",
                                     "body.stage");
  const auto& m = deck.circuit.bipolar_models().at("small_npn");
  EXPECT_DOUBLE_EQ(m.saturation_current, 12e-15);
  EXPECT_DOUBLE_EQ(m.beta_forward, 180);
  EXPECT_DOUBLE_EQ(m.beta_reverse, 4);
  EXPECT_DOUBLE_EQ(m.early_voltage_forward, 90);
}

TEST(ModelBody, UnitStillReadOnTheSameLine) {
  const auto deck =
      stage::read_text("model d = diode {\n  junction_capacitance = 4 pF\n}\n", "unit.stage");
  EXPECT_DOUBLE_EQ(deck.circuit.diode_models().at("d").junction_capacitance, 4e-12);
}

// Excess phase is a delay in seconds (spec section 4).
TEST(ModelBody, ExcessPhaseIsADelayTime) {
  const auto deck =
      stage::read_text("model q = npn { excess_phase_delay = 150 ps }\n", "delay.stage");
  EXPECT_DOUBLE_EQ(deck.circuit.bipolar_models().at("q").excess_phase_delay, 150e-12);
}

}  // namespace
