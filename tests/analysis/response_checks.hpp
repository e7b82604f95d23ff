// Comparisons shared by the frequency tests: a complex response against an
// exact one, and the dB and degree figures derived from it.
#pragma once

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>

namespace stage::test {

using Complex = std::complex<double>;

inline Complex jw(double f) { return {0.0, 2.0 * std::numbers::pi * f}; }

// |got - want| <= relative |want|: bounds both the relative magnitude error
// and the phase error (in radians) by `relative`.
inline void expect_response(Complex got, Complex want, double relative, const char* what,
                            double f) {
  EXPECT_LE(std::abs(got - want), relative * std::abs(want))
      << what << " at " << f << " Hz: got " << got << ", want " << want;
}

// Phase difference in degrees, taken modulo whole turns.
inline double phase_difference_deg(double a, double b) { return std::remainder(a - b, 360.0); }

}  // namespace stage::test
