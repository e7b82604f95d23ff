// The shared conversion constants against the definitions they come from
// (each named beside its check).
#include "common/constants.hpp"

#include <gtest/gtest.h>

#include <numbers>

#include "stage/models.hpp"

namespace {

using namespace stage;

TEST(Constants, CelsiusOffset) {
  // T / K = t / °C + 273.15 (SI brochure 2.3.1): the room temperature the
  // models default to, 27 °C, is 300.15 K.
  EXPECT_DOUBLE_EQ(27 + kZeroCelsius, kRoomTemperature);
}

TEST(Constants, AnglesAndTurns) {
  // 180° = π rad; a turn is 2π rad (definitions).
  EXPECT_DOUBLE_EQ(degrees_from_radians(std::numbers::pi), 180.0);
  EXPECT_DOUBLE_EQ(radians_from_degrees(90.0), std::numbers::pi / 2);
  EXPECT_DOUBLE_EQ(degrees_from_radians(kTwoPi), 360.0);
}

TEST(Constants, DecibelsOfAnAmplitudeRatio) {
  // 20 log10: a tenfold amplitude is 20 dB, twice is 6.0206 dB (IEC 60027-3).
  EXPECT_DOUBLE_EQ(db_from_amplitude_ratio(10.0), 20.0);
  EXPECT_NEAR(db_from_amplitude_ratio(2.0), 6.0206, 1e-4);
  EXPECT_DOUBLE_EQ(amplitude_ratio_from_db(-20.0), 0.1);
  EXPECT_DOUBLE_EQ(db_from_amplitude_ratio(amplitude_ratio_from_db(-1.0)), -1.0);
}

TEST(Constants, Percent) {
  // % = 0.01 (ISO 80000-1).
  EXPECT_DOUBLE_EQ(kPercent * 5, 0.05);
  EXPECT_DOUBLE_EQ(in_percent(0.05), 5.0);
}

}  // namespace
