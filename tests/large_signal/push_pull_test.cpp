// Push-pull output stages of our own values (tests/headroom/stages.hpp):
// crossover dead zone, the distortion it causes and how bias removes it,
// and the efficiency of class A (class B's is in clip_test.cpp).
#include <gtest/gtest.h>

#include <cmath>

#include "stage/bias.hpp"
#include "stage/characterize.hpp"
#include "stage/spectrum.hpp"
#include "stage/transient.hpp"
#include "stages.hpp"

namespace {

using stage::SignalRef;

// Class B conducts only once the drive exceeds one VBE: extrapolating the
// linear part of the DC transfer back to zero output finds the edge of the
// dead zone, about 0.6 to 0.7 V each side (common practice).
TEST(PushPull, ClassBDeadZoneIsAboutOneVbeEachSide) {
  stage::SweepOptions sweep;
  sweep.name = "vin";
  for (double v = -4.0; v <= 4.0 + 1e-9; v += 0.5) sweep.values.push_back(v);
  const auto result = stage::run_sweep(stage::testing::class_b_pair(), sweep);
  auto out = [&](std::size_t k) { return result.points[k].bias.voltage("out"); };
  const std::size_t last = result.points.size() - 1;
  // Through the points at 3 V and 4 V (and -3 V, -4 V).
  const double slope_pos = (out(last) - out(last - 2)) / 1.0;
  const double edge_pos = 4.0 - out(last) / slope_pos;
  const double slope_neg = (out(0) - out(2)) / -1.0;
  const double edge_neg = -4.0 - out(0) / slope_neg;
  EXPECT_GT(edge_pos, 0.6);
  EXPECT_LT(edge_pos, 0.7);
  EXPECT_LT(edge_neg, -0.6);
  EXPECT_GT(edge_neg, -0.7);
  // Inside the dead zone the output barely moves: at 0.5 V in, under 10 mV.
  EXPECT_LT(std::abs(result.points[9].bias.voltage("out")), 0.01);
}

double thd_of(const stage::Circuit& circuit) {
  stage::TransientOptions t;
  t.stop = 5e-3;
  t.max_step = 5e-6;
  const auto transient = stage::run_transient(circuit, t);
  return stage::run_spectrum(transient, {SignalRef::node("out"), 1e3, 9}).thd;
}

// At a low level (1 V peak drive) crossover distortion dominates class B;
// two diodes of bias remove it. The issue asks for at least a tenfold
// reduction; the gap is far larger (measured 0.42 against 1.3e-4).
TEST(PushPull, ClassAbBiasCutsLowLevelDistortionTenfold) {
  const double class_b = thd_of(stage::testing::class_b_pair(1.0));
  const double class_ab = thd_of(stage::testing::class_ab_pair(1.0));
  EXPECT_GT(class_b, 0.1);  // the dead zone eats 0.6 V of each 1 V peak
  EXPECT_LT(10 * class_ab, class_b);
}

stage::CharacterizeResult characterize(const stage::Circuit& circuit) {
  return stage::run_characterize(circuit, {"vin", SignalRef::node("out"), 1e3, "rl"});
}

// Class A with the load as the emitter resistor cannot exceed 25 % (series
// fed resistive load: Sedra and Smith); its efficiency is the signal power
// V1^2 / (2 RL) over VCC times the mean supply current. Read at the edge of
// the 1 % limit, where the waveform is still a sine.
TEST(PushPull, ClassAFollowerStaysBelowAQuarter) {
  const auto r = characterize(stage::testing::class_a_emitter_load());
  ASSERT_TRUE(r.limit_swing);
  const auto& s = *r.limit_swing;
  EXPECT_LT(s.efficiency, 0.25);
  EXPECT_GT(s.efficiency, 0.20);  // near full swing it approaches the bound
  // Signal power against the fundamental alone: the harmonics (THD under 1 %)
  // carry less than 1e-4 of it.
  EXPECT_NEAR(s.load_power, s.output_amplitude * s.output_amplitude / (2 * 100.0),
              1e-3 * s.load_power);
}

}  // namespace
