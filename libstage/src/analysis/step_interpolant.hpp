// The interpolant of a transient signal, one cubic Hermite piece per step
// (interpolate() in stage/transient.hpp), for the figures that integrate
// over a waveform rather than sample it (spectra, averages, the settle
// check) or look between its samples (peaks).
#pragma once

#include <algorithm>
#include <array>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include "stage/errors.hpp"
#include "stage/transient.hpp"

namespace stage::analysis {

// Cubic Hermite on [t0, t1] through values v0, v1 with slopes d0, d1
// (the Hermite basis: Burden & Faires, Numerical Analysis, section 3.4).
struct HermitePiece {
  double t0 = 0, t1 = 0, v0 = 0, v1 = 0, d0 = 0, d1 = 0;

  double value(double t) const {
    const double h = t1 - t0, s = (t - t0) / h, s2 = s * s, s3 = s2 * s;
    return (2 * s3 - 3 * s2 + 1) * v0 + (s3 - 2 * s2 + s) * h * d0 + (3 * s2 - 2 * s3) * v1 +
           (s3 - s2) * h * d1;
  }
  double slope(double t) const {
    const double h = t1 - t0, s = (t - t0) / h;
    return 6 * (s * s - s) / h * (v0 - v1) + (3 * s * s - 4 * s + 1) * d0 +
           (3 * s * s - 2 * s) * d1;
  }
  // Smallest and largest value over [t0, t1]: the ends and the cubic's
  // stationary points between them, the roots of p'(s) = 3a s^2 + 2b s + c
  // in the piece's own variable s = (t - t0) / h, taken in the form that
  // does not cancel (Press et al., Numerical Recipes, section 5.6).
  std::pair<double, double> range() const {
    const double h = t1 - t0;
    const double a = 2 * (v0 - v1) + h * (d0 + d1), b = 3 * (v1 - v0) - h * (2 * d0 + d1);
    const double c = h * d0;
    std::pair<double, double> r{std::min(v0, v1), std::max(v0, v1)};
    const auto consider = [&](double s) {
      if (!(s > 0 && s < 1)) return;
      const double v = value(t0 + s * h);
      r = {std::min(r.first, v), std::max(r.second, v)};
    };
    const double discriminant = b * b - 3 * a * c;
    if (discriminant < 0) return r;
    const double q = -(b + std::copysign(std::sqrt(discriminant), b));
    if (a != 0) consider(q / (3 * a));
    if (q != 0) consider(c / q);
    return r;
  }
};

// The step of `time` that holds t: k with time[k] <= t < time[k + 1],
// clamped to the first and last step. Needs two samples or more.
inline std::size_t step_holding(const std::vector<double>& time, double t) {
  const auto after = std::upper_bound(time.begin(), time.end(), t) - time.begin();
  return static_cast<std::size_t>(
      std::clamp<std::ptrdiff_t>(after - 1, 0, static_cast<std::ptrdiff_t>(time.size()) - 2));
}

// The piece of step k (time[k] to time[k + 1]); a signal without slopes
// (built by hand) gets the line.
inline HermitePiece step_piece(const TransientResult& r, const TransientSignal& s, std::size_t k) {
  HermitePiece p{r.time[k], r.time[k + 1], s.values[k], s.values[k + 1], 0, 0};
  if (s.slope_out.empty()) {
    p.d0 = p.d1 = (p.v1 - p.v0) / (p.t1 - p.t0);
  } else {
    p.d0 = s.slope_out[k];
    p.d1 = s.slope_in[k + 1];
  }
  return p;
}

// Calls fn(t, weight, k) at the nodes of a quadrature of [from, to] that
// follows the steps of `time` and splits each into panels no longer than
// max_panel: 4-point Gauss–Legendre per panel, exact for polynomials of
// degree 7 (Abramowitz & Stegun, table 25.4), so for products of two
// pieces of the interpolant, and for a piece times a sinusoid to
// (4!)^4 / (9 (8!)^3) theta^8 ~ 6e-10 theta^8 relative, theta being the
// sinusoid's phase advance over a panel. k is the step holding t.
template <class Fn>
void for_each_quadrature_node(const std::vector<double>& time, double from, double to,
                              double max_panel, Fn&& fn) {
  static constexpr std::array<double, 4> kNodes{-0.8611363115940526, -0.3399810435848563,
                                                0.3399810435848563, 0.8611363115940526};
  static constexpr std::array<double, 4> kWeights{0.3478548451374538, 0.6521451548625461,
                                                  0.6521451548625461, 0.3478548451374538};
  std::size_t k = step_holding(time, from);
  for (double a = from; a < to; ++k) {
    const double b = k + 1 < time.size() - 1 ? std::min(time[k + 1], to) : to;
    const int panels = std::max(1, static_cast<int>(std::ceil((b - a) / max_panel)));
    const double length = (b - a) / panels;
    for (int p = 0; p < panels; ++p) {
      const double mid = a + (p + 0.5) * length;
      for (std::size_t g = 0; g < kNodes.size(); ++g) {
        fn(mid + 0.5 * length * kNodes[g], 0.5 * length * kWeights[g], k);
      }
    }
    a = b;
  }
}

// Mean of the interpolant over [from, to], integrated exactly (one
// quadrature panel per step holds a cubic exactly).
inline double mean(const TransientResult& r, const TransientSignal& s, double from, double to) {
  double area = 0;
  for_each_quadrature_node(r.time, from, to, to - from,
                           [&](double t, double weight, std::size_t k) {
                             area += weight * step_piece(r, s, k).value(t);
                           });
  return area / (to - from);
}

// The signal called `name`; throws an invalid_request Error if there is none.
inline const TransientSignal& signal_named(const TransientResult& r, const std::string& name) {
  for (const auto& s : r.signals) {
    if (s.name == name) return s;
  }
  throw Error(ErrorKind::invalid_request, "the transient has no signal '" + name + "'", {name});
}

}  // namespace stage::analysis
