// The pulse of spec section 3 as a designer gives it (levels, period, time
// high at half amplitude, 10-90 % edges, delay): its values and corners
// follow from linear edges, a 50 % duty wave averages to the middle of its
// levels, and impossible combinations are named.
#include "stage/waveform.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace {

using stage::PulseWave;

// Times in seconds chosen as binary fractions so that every sum below is
// exact: edges 2 s and 4 s (10-90 %) span 2.5 s and 5 s level to level
// (a linear edge covers 80 % of its swing in its 10-90 % time), and the flat
// top is 6 - (2.5 + 5) / 2 = 2.25 s.
constexpr PulseWave kPulse{
    .low = -1, .high = 3, .period = 16, .high_time = 6, .rise = 2, .fall = 4, .delay = 1};

TEST(Pulse, ShapeFollowsFromLinearEdges) {
  const stage::PulseShape shape = stage::pulse_shape(kPulse);
  EXPECT_EQ(shape.rise, 2.5);  // 2 s / 0.8
  EXPECT_EQ(shape.fall, 5.0);  // 4 s / 0.8
  EXPECT_EQ(shape.top, 2.25);  // 6 s - (2.5 s + 5 s) / 2
}

// Half amplitude (1 V) is crossed mid-edge, 6 s apart (the high time); the
// 10 % and 90 % levels of the rising edge are 2 s apart (its 10-90 % time).
// Linear edges: value = low + (high - low) * fraction of the edge.
TEST(Pulse, HalfAmplitudeAndTenNinetyPointsAreWhereTheDesignerPutThem) {
  const stage::Waveform wave = kPulse;
  const double rising_mid = 1 + 2.5 / 2, falling_mid = 1 + 2.5 + 2.25 + 5.0 / 2;
  EXPECT_EQ(stage::waveform_value(wave, rising_mid), 1.0);
  EXPECT_EQ(stage::waveform_value(wave, falling_mid), 1.0);
  EXPECT_EQ(falling_mid - rising_mid, kPulse.high_time);
  EXPECT_DOUBLE_EQ(stage::waveform_value(wave, 1 + 0.1 * 2.5), -1 + 0.1 * 4);
  EXPECT_DOUBLE_EQ(stage::waveform_value(wave, 1 + 0.9 * 2.5), -1 + 0.9 * 4);
  EXPECT_EQ(stage::waveform_value(wave, 0.5), -1.0);       // before the delay
  EXPECT_EQ(stage::waveform_value(wave, 1 + 3.0), 3.0);    // on the flat top
  EXPECT_EQ(stage::waveform_value(wave, 1 + 12.0), -1.0);  // low after the fall
  EXPECT_EQ(stage::waveform_value(wave, 17 + 3.0), 3.0);   // one period later
}

// Corners: each period's edge starts and ends, delay + k * period + (0, 2.5,
// 4.75, 9.75), within (0, 40].
TEST(Pulse, CornersAreTheEdgeStartsAndEnds) {
  std::vector<double> corners;
  stage::waveform_corners(kPulse, 0.0, 40.0, corners);
  const std::vector<double> expected = {1,     3.5,   5.75, 10.75, 17,   19.5,
                                        21.75, 26.75, 33,   35.5,  37.75};
  EXPECT_EQ(corners, expected);
}

// Mean over one period by the trapezoid rule between the corners, exact for
// a piecewise-linear wave up to rounding.
double mean_over_a_period(const PulseWave& w) {
  std::vector<double> times = {w.delay};
  stage::waveform_corners(w, w.delay, w.delay + w.period, times);
  double area = 0;
  for (std::size_t k = 1; k < times.size(); ++k) {
    const double a = stage::waveform_value(w, times[k - 1]);
    const double b = stage::waveform_value(w, std::nextafter(times[k], times[k - 1]));
    area += 0.5 * (a + b) * (times[k] - times[k - 1]);
  }
  return area / w.period;
}

// A linear edge's area is its duration times the mean of its ends, so a
// period holds low * T + (high - low) * (rise/2 + top + fall/2) = low * T +
// (high - low) * high_time: a 50 % duty wave averages to (low + high) / 2
// whatever its edges.
TEST(Pulse, FiftyPercentDutyAveragesToTheMiddleOfItsLevels) {
  const std::pair<double, double> edges[] = {{0.0, 0.0}, {30e-6, 70e-6}, {200e-6, 100e-6}};
  for (const auto& [rise, fall] : edges) {
    const PulseWave w{.low = -1.5,
                      .high = 3.25,
                      .period = 1e-3,
                      .high_time = 0.5 * 1e-3,
                      .rise = rise,
                      .fall = fall,
                      .delay = 0.1e-3};
    EXPECT_NEAR(mean_over_a_period(w), (w.low + w.high) / 2, 1e-14) << rise << " " << fall;
  }
}

TEST(Pulse, ImpossibleCombinationsAreNamed) {
  PulseWave w = kPulse;
  EXPECT_EQ(stage::pulse_problem(w), "");
  w.high_time = 0.625 * (2 + 4);  // a triangle: no flat top, still drawable
  EXPECT_EQ(stage::pulse_problem(w), "");
  w.high_time = 3.5;  // below 0.625 * (rise + fall) = 3.75
  EXPECT_NE(stage::pulse_problem(w).find("high_time"), std::string::npos);
  w = kPulse;
  w.period = 6 + 3.75;  // exactly high_time + 0.625 * (rise + fall)
  EXPECT_EQ(stage::pulse_problem(w), "");
  w.period = 9.5;
  EXPECT_NE(stage::pulse_problem(w).find("period"), std::string::npos);
  w = kPulse;
  w.rise = -1;
  EXPECT_NE(stage::pulse_problem(w).find("0 or more"), std::string::npos);
  w = kPulse;
  w.period = 0;
  EXPECT_NE(stage::pulse_problem(w).find("positive period"), std::string::npos);
  w = kPulse;
  w.high = std::numeric_limits<double>::quiet_NaN();
  EXPECT_NE(stage::pulse_problem(w).find("finite"), std::string::npos);
}

}  // namespace
