// Spectrum of waveforms with known Fourier series, sampled exactly at
// uneven times with their slopes each side (as a transient hands them over),
// and the settling and length warnings; end to end, waveforms with corners
// through a simulated circuit.
#include "stage/spectrum.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <functional>
#include <numbers>

#include "reference.hpp"
#include "stage/circuit.hpp"
#include "stage/errors.hpp"

namespace {

using std::numbers::pi;
constexpr double kF = 1e3, kT = 1 / kF, kW = 2 * pi * kF;

// Appends x(t) with its one-sided slopes, by differences over T/1e9 (error
// of the order of 1e-9 of the slope, far below the checks).
void add_sample(stage::TransientResult& r, const std::function<double(double)>& x, double t) {
  const double dt = kT * 1e-9, v = x(t);
  auto& s = r.signals[0];
  r.time.push_back(t);
  s.values.push_back(v);
  s.slope_in.push_back((v - x(t - dt)) / dt);
  s.slope_out.push_back((x(t + dt) - v) / dt);
}

// `periods` periods of x(t) at steps that vary by +-30 % around T/1000.
stage::TransientResult sampled(const std::function<double(double)>& x, double periods) {
  stage::TransientResult r;
  r.signals.emplace_back().name = "out";
  for (double t = 0; t < periods * kT; t += kT / 1000 * (1 + 0.3 * std::sin(1e4 * t))) {
    add_sample(r, x, t);
  }
  add_sample(r, x, periods * kT);
  return r;
}

stage::SpectrumOptions options(int harmonics = 9) {
  return {stage::SignalRef::node("out"), kF, harmonics, true};
}

// x = 0.2 + 1.3 sin(wt + 0.4): one harmonic. The quadratic interpolation
// error (h w)^3 / (9 sqrt 3) at h = 1.3 T/1000 is 4e-8 of the amplitude.
TEST(Spectrum, PureSine) {
  const auto s = stage::run_spectrum(
      sampled([](double t) { return 0.2 + 1.3 * std::sin(kW * t + 0.4); }, 3), options());
  EXPECT_NEAR(s.dc, 0.2, 1e-7);
  EXPECT_NEAR(s.harmonics[0].amplitude, 1.3, 1e-7);
  EXPECT_NEAR(s.harmonics[0].phase_deg, 0.4 * 180 / pi, 1e-5);
  EXPECT_LT(s.thd, 1e-6);
  EXPECT_TRUE(s.settled) << s.message;
}

// A sine of amplitude 1 clipped at +-c, sampled exactly: the spectrum's
// reading of a wave with kinks between samples, against the clipped sine's
// Fourier series (clipped_sine_harmonic in reference.hpp, derived there;
// the same wave through a diode limiter is in sampled_waveform_test.cpp).
// Interpolation across the four kinks per period costs ~1e-6 (measured
// below 1e-6); 1e-5 leaves room.
TEST(Spectrum, SymmetricallyClippedSine) {
  const double c = 0.5;
  const auto s = stage::run_spectrum(
      sampled([&](double t) { return std::clamp(std::sin(kW * t), -c, c); }, 3), options());
  for (int n = 1; n <= 9; ++n) {
    EXPECT_NEAR(s.harmonics[n - 1].amplitude, stage::testing::clipped_sine_harmonic(n, 1.0, c),
                1e-5)
        << "harmonic " << n;  // Fourier series of the clipped sine
  }
}

// Square wave +-1 with linear edges of T/100 level to level (a pulse
// waveform, 10-90 % edges of 0.8 T/100, high for T/2 at half amplitude): the square
// wave's 4/(n pi) on odd n (Oppenheim & Willsky, example 3.5) times the
// edge's sinc(n pi tr / T) (convolution with a box of width tr). Sampled on
// the analysis grid itself (T/2048, ending at the last time), so the only
// error left is aliasing of harmonics near 2048, below 1e-5.
TEST(Spectrum, SquareWave) {
  const double tr = kT / 100;
  const stage::Waveform wave = stage::PulseWave{
      .low = -1, .high = 1, .period = kT, .high_time = kT / 2, .rise = 0.8 * tr, .fall = 0.8 * tr};
  stage::TransientResult r;
  r.signals.push_back({"out", {}});
  for (int k = 0; k <= 3 * 2048; ++k) {
    r.time.push_back(k * kT / 2048);
    r.signals[0].values.push_back(stage::waveform_value(wave, r.time.back()));
  }
  const auto s = stage::run_spectrum(r, options());
  for (int n = 1; n <= 9; ++n) {
    const double x = n * pi * tr / kT;
    const double exact = n % 2 == 1 ? 4 / (n * pi) * std::sin(x) / x : 0.0;
    EXPECT_NEAR(s.harmonics[n - 1].amplitude, exact, 1e-5) << "harmonic " << n;
  }
}

// max(0, sin wt) = 1/pi + sin(wt)/2 - (2/pi) sum_k cos(2k wt) / (4k^2 - 1)
// (Oppenheim & Willsky, problem 3.22; any table of Fourier series). Its
// THD+N: total mean square 1/4 minus DC^2 = 1/pi^2 and the fundamental's
// 1/8, over the fundamental's 1/8: sqrt(8 (1/8 - 1/pi^2)).
TEST(Spectrum, HalfWaveRectifiedSine) {
  const auto s = stage::run_spectrum(
      sampled([](double t) { return std::max(0.0, std::sin(kW * t)); }, 3), options(8));
  EXPECT_NEAR(s.dc, 1 / pi, 1e-5);
  EXPECT_NEAR(s.harmonics[0].amplitude, 0.5, 1e-5);
  for (int n = 2; n <= 8; ++n) {
    const double exact = n % 2 == 0 ? 2 / (pi * (n * n - 1)) : 0.0;
    EXPECT_NEAR(s.harmonics[n - 1].amplitude, exact, 1e-5) << "harmonic " << n;
  }
  ASSERT_TRUE(s.thd_plus_noise);
  EXPECT_NEAR(*s.thd_plus_noise, std::sqrt(8 * (1.0 / 8 - 1 / (pi * pi))), 1e-4);
}

// A sine still decaying (time constant 2 T): its last two periods differ by
// 1 - e^{-1/2} = 39 % of the amplitude, far above the 0.1 % limit.
TEST(Spectrum, WarnsWhenNotSettled) {
  const auto s = stage::run_spectrum(
      sampled([](double t) { return std::exp(-t / (2 * kT)) * std::sin(kW * t); }, 4), options());
  EXPECT_FALSE(s.settled);
  EXPECT_GT(s.period_change, 0.3);
  EXPECT_FALSE(s.message.empty());
}

TEST(Spectrum, WarnsWhenTooShortAndRefusesLessThanAPeriod) {
  const auto sine = [](double t) { return std::sin(kW * t); };
  const auto s = stage::run_spectrum(sampled(sine, 1.5), options(), 1);
  EXPECT_FALSE(s.settled);  // one whole period: nothing to compare it with
  EXPECT_EQ(s.periods, 1);
  EXPECT_NEAR(s.harmonics[0].amplitude, 1.0, 1e-6);
  EXPECT_THROW(stage::run_spectrum(sampled(sine, 0.7), options()), stage::Error);
}

// End to end: a 1 kHz sine source through a divider, simulated with 500
// steps a period: the node is the source's exact sine at every step, so only
// interpolation error remains ((2 pi/500)^3 / (9 sqrt 3) = 1.3e-7).
TEST(Spectrum, SimulatedSineIsPure) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 0.0, 0.0, 0.0, stage::SineWave{2.0, kF}});
  c.add("r1", stage::Resistor{"in", "out", 1e3});
  c.add("r2", stage::Resistor{"out", "gnd", 1e3});
  stage::TransientOptions o;
  o.stop = 3 * kT;
  o.max_step = kT / 500;
  const auto s = stage::run_spectrum(stage::run_transient(c, o), options());
  EXPECT_NEAR(s.harmonics[0].amplitude, 1.0, 1e-6);
  EXPECT_LT(s.thd, 1e-6);
}

}  // namespace
