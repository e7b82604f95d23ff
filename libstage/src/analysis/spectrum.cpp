// Harmonic analysis of the last whole periods of a transient signal.
//
// The signal is resampled uniformly over `periods` whole periods ending at
// the transient's last time, by the same quadratic interpolation as
// resample() (second order, like the integration formulas). Over whole
// periods the discrete Fourier sums at the harmonic frequencies are the
// trapezoidal rule for the Fourier integrals, exact for trigonometric
// polynomials below half the sampling rate.
#include "stage/spectrum.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <stdexcept>

namespace stage {
namespace {

constexpr int kMinSamplesPerPeriod = 2048;
// Last two periods differing by more than this fraction of the fundamental
// amplitude count as not settled (common practice: well below the
// distortion figures of interest).
constexpr double kSettleLimit = 1e-3;

std::vector<double> uniform_samples(const TransientResult& tr, const std::vector<double>& values,
                                    double t0, double dt, int count) {
  std::vector<double> x(static_cast<std::size_t>(count));
  for (int k = 0; k < count; ++k) x[k] = interpolate(tr.time, values, t0 + k * dt);
  return x;
}

}  // namespace

SpectrumResult run_spectrum(const TransientResult& tr, const SpectrumOptions& options,
                            int periods) {
  if (!(options.fundamental > 0) || options.harmonics < 1 || periods < 1) {
    throw std::invalid_argument("a spectrum needs a positive fundamental, harmonics and periods");
  }
  SpectrumResult result;
  result.signal = options.signal.label();
  result.fundamental = options.fundamental;
  const std::vector<double>& values = tr.signal(result.signal);
  const double period = 1.0 / options.fundamental;
  const double length = tr.time.empty() ? 0.0 : tr.time.back() - tr.time.front();
  const auto whole = static_cast<int>(std::floor(length / period * (1.0 + 1e-9)));
  if (whole < 1) {
    throw std::invalid_argument("the transient is shorter than one period of the fundamental");
  }
  result.periods = std::min(periods, whole);
  if (whole < periods + 1) {
    result.settled = false;
    result.message = "the transient holds " + std::to_string(whole) + " whole period(s); " +
                     std::to_string(periods + 1) +
                     " are needed to analyse the last and check it has settled";
  }

  const int per_period = std::max(kMinSamplesPerPeriod, 32 * options.harmonics);
  const int count = per_period * result.periods;
  const double dt = period / per_period;
  const double t0 = tr.time.back() - result.periods * period;
  const std::vector<double> x = uniform_samples(tr, values, t0, dt, count);

  double sum = 0;
  for (double v : x) sum += v;
  result.dc = sum / count;
  const double w = 2.0 * std::numbers::pi * options.fundamental;
  double harmonic_power = 0;
  for (int n = 1; n <= options.harmonics; ++n) {
    double a = 0, b = 0;  // cosine and sine parts
    for (int k = 0; k < count; ++k) {
      const double phase = n * w * (t0 + k * dt);
      a += x[k] * std::cos(phase);
      b += x[k] * std::sin(phase);
    }
    a *= 2.0 / count;
    b *= 2.0 / count;
    const double amplitude = std::hypot(a, b);
    result.harmonics.push_back({n, amplitude, std::atan2(a, b) * 180.0 / std::numbers::pi});
    if (n > 1) harmonic_power += amplitude * amplitude;
  }
  const Harmonic& first = result.harmonics.front();
  result.thd = first.amplitude > 0 ? std::sqrt(harmonic_power) / first.amplitude : 0.0;

  if (options.with_noise) {
    double residual = 0;
    const double phi = first.phase_deg * std::numbers::pi / 180.0;
    for (int k = 0; k < count; ++k) {
      const double r = x[k] - result.dc - first.amplitude * std::sin(w * (t0 + k * dt) + phi);
      residual += r * r;
    }
    const double rms_fundamental = first.amplitude / std::numbers::sqrt2;
    result.thd_plus_noise =
        rms_fundamental > 0 ? std::sqrt(residual / count) / rms_fundamental : 0.0;
  }

  if (whole >= 2) {
    const double before_start = tr.time.back() - 2.0 * period;
    const std::vector<double> before = uniform_samples(tr, values, before_start, dt, per_period);
    double change = 0;
    const std::size_t last = static_cast<std::size_t>(count - per_period);
    for (int k = 0; k < per_period; ++k)
      change = std::max(change, std::abs(x[last + k] - before[k]));
    result.period_change = first.amplitude > 0 ? change / first.amplitude : change;
    if (result.period_change > kSettleLimit) {
      result.settled = false;
      result.message = "the last two periods differ by " +
                       std::to_string(100.0 * result.period_change) +
                       " % of the fundamental: the waveform has not settled; run longer";
    }
  }
  return result;
}

}  // namespace stage
