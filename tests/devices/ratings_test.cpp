// Maximum ratings of a bipolar transistor: the linear derating of its
// dissipation, the safe-operating-area boundary, and the checks a bias point
// and a transient make against them.
#include "devices/ratings.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "stage/characterize.hpp"
#include "stage/reader.hpp"
#include "stage/run.hpp"

namespace {

using stage::BipolarModel;
using stage::devices::derated_dissipation;
using stage::devices::safe_area_current;

constexpr double kZeroCelsius = 273.15;

// A generic power transistor's ratings (invented round figures for the test,
// not any product's): 60 V, 4 A, 40 W at a 25 °C case, 150 °C junction,
// second breakdown from 20 V down to 0.1 A at 60 V.
BipolarModel rated_model() {
  BipolarModel m;
  m.max_collector_emitter_voltage = 60;
  m.max_collector_current = 4;
  m.max_dissipation = 40;
  m.rated_case_temperature = kZeroCelsius + 25;
  m.max_junction_temperature = kZeroCelsius + 150;
  m.second_breakdown_voltage = 20;
  m.second_breakdown_current = 0.1;
  return m;
}

// Linear derating as handbooks state it: above the rated case temperature
// the allowed dissipation falls by P_max / (Tj,max - Tc,rated) per kelvin,
// the inverse junction-to-case thermal resistance, reaching zero at Tj,max.
TEST(Ratings, DissipationDeratesLinearlyToZeroAtTheMaximumJunctionTemperature) {
  const BipolarModel m = rated_model();
  const double per_kelvin = 40.0 / (150 - 25);  // 0.32 W/K, R_th(j-c) = 3.125 K/W
  EXPECT_DOUBLE_EQ(derated_dissipation(m, kZeroCelsius + 0), 40);
  EXPECT_DOUBLE_EQ(derated_dissipation(m, kZeroCelsius + 25), 40);
  EXPECT_NEAR(derated_dissipation(m, kZeroCelsius + 100), 40 - per_kelvin * 75, 1e-12);
  EXPECT_NEAR(derated_dissipation(m, kZeroCelsius + 150), 0, 1e-12);
  EXPECT_EQ(derated_dissipation(m, kZeroCelsius + 175), 0);
}

// The boundary: the current rating, then the power hyperbola P/V, then the
// second-breakdown line, straight on log axes from (20 V, 2 A) on the
// hyperbola to (60 V, 0.1 A).
TEST(Ratings, SafeAreaFollowsCurrentPowerAndSecondBreakdown) {
  const BipolarModel m = rated_model();
  const double tc = kZeroCelsius + 25;
  EXPECT_DOUBLE_EQ(safe_area_current(m, 5, tc), 4);           // 40 W / 5 V = 8 A > 4 A
  EXPECT_DOUBLE_EQ(safe_area_current(m, 15, tc), 40.0 / 15);  // on the hyperbola
  EXPECT_NEAR(safe_area_current(m, 20, tc), 2, 1e-12);        // the corner
  EXPECT_NEAR(safe_area_current(m, 60, tc), 0.1, 1e-12);      // the segment's end
  // Midway on log axes the current is the geometric mean of the ends'.
  const double v_mid = std::sqrt(20.0 * 60.0);
  EXPECT_NEAR(safe_area_current(m, v_mid, tc), std::sqrt(2 * 0.1), 1e-12);
  // A hot case lowers the hyperbola, not the second-breakdown line (spec).
  EXPECT_NEAR(safe_area_current(m, 10, kZeroCelsius + 100), (40 - 0.32 * 75) / 10, 1e-12);
}

// A transistor held at VCE = 40 V whose base is pulsed: at 0.25 A it stays
// inside the current and power ratings (about 9.4 W of 10 W) but crosses the
// second-breakdown line, 0.134 A at 37.5 V; at 0.09 A it stays inside.
std::string pulsed_stage(double high_volts) {
  return "model hot = npn { saturation_current = 10 fA, beta_forward = 100,\n"
         "  max_collector_emitter_voltage = 60 V, max_collector_current = 1 A,\n"
         "  max_dissipation = 10 W, max_junction_temperature = 150 °C,\n"
         "  second_breakdown_voltage = 20 V, second_breakdown_current = 50 mA }\n"
         "vcc = voltage(c, gnd, 40 V)\n"
         "vb = voltage(b, gnd, wave = pulse(low = 0 V, high = " +
         std::to_string(high_volts) +
         " V, period = 1 ms, high_time = 100 us, rise = 1 us, fall = 1 us, delay = 200 us))\n"
         "q1 = npn(c, b, e, model = hot)\n"
         "re = resistor(e, gnd, 10 Ω)\n"
         "analyze bias()\n"
         "analyze transient(stop = 600 us)\n";
}

TEST(Ratings, TransientCrossingSecondBreakdownIsFlaggedWithItsTime) {
  const auto run = stage::run_deck(stage::read_text(pulsed_stage(3.2), "pulsed.stage"));
  const auto& bias = std::get<stage::BiasResult>(run.analyses[0]);
  EXPECT_TRUE(bias.rating_violations.empty());  // the base sits at 0 V
  // Beside the dissipation, its rating at the circuit's 27 °C, derated
  // linearly from 25 °C: 10 W (150 - 27) / (150 - 25).
  EXPECT_NEAR(bias.bipolars.front().rated_dissipation, 10.0 * 123 / 125, 1e-9);
  const auto& transient = std::get<stage::TransientResult>(run.analyses[1]);
  ASSERT_EQ(transient.rating_violations.size(), 1u);
  const auto& v = transient.rating_violations.front();
  EXPECT_EQ(v.device, "q1");
  EXPECT_EQ(v.quantity, "safe_operating_area");
  // The collector current crosses the line on the pulse's rising edge,
  // which runs from 200 us to 201.25 us (1.25 x its 10-90 % time, spec);
  // the check is made at each accepted point, so the first one past it.
  EXPECT_GT(v.first_time, 200e-6);
  EXPECT_LE(v.first_time, 201.25e-6 * (1 + 1e-9));
  EXPECT_GT(v.worst_time, v.first_time);
  EXPECT_LT(v.worst_time, 301e-6);
  // Worst: IE = (3.2 V - VBE) / 10 ohm, about 0.245 A at VCE near 37.5 V,
  // against the boundary there (the line through (20 V, 0.5 A) and
  // (60 V, 50 mA) on log axes).
  const double slope = std::log(0.05 / 0.5) / std::log(3.0);
  const double vce = 40 - 10 * v.value * 1.01;  // the emitter carries IC (1 + 1/beta)
  EXPECT_NEAR(v.limit, 0.5 * std::pow(vce / 20, slope), 1e-3 * v.limit);
  EXPECT_GT(v.value, 0.23);
  EXPECT_LT(v.value, 0.25);
  EXPECT_TRUE(run.exceeds_ratings());
}

TEST(Ratings, TransientInsideTheSafeAreaIsNotFlagged) {
  const auto run = stage::run_deck(stage::read_text(pulsed_stage(1.6), "pulsed.stage"));
  EXPECT_TRUE(std::get<stage::TransientResult>(run.analyses[1]).rating_violations.empty());
  EXPECT_FALSE(run.exceeds_ratings());
}

// At a bias point: a 40 V supply across a transistor rated for 30 V.
TEST(Ratings, BiasPointOverVoltageIsFlagged) {
  const std::string text =
      "model low_voltage = npn { max_collector_emitter_voltage = 30 V, max_dissipation = 1 W }\n"
      "vcc = voltage(c, gnd, 40 V)\nvb = voltage(b, gnd, 0.65 V)\n"
      "q1 = npn(c, b, gnd, model = low_voltage)\nanalyze bias()\n";
  const auto run = stage::run_deck(stage::read_text(text, "over.stage"));
  const auto& bias = std::get<stage::BiasResult>(run.analyses[0]);
  ASSERT_EQ(bias.rating_violations.size(), 1u);
  const auto& v = bias.rating_violations.front();
  EXPECT_EQ(v.quantity, "collector_emitter_voltage");
  EXPECT_DOUBLE_EQ(v.value, 40);
  EXPECT_DOUBLE_EQ(v.limit, 30);
  EXPECT_TRUE(std::isnan(v.first_time));
}

// A second-breakdown segment needs both its ends; a derating needs a
// maximum junction temperature above the rated case temperature.
TEST(Ratings, IncompleteRatingsAreInputErrors) {
  const std::string circuit =
      "vcc = voltage(c, gnd, 10 V)\nq1 = npn(c, c, gnd, model = m)\n"
      "analyze bias()\n";
  for (const std::string& ratings :
       {std::string("second_breakdown_voltage = 20 V, max_dissipation = 10 W"),
        std::string("max_dissipation = 1 W, max_junction_temperature = 20 °C")}) {
    try {
      stage::check_deck(
          stage::read_text("model m = npn { " + ratings + " }\n" + circuit, "bad.stage"));
      ADD_FAILURE() << ratings;
    } catch (const stage::Error& e) {
      EXPECT_EQ(e.kind(), stage::ErrorKind::input) << e.what();
      EXPECT_NE(std::string(e.what()).find("model 'm'"), std::string::npos) << e.what();
    }
  }
}

// The follower example with its transistor rated for 6 mA: biased at
// 4.2 mA it is within the rating, but at full swing its collector current
// swings along the AC load line to at least ICQ + A / R'ac (A the output's
// fundamental, R'ac = 2.2 kohm || 32 ohm; textbook AC load line), more on
// the side that does not clip, and the swing reports the excess.
TEST(Ratings, CharacterizeSwingsAreChecked) {
  const std::string text =
      "include \"transistors.stage\"\n"
      "model rated = power_npn { max_collector_current = 6 mA }\n"
      "vpos = voltage(vpos, gnd, 12 V)\nvneg = voltage(vneg, gnd, -12 V)\n"
      "vin = voltage(in, gnd, dc = 0 V, ac = 1 V)\ncin = capacitor(in, base, 10 uF)\n"
      "rb = resistor(base, gnd, 47 kΩ)\nq1 = npn(vpos, base, emitter, model = rated)\n"
      "re = resistor(emitter, vneg, 2.2 kΩ)\ncout = capacitor(emitter, out, 2200 uF)\n"
      "rl = resistor(out, gnd, 32 Ω)\n"
      "analyze characterize(input = vin, output = out, frequency = 1 kHz, load = rl)\n";
  const auto run = stage::run_deck(stage::read_text(text, "rated_follower.stage"));
  const auto& r = std::get<stage::CharacterizeResult>(run.analyses[0]);
  EXPECT_TRUE(r.bias.rating_violations.empty());
  ASSERT_TRUE(r.full_swing.has_value());
  ASSERT_EQ(r.full_swing->rating_violations.size(), 1u);
  const auto& v = r.full_swing->rating_violations.front();
  EXPECT_EQ(v.quantity, "collector_current");
  EXPECT_DOUBLE_EQ(v.limit, 6e-3);
  const double r_ac = 2200.0 * 32 / (2200 + 32);
  const double along_load_line =
      r.bias.bipolars.front().collector_current + r.full_swing->output_amplitude / r_ac;
  EXPECT_GT(along_load_line, 6e-3);
  EXPECT_GE(v.value, along_load_line);
  EXPECT_TRUE(run.exceeds_ratings());
}

}  // namespace
