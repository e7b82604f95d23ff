// The one table of SI prefixes and the engineering notation that prints
// with it. The prefixes and their powers of ten are the SI's (BIPM, "The
// International System of Units", 9th ed., table 7); the spellings read are
// spec section 1's.
#include "common/si_prefixes.hpp"

#include <gtest/gtest.h>

#include <limits>

#include "common/si_format.hpp"
#include "curves/units.hpp"
#include "stage/curves.hpp"

namespace {

using namespace stage;

TEST(SiPrefixes, AreTheSpecsList) {
  // Spec section 1: "Prefixes: a f p n u µ m k M G T" (the Greek μ is read
  // too, and not listed, as it looks the same as µ).
  EXPECT_EQ(text::listed_prefixes(), "a f p n u µ m k M G T");
}

TEST(SiPrefixes, ReadEverySpellingAsItsPowerOfTen) {
  // SI prefix table (BIPM SI brochure, table 7): exact powers of ten.
  EXPECT_EQ(text::prefixed_unit_scale("aF", "F"), 1e-18);
  EXPECT_EQ(text::prefixed_unit_scale("pF", "F"), 1e-12);
  EXPECT_EQ(text::prefixed_unit_scale("uA", "A"), 1e-6);
  EXPECT_EQ(text::prefixed_unit_scale("µA", "A"), 1e-6);  // U+00B5 micro sign
  EXPECT_EQ(text::prefixed_unit_scale("μA", "A"), 1e-6);  // U+03BC Greek mu
  EXPECT_EQ(text::prefixed_unit_scale("mV", "V"), 1e-3);
  EXPECT_EQ(text::prefixed_unit_scale("V", "V"), 1.0);
  EXPECT_EQ(text::prefixed_unit_scale("MHz", "Hz"), 1e6);
  EXPECT_EQ(text::prefixed_unit_scale("THz", "Hz"), 1e12);
  EXPECT_FALSE(text::prefixed_unit_scale("mmV", "V"));  // one prefix only
  EXPECT_FALSE(text::prefixed_unit_scale("xV", "V"));
  EXPECT_FALSE(text::prefixed_unit_scale("mA", "V"));
}

TEST(SiPrefixes, PrintTheStandardSymbol) {
  EXPECT_EQ(text::standard_prefix(-6), "µ");  // the micro sign, not u or Greek mu
  EXPECT_EQ(text::standard_prefix(0), "");
  EXPECT_EQ(text::standard_prefix(3), "k");
  EXPECT_FALSE(text::standard_prefix(1));  // no prefix stands for ten
}

// Engineering notation: the value over 10^(3k), k chosen so that the
// figure lies in [1, 1000), with `digits` significant digits (definition);
// figures below femto are printed in femto until they round to zero, which
// is printed plainly, and figures beyond tera in powers of ten.
TEST(SiFormat, PrintsEngineeringNotation) {
  EXPECT_EQ(text::si(0.0047, "A"), "4.700 mA");
  EXPECT_EQ(text::si(4.7e-6, "A"), "4.700 µA");
  EXPECT_EQ(text::si(-0.0047, "A"), "-4.700 mA");
  EXPECT_EQ(text::si(12345, "A"), "12.35 kA");
  EXPECT_EQ(text::si(1.5e13, "A"), "15.00 TA");
  EXPECT_EQ(text::si(4700, ""), "4.700k");
  EXPECT_EQ(text::si(0.99996, "A"), "1.000 A");  // rounds up into the next prefix
  EXPECT_EQ(text::si(1e-18, "A"), "0.001 fA");   // below femto: printed in femto
  EXPECT_EQ(text::si(0, "A"), "0 A");
  EXPECT_EQ(text::si(-4e-20, "V"), "0 V");  // would be "-0.000 fV"
  EXPECT_EQ(text::si(0, ""), "0");
  EXPECT_EQ(text::si(999.9e12, "Ω"), "999.9 TΩ");
  EXPECT_EQ(text::si(2.2088e169, "Ω"), "2.209e+169 Ω");  // not 63 digits of tera
  EXPECT_EQ(text::si(std::numeric_limits<double>::infinity(), "Ω"), "∞ Ω");
  EXPECT_EQ(text::si(-std::numeric_limits<double>::infinity(), "A"), "-∞ A");
}

// The noun follows the count (English grammar).
TEST(SiFormat, CountsInTheRightNumber) {
  EXPECT_EQ(text::counted(1, "analysis", "analyses"), "1 analysis");
  EXPECT_EQ(text::counted(0, "analysis", "analyses"), "0 analyses");
  EXPECT_EQ(text::counted(3, "period", "periods"), "3 periods");
}

// Curve files read the language's prefixes (curve-format.md: "as in
// `.stage` files"), and the command's --tolerance reads the units of a
// curve file's tolerance line.
TEST(SiPrefixes, CurveUnitsAndTolerancesReadTheTable) {
  using Q = CurveQuantity;
  EXPECT_EQ(curves::parse_unit("aF", Q::base_collector_capacitance).value().factor, 1e-18);
  EXPECT_EQ(curves::parse_unit("μA", Q::collector_current).value().factor, 1e-6);
  EXPECT_EQ(curves::parse_unit("GHz", Q::transition_frequency).value().factor, 1e9);
  EXPECT_FALSE(curves::parse_unit("mF", Q::collector_current));
  const auto volts = tolerance_unit("uV");
  ASSERT_TRUE(volts);
  EXPECT_FALSE(volts->ratio);
  EXPECT_EQ(volts->factor, 1e-6);
  const auto percent = tolerance_unit("%");
  ASSERT_TRUE(percent);
  EXPECT_TRUE(percent->ratio);
  EXPECT_EQ(percent->factor, 0.01);  // 1 % = 1/100 (definition)
  EXPECT_FALSE(tolerance_unit("mA"));
}

}  // namespace
