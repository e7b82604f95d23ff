// The interpolant of sampled signals (cubic Hermite per step, see
// step_interpolant.hpp) and uniform resampling.
#include <cmath>
#include <stdexcept>

#include "analysis/step_interpolant.hpp"
#include "stage/errors.hpp"
#include "stage/transient.hpp"

namespace stage {

const std::vector<double>& TransientResult::signal(const std::string& name) const {
  for (const auto& s : signals) {
    if (s.name == name) return s.values;
  }
  throw std::out_of_range("the transient has no signal '" + name + "'");
}

double interpolate(const TransientResult& result, const TransientSignal& signal, double t) {
  const std::size_t n = result.time.size();
  if (n == 0)
    throw Error(ErrorKind::invalid_request, "interpolating an empty signal", {signal.name});
  if (n == 1 || t <= result.time.front()) return signal.values.front();
  if (t >= result.time.back()) return signal.values.back();
  return analysis::step_piece(result, signal, analysis::step_holding(result.time, t)).value(t);
}

TransientResult resample(const TransientResult& result, double step) {
  if (!(step > 0))
    throw Error(ErrorKind::invalid_request, "the resampling step must be positive",
                {"uniform_step"});
  TransientResult out = result;
  out.time.clear();
  if (result.time.empty()) return out;
  const double t0 = result.time.front(), span = result.time.back() - t0;
  // The last grid point may fall a rounding error past the end: keep it.
  const auto count = static_cast<std::size_t>(std::floor(span / step * (1.0 + 1e-12))) + 1;
  for (std::size_t k = 0; k < count; ++k) out.time.push_back(t0 + static_cast<double>(k) * step);
  for (std::size_t s = 0; s < result.signals.size(); ++s) {
    const TransientSignal& from = result.signals[s];
    TransientSignal& to = out.signals[s];
    to.values.clear();
    to.slope_in.clear();
    to.slope_out.clear();
    for (double t : out.time) {
      to.values.push_back(interpolate(result, from, t));
      // The slope of the piece holding t, so that the resampled signal is
      // interpolated by the same rule (a corner between grid points is
      // rounded, which resampling cannot avoid).
      const double slope =
          result.time.size() > 1
              ? analysis::step_piece(result, from, analysis::step_holding(result.time, t)).slope(t)
              : 0.0;
      to.slope_in.push_back(slope);
      to.slope_out.push_back(slope);
    }
  }
  return out;
}

}  // namespace stage
