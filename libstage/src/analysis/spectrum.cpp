// Harmonic analysis of the last whole periods of a transient signal.
//
// The Fourier integrals over the last `periods` whole periods are taken of
// the transient's own interpolant (interpolate(): a cubic Hermite per step),
// step by step with Gauss–Legendre panels short enough that the highest
// harmonic turns at most kPanelPhase radians over one (error bound in
// step_interpolant.hpp: ~1e-12 relative). A corner of the waveform is a
// step boundary of the transient, so the integrals are exact across it
// instead of smearing it into a resampled grid.
//
// Settling: the RMS of x(t) - x(t - T) over the last period, relative to the
// fundamental's RMS A_1 / sqrt 2. It is integrated the same way, on the
// steps of both periods merged (the integrand is then a polynomial of
// degree 6, integrated exactly), so it weighs a difference by how long it
// lasts: one sample at a corner cannot dominate it, a drift still does.
#include "stage/spectrum.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

#include "analysis/step_interpolant.hpp"
#include "common/constants.hpp"
#include "common/si_format.hpp"
#include "stage/errors.hpp"

namespace stage {
namespace {

// Radians the highest harmonic turns over one quadrature panel.
constexpr double kPanelPhase = 0.5;
// Last two periods differing by more than this fraction of the fundamental
// (RMS over RMS) count as not settled (common practice: well below the
// distortion figures of interest).
constexpr double kSettleLimit = 1e-3;

// RMS of x(t) - x(t - period) over [end - period, end].
double rms_period_change(const TransientResult& tr, const TransientSignal& signal, double end,
                         double period) {
  const double start = end - period;
  std::vector<double> edges{start, end};
  for (double t : tr.time) {
    if (t > start && t < end) edges.push_back(t);
    if (t > start - period && t < start) edges.push_back(t + period);
  }
  std::sort(edges.begin(), edges.end());
  double sum = 0;
  analysis::for_each_quadrature_node(
      edges, start, end, period, [&](double t, double weight, std::size_t) {
        const double d = interpolate(tr, signal, t) - interpolate(tr, signal, t - period);
        sum += weight * d * d;
      });
  return std::sqrt(sum / period);
}

// The whole periods the transient holds (a rounding short of one counts).
int whole_periods(const TransientResult& tr, double period) {
  const double length = tr.time.empty() ? 0.0 : tr.time.back() - tr.time.front();
  return static_cast<int>(std::floor(length / period * (1.0 + 1e-9)));
}

// The analysed stretch of a signal: from t0 to the transient's end, in
// quadrature panels of at most max_panel.
struct Stretch {
  const TransientResult& tr;
  const TransientSignal& signal;
  double t0 = 0;
  double length = 0;
  double max_panel = 0;
  double omega = 0;  // rad/s of the fundamental

  template <typename F>
  void integrate(F&& at_node) const {
    analysis::for_each_quadrature_node(
        tr.time, t0, tr.time.back(), max_panel, [&](double t, double weight, std::size_t k) {
          at_node(t, weight, analysis::step_piece(tr, signal, k).value(t));
        });
  }
};

// The DC, each harmonic's amplitude and phase (cosine and sine parts of the
// interpolant's Fourier integrals), and the THD.
void fourier_series(const Stretch& s, int harmonics, SpectrumResult& result) {
  std::vector<double> a(static_cast<std::size_t>(harmonics) + 1, 0.0), b(a.size(), 0.0);
  double dc = 0;
  s.integrate([&](double t, double weight, double value) {
    const double v = value * weight;
    dc += v;
    for (int n = 1; n <= harmonics; ++n) {
      a[n] += v * std::cos(n * s.omega * t);
      b[n] += v * std::sin(n * s.omega * t);
    }
  });
  result.dc = dc / s.length;
  double harmonic_power = 0;
  for (int n = 1; n <= harmonics; ++n) {
    const double cosine = 2.0 * a[n] / s.length, sine = 2.0 * b[n] / s.length;
    const double amplitude = std::hypot(cosine, sine);
    result.harmonics.push_back({n, amplitude, degrees_from_radians(std::atan2(cosine, sine))});
    if (n > 1) harmonic_power += amplitude * amplitude;
  }
  const Harmonic& first = result.harmonics.front();
  result.thd = first.amplitude > 0 ? std::sqrt(harmonic_power) / first.amplitude : 0.0;
}

// The RMS of what is left once the DC and the fundamental are taken away,
// over the fundamental's RMS.
double thd_plus_noise(const Stretch& s, const SpectrumResult& result, double rms_fundamental) {
  const Harmonic& first = result.harmonics.front();
  double residual = 0;
  const double phi = radians_from_degrees(first.phase_deg);
  s.integrate([&](double t, double weight, double value) {
    const double r = value - result.dc - first.amplitude * std::sin(s.omega * t + phi);
    residual += weight * r * r;
  });
  return rms_fundamental > 0 ? std::sqrt(residual / s.length) / rms_fundamental : 0.0;
}

}  // namespace

SpectrumResult run_spectrum(const TransientResult& tr, const SpectrumOptions& options,
                            int periods) {
  if (!(options.fundamental > 0) || options.harmonics < 1 || periods < 1) {
    throw Error(ErrorKind::invalid_request,
                "a spectrum needs a positive fundamental, harmonics and periods",
                {"fundamental", "harmonics"});
  }
  SpectrumResult result;
  result.signal = options.signal.label();
  result.fundamental = options.fundamental;
  const TransientSignal& signal = analysis::signal_named(tr, result.signal);
  const double period = 1.0 / options.fundamental;
  const int whole = whole_periods(tr, period);
  if (whole < 1) {
    throw Error(ErrorKind::invalid_request,
                "the transient is shorter than one period of the fundamental",
                {result.signal, "fundamental"});
  }
  result.periods = std::min(periods, whole);
  if (whole < periods + 1) {
    result.settled = false;
    result.message = "the transient holds " + std::to_string(whole) + " whole period(s); " +
                     std::to_string(periods + 1) +
                     " are needed to analyse the last and check it has settled";
  }

  const double omega = kTwoPi * options.fundamental;
  const Stretch stretch{tr,
                        signal,
                        tr.time.back() - result.periods * period,
                        result.periods * period,
                        kPanelPhase / (omega * options.harmonics),
                        omega};
  fourier_series(stretch, options.harmonics, result);
  const double rms_fundamental = result.harmonics.front().amplitude / std::numbers::sqrt2;
  if (options.with_noise) result.thd_plus_noise = thd_plus_noise(stretch, result, rms_fundamental);

  if (whole >= 2) {
    const double change = rms_period_change(tr, signal, tr.time.back(), period);
    result.period_change = rms_fundamental > 0 ? change / rms_fundamental : change;
    if (result.period_change > kSettleLimit) {
      result.settled = false;
      result.message = "the last two periods differ by " + text::percent(result.period_change) +
                       " of the fundamental (RMS): the waveform has not settled";
    }
  }
  return result;
}

}  // namespace stage
