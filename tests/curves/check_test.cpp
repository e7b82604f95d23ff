// Checking a model against reference curves: the model passes its own
// curves exactly, and a shifted model fails, naming the curve, the file line
// and the quantity of the worst point.
#include <gtest/gtest.h>

#include <limits>
#include <set>

#include "curve_builders.hpp"
#include "stage/errors.hpp"

namespace {

using namespace stage;
using namespace stage::testing;

Curve gummel_reference() {
  Curve c = reference(gummel_shape(), {"truth", round_trip_npn()});
  for (std::size_t i = 0; i < c.points.size(); ++i) c.points[i].line = 20 + static_cast<int>(i);
  return c;
}

// Exact round trip: the same model on the same fixture reproduces its own
// curve to the solver's precision.
TEST(CurveCheck, ModelPassesItsOwnCurve) {
  const auto r = check_curve(gummel_reference(), {"truth", round_trip_npn()});
  EXPECT_TRUE(r.passed()) << r.summary();
  EXPECT_LT(r.worst_error, 1e-8);
}

// A point whose error is not a number (a reference value that is none, as a
// curve built in code may hold) fails: a NaN is never within tolerance.
TEST(CurveCheck, AnErrorThatIsNotANumberFails) {
  Curve ref = gummel_reference();
  ref.points[3].measured[0] = std::numeric_limits<double>::quiet_NaN();
  const auto r = check_curve(ref, {"truth", round_trip_npn()});
  EXPECT_FALSE(r.passed()) << r.summary();
  EXPECT_EQ(r.failing_points, 1u);
  EXPECT_EQ(r.worst.line, ref.points[3].line);
}

// IC is proportional to the saturation current in the ideal region
// (Ebers–Moll), so 20 % more saturation current moves the mid-range IC by
// about 20 %, four times the default 5 % tolerance; the base current carries
// the same factor (IB = IC / beta there).
TEST(CurveCheck, ShiftedModelFailsAndNamesCurveAndPoint) {
  BipolarModel shifted = round_trip_npn();
  shifted.saturation_current *= 1.2;
  const Curve ref = gummel_reference();
  const auto r = check_curve(ref, {"shifted", shifted});
  ASSERT_FALSE(r.passed());
  EXPECT_NEAR(r.worst_error, 0.2, 0.02);
  const std::string text = r.summary();
  EXPECT_NE(text.find("gummel: "), std::string::npos) << text;
  EXPECT_NE(text.find("gummel.csv:" + std::to_string(r.worst.line) + ":"), std::string::npos)
      << text;
  EXPECT_NE(text.find("collector_current"), std::string::npos) << text;
  const std::string table = check_table(std::vector{r});
  EXPECT_NE(table.find("FAIL"), std::string::npos) << table;
}

// The table counts failing points (rows), not values: a 20 % larger
// saturation current moves IC and IB of a Gummel point alike (IB = IC / beta
// in the ideal region, Ebers–Moll), so points fail in both columns and the
// values out of tolerance outnumber the points.
TEST(CurveCheck, FailingPointsAreCountedOncePerRow) {
  BipolarModel shifted = round_trip_npn();
  shifted.saturation_current *= 1.2;
  const Curve ref = gummel_reference();
  const auto r = check_curve(ref, {"shifted", shifted});
  std::set<int> failing_lines;
  for (const auto& e : r.failing) failing_lines.insert(e.line);
  ASSERT_GT(r.failing.size(), failing_lines.size());
  EXPECT_EQ(r.failing_points, failing_lines.size());
  EXPECT_LE(r.failing_points, ref.points.size());
  const std::string points = std::to_string(failing_lines.size()) + " points";
  const std::string table = check_table(std::vector{r});
  EXPECT_NE(table.find("FAIL (" + points + ")"), std::string::npos) << table;
  EXPECT_NE(r.summary().find(": " + points + " out of tolerance"), std::string::npos)
      << r.summary();
}

// A looser tolerance from outside (the command's --tolerance) lets the same
// shifted model pass: 30 % covers the 20 % shift with room for the
// high-injection points.
TEST(CurveCheck, ToleranceOverrideApplies) {
  BipolarModel shifted = round_trip_npn();
  shifted.saturation_current *= 1.2;
  Curve ref = gummel_reference();
  apply_tolerance(ref, {0.30, std::nullopt});
  const auto r = check_curve(ref, {"shifted", shifted});
  EXPECT_TRUE(r.passed()) << r.summary();
}

// A transistor curve on a diode model is an input error naming both.
TEST(CurveCheck, KindMustFitTheModel) {
  try {
    check_curve(gummel_reference(), {"d1", DiodeModel{}});
    FAIL() << "expected InputError";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("transistor curve"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("d1"), std::string::npos) << e.what();
  }
}

}  // namespace
