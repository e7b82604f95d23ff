// Quadratic interpolation of sampled signals and uniform resampling.
#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "stage/transient.hpp"

namespace stage {

const std::vector<double>& TransientResult::signal(const std::string& name) const {
  for (const auto& s : signals) {
    if (s.name == name) return s.values;
  }
  throw std::out_of_range("the transient has no signal '" + name + "'");
}

// The quadratic through the two samples around t and the nearer third one;
// at the ends, the nearest three.
double interpolate(const std::vector<double>& time, const std::vector<double>& values, double t) {
  const std::size_t n = time.size();
  if (n == 0) throw std::invalid_argument("interpolating an empty signal");
  if (n == 1) return values.front();
  std::size_t hi =
      static_cast<std::size_t>(std::upper_bound(time.begin(), time.end(), t) - time.begin());
  hi = std::clamp<std::size_t>(hi, 1, n - 1);
  std::size_t lo = hi - 1;
  if (n == 2)
    return values[lo] + (values[hi] - values[lo]) * (t - time[lo]) / (time[hi] - time[lo]);
  std::size_t first = lo;
  if (lo == 0) {
    first = 0;
  } else if (hi == n - 1 || t - time[lo - 1] < time[hi + 1] - t) {
    first = lo - 1;
  }
  double value = 0;
  for (std::size_t i = first; i < first + 3; ++i) {
    double w = 1.0;
    for (std::size_t j = first; j < first + 3; ++j) {
      if (j != i) w *= (t - time[j]) / (time[i] - time[j]);
    }
    value += w * values[i];
  }
  return value;
}

TransientResult resample(const TransientResult& result, double step) {
  if (!(step > 0)) throw std::invalid_argument("the resampling step must be positive");
  TransientResult out = result;
  out.time.clear();
  if (result.time.empty()) return out;
  const double t0 = result.time.front(), span = result.time.back() - t0;
  // The last grid point may fall a rounding error past the end: keep it.
  const auto count = static_cast<std::size_t>(std::floor(span / step * (1.0 + 1e-12))) + 1;
  for (std::size_t k = 0; k < count; ++k) out.time.push_back(t0 + static_cast<double>(k) * step);
  for (std::size_t s = 0; s < result.signals.size(); ++s) {
    auto& values = out.signals[s].values;
    values.clear();
    for (double t : out.time)
      values.push_back(interpolate(result.time, result.signals[s].values, t));
  }
  return out;
}

}  // namespace stage
