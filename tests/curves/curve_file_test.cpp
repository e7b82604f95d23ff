// Reading curve files: a complete file with units and comments, the
// written form read back exactly, and every kind of mistake reported as an
// InputError at its line and column.
#include <gtest/gtest.h>

#include "stage/curves.hpp"
#include "stage/errors.hpp"

namespace {

using namespace stage;
using Q = CurveQuantity;

constexpr const char* kGummel = R"(# Forward Gummel plot, generated for the test.
# Second comment line.
curve, forward_gummel
model, small_npn
sweep, base_emitter_voltage, mV
measure, collector_current, mA
measure, base_current, uA
hold, collector_emitter_voltage, 5, V
hold, temperature, 27, degC
tolerance, collector_current, 2, %
points
600, 0.5, 2.5     # a trailing comment

650, 3.5, 17.5
)";

TEST(CurveFile, ReadsHeaderUnitsAndPoints) {
  const Curve c = parse_curve(kGummel, "dir/gummel_a.csv");
  EXPECT_EQ(c.name, "gummel_a");  // the file's stem without a `name` line
  EXPECT_EQ(c.kind, CurveKind::forward_gummel);
  EXPECT_EQ(c.model, "small_npn");
  ASSERT_EQ(c.measured.size(), 2u);
  EXPECT_EQ(c.comments.size(), 2u);
  // Prefixes scale to SI (spec section 1 prefixes); 27 degC is 300.15 K.
  EXPECT_DOUBLE_EQ(*c.condition(Q::temperature), 300.15);
  EXPECT_DOUBLE_EQ(*c.condition(Q::collector_emitter_voltage), 5);
  ASSERT_EQ(c.points.size(), 2u);
  EXPECT_DOUBLE_EQ(c.points[1].swept, 0.65);
  EXPECT_DOUBLE_EQ(c.points[1].measured[0], 3.5e-3);
  EXPECT_DOUBLE_EQ(c.points[1].measured[1], 17.5e-6);
  EXPECT_EQ(c.points[1].line, 14);
  // The given tolerance, and the 5 % default for the base current.
  EXPECT_DOUBLE_EQ(c.tolerance(Q::collector_current), 0.02);
  EXPECT_DOUBLE_EQ(c.tolerance(Q::base_current), 0.05);
}

// Round trip: written with 10 significant digits, read back equal to within
// the last bits (0.5 mA is 0.5 * 1e-3 read, 5e-4 written).
TEST(CurveFile, WrittenCurveReadsBackTheSame) {
  const Curve c = parse_curve(kGummel, "gummel.csv");
  const Curve back = parse_curve(format_curve(c), "gummel.csv");
  EXPECT_EQ(back.name, c.name);
  EXPECT_EQ(back.measured, c.measured);
  EXPECT_EQ(back.held, c.held);
  ASSERT_EQ(back.points.size(), c.points.size());
  for (std::size_t i = 0; i < c.points.size(); ++i) {
    EXPECT_DOUBLE_EQ(back.points[i].swept, c.points[i].swept);
    for (std::size_t k = 0; k < c.measured.size(); ++k) {
      EXPECT_DOUBLE_EQ(back.points[i].measured[k], c.points[i].measured[k]);
    }
  }
  EXPECT_DOUBLE_EQ(back.tolerance(Q::collector_current), 0.02);
}

struct BadFile {
  const char* text;
  int line, column;
  const char* says;
};

class CurveFileErrors : public ::testing::TestWithParam<BadFile> {};

TEST_P(CurveFileErrors, NamesLineColumnAndProblem) {
  const BadFile& bad = GetParam();
  try {
    parse_curve(bad.text, "bad.csv");
    FAIL() << "expected an InputError for:\n" << bad.text;
  } catch (const InputError& e) {
    EXPECT_EQ(e.where().file, "bad.csv");
    EXPECT_EQ(e.where().line, bad.line) << e.what();
    EXPECT_EQ(e.where().column, bad.column) << e.what();
    EXPECT_NE(e.message().find(bad.says), std::string::npos) << e.what();
  }
}

INSTANTIATE_TEST_SUITE_P(
    Mistakes, CurveFileErrors,
    ::testing::Values(
        BadFile{"curve, sideways\n", 1, 8, "unknown curve kind 'sideways'"},
        BadFile{"# c\nsweep, base_emitter_voltage, V\n", 2, 1, "first line must be `curve, KIND`"},
        BadFile{"curve, forward_gummel\nsweep, collector_current, A\n", 2, 8,
                "sweeps base_emitter_voltage"},
        BadFile{"curve, forward_gummel\nsweep, base_emitter_voltage, A\n", 2, 30,
                "'A' is not a unit of base_emitter_voltage"},
        BadFile{"curve, forward_gummel\nmeasure, current_gain, 1\n", 2, 10,
                "does not measure current_gain"},
        BadFile{"curve, forward_gummel\nsweep, base_emitter_voltage, V\n"
                "measure, collector_current, A\npoints\n",
                4, 1, "needs `hold, collector_emitter_voltage"},
        BadFile{"curve, current_gain\nsweep, collector_current, A\nmeasure, current_gain, 1\n"
                "hold, collector_emitter_voltage, 5, V\npoints\n1e-3, 100\n2e-3\n",
                7, 1, "expected 2 numbers per point"},
        BadFile{"curve, current_gain\nsweep, collector_current, A\nmeasure, current_gain, 1\n"
                "hold, collector_emitter_voltage, 5, V\npoints\n1e-3, 1OO\n",
                6, 7, "expected a number, got '1OO'"},
        BadFile{"curve, current_gain\nsweep, collector_current, A\nmeasure, current_gain, 1\n"
                "hold, collector_emitter_voltage, 5, V\npoints\n1e-3, -100\n",
                6, 7, "current_gain must be positive"},
        BadFile{"curve, saturation\nsweep, collector_current, A\n"
                "measure, collector_emitter_voltage, V\n"
                "tolerance, collector_emitter_voltage, 5, %\n",
                4, 42, "tolerance on a voltage is in V or mV"},
        // 1e306 kV overflows once its unit is applied: it must not become an
        // infinity that a check then compares as NaN and passes.
        BadFile{"curve, saturation\nsweep, collector_current, A\n"
                "measure, collector_emitter_voltage, kV\nhold, forced_beta, 10, 1\n"
                "points\n1e-3, 1e306\n",
                6, 7, "beyond the range of numbers"},
        BadFile{"curve, diode_forward\nlimits, 1, 2\n", 2, 1, "unknown key 'limits'"},
        BadFile{"curve, diode_forward\nsweep, forward_voltage, V\n"
                "measure, forward_current, A\npoints\n",
                0, 0, "no points after `points`"}));

}  // namespace
