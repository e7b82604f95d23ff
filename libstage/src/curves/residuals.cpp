// Point errors and weighted residuals: see residuals.hpp.
#include "curves/residuals.hpp"

#include <algorithm>
#include <cmath>

namespace stage::curves {
namespace {

// A model value at or below zero where the reference is a positive
// magnitude (a current that changed sign) is taken as a millionth of the
// reference: far out of any tolerance, yet finite for the fit.
constexpr double kFloorRatio = 1e-6;

double log_ratio(double reference, double model) {
  return std::log(std::max(model, reference * kFloorRatio) / reference);
}

}  // namespace

bool spans_decades(const Curve& curve, std::size_t k) {
  if (!compared_by_ratio(curve.measured[k])) return false;
  double lo = INFINITY, hi = 0;
  for (const auto& p : curve.points) {
    lo = std::min(lo, p.measured[k]);
    hi = std::max(hi, p.measured[k]);
  }
  return hi >= 10 * lo;
}

double point_error(double reference, double model, bool by_ratio, bool log_scale) {
  if (!by_ratio) return model - reference;
  if (!log_scale) return model / reference - 1;
  const double l = log_ratio(reference, model);
  return l >= 0 ? std::expm1(l) : -std::expm1(-l);
}

double weighted_residual(double reference, double model, double tolerance, bool by_ratio,
                         bool log_scale) {
  if (by_ratio && log_scale) return log_ratio(reference, model) / std::log1p(tolerance);
  return point_error(reference, model, by_ratio, false) / tolerance;
}

}  // namespace stage::curves
