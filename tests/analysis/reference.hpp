// Helpers shared by the transient tests: solver settings by method and
// tolerance, the largest deviation of a simulated signal from an exact
// solution, and the Fourier series of a symmetrically clipped sine.
#pragma once

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <numbers>
#include <string>

#include "stage/transient.hpp"

namespace stage::testing {

// The default solver settings with this integration method and relative
// tolerance.
inline SolverOptions solver(Integration integration,
                            double relative_tolerance = SolverOptions{}.relative_tolerance) {
  SolverOptions s;
  s.integration = integration;
  s.relative_tolerance = relative_tolerance;
  return s;
}

// max over the samples of |signal(t) - exact(t)|.
inline double max_error(const TransientResult& r, const std::string& signal,
                        const std::function<double(double)>& exact) {
  const auto& v = r.signal(signal);
  double worst = 0;
  for (std::size_t k = 0; k < r.time.size(); ++k) {
    worst = std::max(worst, std::abs(v[k] - exact(r.time[k])));
  }
  return worst;
}

// Test names for the integration methods ("tr_bdf2", "trapezoidal",
// "bdf2") instead of the enum's raw bytes.
inline std::string integration_name(const ::testing::TestParamInfo<Integration>& info) {
  switch (info.param) {
    case Integration::tr_bdf2:
      return "tr_bdf2";
    case Integration::trapezoidal:
      return "trapezoidal";
    case Integration::bdf2:
      return "bdf2";
  }
  return "unknown";
}

// Amplitude of harmonic n of A sin(theta) clipped at +-level (level < A),
// derived here. The wave is odd with quarter-wave symmetry, so only odd
// sine terms remain: b_n = (4/pi) int_0^{pi/2} x(theta) sin(n theta) dtheta.
// With theta_c = asin(level / A),
//   b_n = (4/pi) [A int_0^theta_c sin(theta) sin(n theta) dtheta
//                 + level int_theta_c^{pi/2} sin(n theta) dtheta]
//       = (4/pi) [(A/2) (sin((n-1) theta_c)/(n-1) - sin((n+1) theta_c)/(n+1))
//                 + level cos(n theta_c) / n]           (odd n >= 3),
// and with level = A sin(theta_c), sin a cos b = (sin(a+b) - sin(b-a))/2:
//   b_n = (2A / (pi n)) [sin((n-1) theta_c)/(n-1) + sin((n+1) theta_c)/(n+1)],
// where for n = 1 the first term is its limit theta_c:
//   b_1 = (2A/pi) (theta_c + sin(theta_c) cos(theta_c))
//       = (2A/pi) (theta_c - sin(theta_c) cos(theta_c)) + (4 level/pi) cos(theta_c).
// Even n: 0 (half-wave symmetry). Returns |b_n|.
inline double clipped_sine_harmonic(int n, double amplitude, double level) {
  if (n % 2 == 0) return 0.0;
  const double tc = std::asin(level / amplitude);
  const double below = n == 1 ? tc : std::sin((n - 1) * tc) / (n - 1);
  return std::abs(2 * amplitude / (std::numbers::pi * n) *
                  (below + std::sin((n + 1) * tc) / (n + 1)));
}

}  // namespace stage::testing
