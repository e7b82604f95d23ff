// Peak and midband gain, corners and unity-gain frequency of a sweep.
#include "analysis/frequency_figures.hpp"

#include <algorithm>
#include <cmath>

#include "common/constants.hpp"

namespace stage::analysis {
namespace {

// 20 log10(sqrt(2)): the "-3 dB" of a corner, where the power has halved.
const double kHalfPowerDB = 10.0 * std::log10(2.0);

// The frequency in [lo, hi] (Hz) where gain_dB_at crosses `target`, by the
// Illinois variant of false position on log10(f): superlinear, and it keeps
// the bracket, so it cannot wander off to another crossing.
double locate_crossing(double lo, double hi, double target,
                       const std::function<double(double)>& gain_dB_at) {
  double a = std::log10(lo), b = std::log10(hi);
  double fa = gain_dB_at(lo) - target, fb = gain_dB_at(hi) - target;
  int side = 0;
  for (int iteration = 0; iteration < 100 && std::abs(b - a) > 1e-15 * std::abs(b) + 1e-300;
       ++iteration) {
    const double c = b - fb * (b - a) / (fb - fa);
    const double fc = gain_dB_at(std::pow(10.0, c)) - target;
    if (fc == 0.0) return std::pow(10.0, c);
    if ((fc > 0) == (fb > 0)) {
      b = c;
      fb = fc;
      if (side == -1) fa /= 2;  // the same end moved twice: pull the other in
      side = -1;
    } else {
      a = c;
      fa = fc;
      if (side == 1) fb /= 2;
      side = 1;
    }
    if (std::abs(fc) < 1e-13 * std::max(1.0, std::abs(target))) return std::pow(10.0, c);
  }
  return std::pow(10.0, std::abs(fa) < std::abs(fb) ? a : b);
}

}  // namespace

FrequencyFigures find_figures(const std::vector<double>& frequencies,
                              const std::vector<double>& gain_dB,
                              const std::function<double(double)>& gain_dB_at) {
  FrequencyFigures figures;
  const auto peak =
      static_cast<std::size_t>(std::max_element(gain_dB.begin(), gain_dB.end()) - gain_dB.begin());
  figures.peak_gain_dB = gain_dB[peak];
  figures.peak_frequency = frequencies[peak];

  // The band: the grid points on either side of the peak whose gain stays
  // within the half-power drop of it, ending at a corner or at the sweep's
  // end. Midband is the grid point nearest its centre on a log scale, so a
  // flat response's midband sits in the middle of the flat part, not at
  // whichever end a slight slope happens to favour.
  const double corner = figures.peak_gain_dB - kHalfPowerDB;
  std::size_t first = peak, last = peak;
  while (first > 0 && gain_dB[first - 1] >= corner) --first;
  while (last + 1 < gain_dB.size() && gain_dB[last + 1] >= corner) ++last;
  const double centre = std::sqrt(frequencies[first] * frequencies[last]);
  std::size_t middle = first;
  for (std::size_t i = first; i <= last; ++i) {
    if (std::abs(std::log(frequencies[i] / centre)) <
        std::abs(std::log(frequencies[middle] / centre)))
      middle = i;
  }
  figures.midband_gain_dB = gain_dB[middle];
  figures.midband_frequency = frequencies[middle];

  for (std::size_t i = peak; i > 0; --i) {
    if (gain_dB[i - 1] < corner) {
      figures.lower_cutoff =
          locate_crossing(frequencies[i - 1], frequencies[i], corner, gain_dB_at);
      break;
    }
  }
  for (std::size_t i = peak; i + 1 < gain_dB.size(); ++i) {
    if (gain_dB[i + 1] < corner) {
      figures.upper_cutoff =
          locate_crossing(frequencies[i], frequencies[i + 1], corner, gain_dB_at);
      break;
    }
  }
  for (std::size_t i = peak; i + 1 < gain_dB.size() && figures.peak_gain_dB > 0; ++i) {
    if (gain_dB[i + 1] < 0.0) {
      figures.unity_gain_frequency =
          locate_crossing(frequencies[i], frequencies[i + 1], 0.0, gain_dB_at);
      break;
    }
  }
  return figures;
}

double unwrapped_phase_deg(std::complex<double> z, double reference_deg) {
  const double phase = degrees_from_radians(std::arg(z));
  return phase - 360.0 * std::round((phase - reference_deg) / 360.0);
}

}  // namespace stage::analysis
