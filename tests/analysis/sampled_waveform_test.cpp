// Figures read between a transient's samples (issue 11): the spectra of a
// trapezoid wave and of a sine clipped by a diode limiter, uniform
// resampling across corners, and the settle check, all through the one
// interpolant of interpolate().
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <numbers>
#include <sstream>
#include <string>

#include "analysis/step_interpolant.hpp"
#include "reference.hpp"
#include "stage/spectrum.hpp"
#include "stage/transient.hpp"

namespace {

using std::numbers::pi;
constexpr double kF = 1e3, kT = 1 / kF;

// A source across a resistor: the node is the source's waveform exactly at
// every sample, so what is tested is how the samples are read.
stage::TransientResult across_resistor(const stage::Waveform& wave, double stop, double max_step) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 0.0, 0.0, 0.0, wave});
  c.add("r1", stage::Resistor{"in", "gnd", 1e3});
  stage::TransientOptions o;
  o.stop = stop;
  o.max_step = max_step;
  o.signals = {stage::SignalRef::node("in")};
  return stage::run_transient(c, o);
}

// +-1 V trapezoid wave, 100 ns edges level to level (80 ns 10-90 %), high
// for half the period at half amplitude (499.9 us flat), 4 ms at a 1 us step, 7 harmonics. The
// Fourier series of a square wave, 4/(n pi) on odd n (Oppenheim & Willsky, example 3.5), times the
// edges' sinc(n pi f t_rise) (convolution with a box of width t_rise; textbook). Odd harmonics
// within 0.05 %; even ones, zero by half-wave symmetry, below 1e-5 of the fundamental; exactly
// periodic, so settled.
TEST(SampledWaveform, TrapezoidWaveSpectrum) {
  const double rise = 100e-9;
  const stage::PulseWave wave{.low = -1,
                              .high = 1,
                              .period = kT,
                              .high_time = kT / 2,
                              .rise = 0.8 * rise,
                              .fall = 0.8 * rise};
  const auto r = across_resistor(wave, 4 * kT, 1e-6);
  const auto s = stage::run_spectrum(r, {stage::SignalRef::node("in"), kF, 7});
  for (int n = 1; n <= 7; n += 2) {
    const double x = n * pi * kF * rise;
    const double exact = 4 / (n * pi) * std::sin(x) / x;
    EXPECT_NEAR(s.harmonics[n - 1].amplitude, exact, 5e-4 * exact) << "harmonic " << n;
  }
  for (int n = 2; n <= 7; n += 2) {
    EXPECT_LT(s.harmonics[n - 1].amplitude, 1e-5 * s.harmonics[0].amplitude) << "harmonic " << n;
  }
  EXPECT_TRUE(s.settled) << s.message;
  EXPECT_LT(s.period_change, 1e-6);  // exactly periodic source (waveform definition)
}

// A 2 V, 1 kHz sine through 1 kohm into a symmetric limiter: two diodes
// returning to +-1 V sources, emission coefficient 0.002 (near-ideal, no
// real part; saturation current 1e-14 A, textbook-typical; no charge), so
// the output is the sine clipped at about +-1 V. Its harmonics against the
// closed-form series of a clipped sine (clipped_sine_harmonic in
// reference.hpp, derived there).
//
// The clip level of the reference: while a diode conducts, the output sits
// at L + n VT ln(I / IS) (Shockley), the current I = (A sin(theta) - L) / R
// running from 0 to (A - L) / R = 1 mA. The reference takes the drop at
// the median current over the clipped part, the current at its middle
// theta_m = (theta_c + pi/2) / 2 (I grows with theta): 0.73 mA, 1.26 mV.
// The output then departs from the reference by n VT |ln(I / I_m)| while
// clipped (less near the knee, where it follows the sine), so by
// b_n = (4/pi) int_0^{pi/2} x sin(n theta) dtheta each harmonic is off by at
// most (4/pi) n VT int_{theta_c}^{pi/2} |ln(I / I_m)| dtheta
// = (4/pi) n VT 0.574 = 38 uV (the integral by midpoint quadrature on
// 20,000 points; derived here). The transient adds its interpolation across
// the knee, a step of T/2000 on each side of four kinks a period, within
// 2 uV (the sampled clipped sine in spectrum_test.cpp reads to 1e-6): 40 uV
// in all, 3e-5 of the fundamental. Even harmonics: zero by the circuit's
// half-wave symmetry, so only the transient's own error is left, within
// the same 2 uV (Newton's 1 uV voltage tolerance at the samples and the
// interpolation), 1.6e-6 of the fundamental.
TEST(SampledWaveform, SineClippedByDiodeLimiter) {
  const double amplitude = 2.0, level = 1.0, resistance = 1e3;
  stage::DiodeModel near_ideal;
  near_ideal.emission_coefficient = 0.002;
  stage::Circuit c;
  c.add_model("limiter", near_ideal);
  c.add("vs", stage::VoltageSource{"in", "gnd", 0.0, 0.0, 0.0, stage::SineWave{amplitude, kF}});
  c.add("r1", stage::Resistor{"in", "out", resistance});
  c.add("vhigh", stage::VoltageSource{"high", "gnd", level});
  c.add("vlow", stage::VoltageSource{"low", "gnd", -level});
  c.add("dhigh", stage::Diode{"out", "high", "limiter"});
  c.add("dlow", stage::Diode{"low", "out", "limiter"});
  stage::TransientOptions o;
  o.stop = 3 * kT;
  o.max_step = kT / 2000;
  o.signals = {stage::SignalRef::node("out")};
  const auto s =
      stage::run_spectrum(stage::run_transient(c, o), {stage::SignalRef::node("out"), kF, 9});
  EXPECT_TRUE(s.settled) << s.message;  // exactly periodic: no charge anywhere

  // Boltzmann constant over the elementary charge (SI, exact), at the
  // models' reference temperature 300.15 K.
  const double thermal_voltage = 1.380649e-23 / 1.602176634e-19 * 300.15;
  const double nvt = near_ideal.emission_coefficient * thermal_voltage;
  const double theta_c = std::asin(level / amplitude);
  const double median_current = (amplitude * std::sin((theta_c + pi / 2) / 2) - level) / resistance;
  const double clip_level = level + nvt * std::log(median_current / near_ideal.saturation_current);
  const double tolerance = 4 / pi * nvt * 0.574 + 2e-6;  // bound above
  const auto scientific = [](double v) {
    std::ostringstream text;
    text << std::scientific << std::setprecision(3) << v;
    return text.str();
  };
  for (int n = 1; n <= 9; n += 2) {
    const double exact = stage::testing::clipped_sine_harmonic(n, amplitude, clip_level);
    RecordProperty("harmonic_" + std::to_string(n) + "_error_V",
                   scientific(s.harmonics[n - 1].amplitude - exact));
    EXPECT_NEAR(s.harmonics[n - 1].amplitude, exact, tolerance) << "harmonic " << n;
  }
  for (int n = 2; n <= 8; n += 2) {
    RecordProperty("harmonic_" + std::to_string(n) + "_V",
                   scientific(s.harmonics[n - 1].amplitude));
    EXPECT_LT(s.harmonics[n - 1].amplitude, 2e-6) << "harmonic " << n;  // half-wave symmetry
  }
}

// Resampled at a grid that falls between the samples around every edge,
// a pulse stays within [low, high] to the voltage tolerance (1 uV, the
// default): the interpolant never reaches across a corner (the waveform's
// bounds; the quadratic through three samples used to overshoot by volts).
TEST(SampledWaveform, ResampledPulseStaysWithinItsLevels) {
  // 100 ns edges level to level (80 ns 10-90 %) around a 400 us flat top.
  const stage::PulseWave wave{.low = -1,
                              .high = 1,
                              .period = kT,
                              .high_time = 400e-6 + 100e-9,
                              .rise = 80e-9,
                              .fall = 80e-9};
  const auto r = across_resistor(wave, 3 * kT, 1e-6);
  const auto uniform = stage::resample(r, 0.37e-6);
  const double tolerance = stage::SolverOptions{}.voltage_tolerance;
  for (double v : uniform.signal("in")) {
    EXPECT_GE(v, -1 - tolerance);
    EXPECT_LE(v, 1 + tolerance);
  }
}

// A resampled sine against the exact sine: the interpolant on a step of h
// is the quadratic through three exact samples, whose error is at most
// h^3 max|f'''| / (9 sqrt 3) (Lagrange remainder, nodes spread over h;
// Burden & Faires, section 3.1): (2 pi / 200)^3 / 15.6 = 2e-6 of the
// amplitude at 200 steps a period.
TEST(SampledWaveform, ResampledSineMatchesTheExactSine) {
  const auto r = across_resistor(stage::SineWave{1.0, kF}, 3 * kT, kT / 200);
  const auto uniform = stage::resample(r, kT / 317);
  const auto& v = uniform.signal("in");
  double worst = 0;
  for (std::size_t k = 0; k < v.size(); ++k) {
    worst = std::max(worst, std::abs(v[k] - std::sin(2 * pi * kF * uniform.time[k])));
  }
  EXPECT_LT(worst, 2e-6);  // Lagrange remainder bound above
}

// A 1 V sine on 1 V through 1 kohm into 3 uF (tau = 3 periods) from zero:
// the DC level still rises by e^{-4/3} - e^{-5/3} = 7.5 % of a volt over the
// last of five periods, against a fundamental of 1/sqrt(1 + (w tau)^2) =
// 53 mV (hand analysis of the RC): still settling, and reported so, the
// RMS change being about twice the fundamental's RMS.
TEST(SampledWaveform, ChargingRcIsNotSettled) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 0.0, 0.0, 0.0, stage::SineWave{1.0, kF, 1.0}});
  c.add("r1", stage::Resistor{"in", "out", 1e3});
  c.add("c1", stage::Capacitor{"out", "gnd", 3e-6});
  stage::TransientOptions o;
  o.stop = 5 * kT;
  o.max_step = kT / 200;
  o.start = stage::TransientStart::zero;
  const auto s =
      stage::run_spectrum(stage::run_transient(c, o), {stage::SignalRef::node("out"), kF, 5});
  EXPECT_FALSE(s.settled);
  EXPECT_GT(s.period_change, 1.0);  // ~2 by the hand analysis above
}

// A piece's range, which the headroom search's peaks come from: the Hermite
// piece of the cubic t^3 - t on [-1, 1.5] is that cubic, whose largest value
// there is at the end, 1.875, and whose smallest is at its stationary point
// t = 1/sqrt 3, -2/(3 sqrt 3) (exact solution).
TEST(Interpolant, PieceRangeFindsTheCubicsExtremes) {
  const auto f = [](double t) { return t * t * t - t; };
  const auto df = [](double t) { return 3 * t * t - 1; };
  const stage::analysis::HermitePiece piece{-1.0, 1.5, f(-1.0), f(1.5), df(-1.0), df(1.5)};
  const auto [low, high] = piece.range();
  EXPECT_NEAR(high, 1.875, 1e-14);                     // exact solution
  EXPECT_NEAR(low, -2 / (3 * std::sqrt(3.0)), 1e-14);  // exact solution
  // Falling through a step: no stationary point inside, the ends (exact).
  const stage::analysis::HermitePiece falling{0.0, 1.0, 1.0, 0.0, -1.0, -1.0};
  EXPECT_EQ(falling.range(), std::make_pair(0.0, 1.0));
}

}  // namespace
