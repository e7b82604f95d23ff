// Helpers shared by the transient tests: the largest deviation of a
// simulated signal from an exact solution.
#pragma once

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <string>

#include "stage/transient.hpp"

namespace stage::testing {

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

}  // namespace stage::testing
