// First- and second-order filters against their exact transfer functions
// (any circuits text, e.g. Sedra & Smith, "Microelectronic Circuits", ch. 1
// and 17): the sweep, the derived corners, and the impedances.
#include <gtest/gtest.h>

#include "analysis/response_checks.hpp"
#include "stage/frequency.hpp"
#include "stage/validate.hpp"

namespace {

using stage::Circuit;
using stage::FrequencyOptions;
using stage::test::Complex;
using stage::test::jw;

constexpr double kR = 1.5e3, kC = 47e-9;
// LU on 2 to 4 unknowns with condition below 1e6 at every frequency here:
// cond * eps ~ 1e-10 at worst, so 1e-9 leaves room without hiding errors
// of any modelling kind (which would be of order 1).
constexpr double kTolerance = 1e-9;

FrequencyOptions sweep(double from, double to) {
  FrequencyOptions o;
  o.from = from;
  o.to = to;
  o.per_decade = 20;
  o.input = "vin";
  o.output = stage::SignalRef::node("out");
  return o;
}

// Gain in dB and phase in degrees are the response's, so a response within
// kTolerance bounds them by 20/ln(10) kTolerance dB and kTolerance rad.
void expect_sweep(const stage::FrequencyResult& r, Complex (*exact)(double)) {
  ASSERT_EQ(r.frequencies.size(), r.response.size());
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    const double f = r.frequencies[i];
    const Complex h = exact(f);
    stage::test::expect_response(r.response[i], h, kTolerance, "response", f);
    EXPECT_NEAR(r.gain_dB[i], 20 * std::log10(std::abs(h)), 8.7 * kTolerance);
    EXPECT_NEAR(stage::test::phase_difference_deg(r.phase_deg[i], std::arg(h) * 180 / M_PI), 0.0,
                kTolerance * 180 / M_PI);
  }
}

Circuit rc_low_pass() {
  Circuit c;
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("r1", stage::Resistor{"in", "out", kR});
  c.add("c1", stage::Capacitor{"out", "gnd", kC});
  return c;
}

// H = 1 / (1 + jwRC); Zin = R + 1/(jwC); Zout = R || 1/(jwC) with vin shorted.
TEST(Filters, RcLowPass) {
  const auto r = stage::run_frequency(rc_low_pass(), sweep(10, 1e6));
  expect_sweep(r, [](double f) { return 1.0 / (1.0 + jw(f) * kR * kC); });
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    const double f = r.frequencies[i];
    const Complex zc = 1.0 / (jw(f) * kC);
    stage::test::expect_response(r.input_impedance[i], kR + zc, kTolerance, "Zin", f);
    stage::test::expect_response(r.output_impedance[i], kR * zc / (kR + zc), kTolerance, "Zout", f);
  }
  // The corner: |H(fu)| = |H(f peak)| / sqrt(2) exactly (the definition),
  // and f = 1/(2 pi R C) to within the peak sample's own droop: at 10 Hz
  // |H|^2 = 1/(1 + (10/fc)^2) moves the corner by (10/fc)^2 / 2 ~ 4e-5.
  EXPECT_EQ(r.figures.peak_frequency, 10.0);
  ASSERT_TRUE(r.figures.upper_cutoff);
  const double fu = *r.figures.upper_cutoff;
  const double h_peak = std::abs(1.0 / (1.0 + jw(r.figures.peak_frequency) * kR * kC));
  EXPECT_NEAR(std::abs(1.0 / (1.0 + jw(fu) * kR * kC)), h_peak / std::sqrt(2.0), kTolerance);
  EXPECT_NEAR(fu, 1 / (2 * M_PI * kR * kC), 5e-5 * fu);
  EXPECT_FALSE(r.figures.lower_cutoff);
  EXPECT_FALSE(r.figures.unity_gain_frequency);  // the gain never exceeds 0 dB
}

// H = jwRC / (1 + jwRC): capacitor in series, resistor to ground.
TEST(Filters, RcHighPass) {
  Circuit c;
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("c1", stage::Capacitor{"in", "out", kC});
  c.add("r1", stage::Resistor{"out", "gnd", kR});
  const auto r = stage::run_frequency(c, sweep(10, 1e6));
  const auto exact = [](double f) { return jw(f) * kR * kC / (1.0 + jw(f) * kR * kC); };
  expect_sweep(r, exact);
  ASSERT_TRUE(r.figures.lower_cutoff);
  const double fl = *r.figures.lower_cutoff;
  EXPECT_NEAR(std::abs(exact(fl)), std::abs(exact(r.figures.peak_frequency)) / std::sqrt(2.0),
              kTolerance);
  EXPECT_NEAR(fl, 1 / (2 * M_PI * kR * kC), 5e-5 * fl);
  EXPECT_FALSE(r.figures.upper_cutoff);
}

// A flat response (a divider by two) has its whole sweep as its band, so
// midband is the sweep's centre on a log scale: 10 Hz and 1 MHz give
// 10^3.5 Hz, which is the grid's 50th point at 20 per decade. Every point
// has the gain 20 log10(1/2).
TEST(Filters, FlatResponseHasItsMidbandInTheMiddle) {
  Circuit c;
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("r1", stage::Resistor{"in", "out", kR});
  c.add("r2", stage::Resistor{"out", "gnd", kR});
  const auto r = stage::run_frequency(c, sweep(10, 1e6));
  EXPECT_NEAR(r.figures.midband_frequency, std::pow(10.0, 3.5), 1e-12 * std::pow(10.0, 3.5));
  EXPECT_NEAR(r.figures.midband_gain_dB, 20 * std::log10(0.5), 1e-9);
  EXPECT_FALSE(r.figures.lower_cutoff);
  EXPECT_FALSE(r.figures.upper_cutoff);
}

// A band-pass of two first-order sections, the second loading the first
// lightly (R2 = 1000 R1): corners near fl = 1/(2 pi R1 C1) = 16 Hz and
// fh = 1/(2 pi R2 C2) = 160 kHz. Midband lands within one grid step of the
// geometric mean sqrt(fl fh), the centre of the band on a log scale (the
// band's ends are grid points within one step inside the corners), and the
// gain there is the exact one of the cascade.
TEST(Filters, BandPassMidbandIsTheBandsGeometricCentre) {
  static constexpr double kR1 = 1e3, kC1 = 10e-6, kR2 = 1e6, kC2 = 1e-12;
  Circuit c;
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("c1", stage::Capacitor{"in", "a", kC1});
  c.add("r1", stage::Resistor{"a", "gnd", kR1});
  c.add("r2", stage::Resistor{"a", "out", kR2});
  c.add("c2", stage::Capacitor{"out", "gnd", kC2});
  const auto r = stage::run_frequency(c, sweep(1, 1e7));
  const auto exact = [](double f) {
    // Node analysis of the ladder: Va (1/R1 + jwC1 + 1/(R2 + Zc2)) = jwC1 Vin.
    const Complex zc2 = 1.0 / (jw(f) * kC2);
    const Complex va = jw(f) * kC1 / (1.0 / kR1 + jw(f) * kC1 + 1.0 / (kR2 + zc2));
    return va * zc2 / (kR2 + zc2);
  };
  expect_sweep(r, exact);
  ASSERT_TRUE(r.figures.lower_cutoff && r.figures.upper_cutoff);
  const double centre = std::sqrt(*r.figures.lower_cutoff * *r.figures.upper_cutoff);
  EXPECT_LE(std::abs(std::log10(r.figures.midband_frequency / centre)), 1.0 / 20);
  EXPECT_NEAR(r.figures.midband_gain_dB,
              20 * std::log10(std::abs(exact(r.figures.midband_frequency))), 1e-9);
  EXPECT_GT(r.figures.peak_gain_dB - r.figures.midband_gain_dB, -1e-12);
}

// Series R-L-C driven by vin, output across R: H = R / (R + jwL + 1/(jwC)).
// Resonance f0 = 1/(2 pi sqrt(LC)) = 1 kHz lies on the grid (10 Hz * 10^(40/20)),
// so the midband is exactly the peak H = 1, and the -3 dB edges are
// f0 (sqrt(1 + 1/(4Q^2)) -+ 1/(2Q)) with Q = sqrt(L/C)/R.
TEST(Filters, SeriesRlcBandPass) {
  constexpr double kL = 10e-3, kRs = 220.0;
  const double f0 = 1e3;
  const double cap = 1.0 / (std::pow(2 * M_PI * f0, 2) * kL);
  Circuit c;
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("l1", stage::Inductor{"in", "a", kL});
  c.add("c1", stage::Capacitor{"a", "out", cap});
  c.add("r1", stage::Resistor{"out", "gnd", kRs});
  auto options = sweep(10, 1e5);
  options.at = f0;
  const auto r = stage::run_frequency(c, options);
  const auto exact = [](double f) {
    const double l = 10e-3, cc = 1.0 / (std::pow(2 * M_PI * 1e3, 2) * l);
    return 220.0 / (220.0 + jw(f) * l + 1.0 / (jw(f) * cc));
  };
  expect_sweep(r, exact);
  EXPECT_NEAR(r.figures.midband_frequency, f0, 1e-12 * f0);
  EXPECT_NEAR(r.figures.midband_gain_dB, 0.0, 1e-9);
  const double q = std::sqrt(kL / cap) / kRs;
  const double root = std::sqrt(1 + 1 / (4 * q * q));
  ASSERT_TRUE(r.figures.lower_cutoff && r.figures.upper_cutoff);
  EXPECT_NEAR(*r.figures.lower_cutoff, f0 * (root - 1 / (2 * q)), kTolerance * f0);
  EXPECT_NEAR(*r.figures.upper_cutoff, f0 * (root + 1 / (2 * q)), kTolerance * f0);
  // At resonance the reactances cancel: 0 dB, 0 degrees, Zin = R.
  EXPECT_NEAR(*r.figures.gain_at_dB, 0.0, 1e-9);
  EXPECT_NEAR(*r.figures.phase_at_deg, 0.0, 1e-7);
  const std::size_t at = 40;
  stage::test::expect_response(r.input_impedance[at], kRs, kTolerance, "Zin at f0", f0);
}

// from = to asks for the one frequency: the response there is the exact
// H = 1 / (1 + jwRC), and no corner or unity-gain crossing is made up from a
// single point (they need a band). The validation accepts it; to < from not.
TEST(Filters, SingleFrequencyHasNoCorners) {
  const double f0 = 1 / (2 * M_PI * kR * kC);  // at the corner, where a band would find one
  const auto r = stage::run_frequency(rc_low_pass(), sweep(f0, f0));
  ASSERT_EQ(r.frequencies.size(), 1u);
  EXPECT_EQ(r.frequencies[0], f0);
  expect_sweep(r, [](double f) { return 1.0 / (1.0 + jw(f) * kR * kC); });
  EXPECT_EQ(r.figures.midband_frequency, f0);
  EXPECT_FALSE(r.figures.lower_cutoff);
  EXPECT_FALSE(r.figures.upper_cutoff);
  EXPECT_FALSE(r.figures.unity_gain_frequency);
  const std::string full = r.full_report();
  EXPECT_NE(full.find("1 point\n"), std::string::npos) << full;
  EXPECT_EQ(full.find("-3 dB"), std::string::npos) << full;
  EXPECT_EQ(r.brief_report().find("-3 dB"), std::string::npos) << r.brief_report();
  EXPECT_FALSE(stage::validate(rc_low_pass(), sweep(f0, f0)).has_value());
  EXPECT_TRUE(stage::validate(rc_low_pass(), sweep(f0, f0 / 2)).has_value());
}

}  // namespace
