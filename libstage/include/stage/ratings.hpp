// A device's maximum ratings exceeded by a result: which quantity, how far,
// and when (spec section 7, "Ratings"). Results are simulations of models;
// the real device's ratings and safe operating area govern.
#pragma once

#include <limits>
#include <string>
#include <vector>

#include "stage/models.hpp"

namespace stage {

struct RatingViolation {
  std::string device;
  // "collector_emitter_voltage", "collector_base_voltage",
  // "emitter_base_voltage", "collector_current", "dissipation" or
  // "safe_operating_area" (the collector current against the boundary at
  // that collector–emitter voltage).
  std::string quantity;
  double value = 0;  // the worst value reached: V, A or W, in the device's own sense
  double limit = 0;  // the rating where the worst value was reached
  // Transient: when the rating was first exceeded and when the worst value
  // was reached (s); NaN at a bias point.
  double first_time = std::numeric_limits<double>::quiet_NaN();
  double worst_time = std::numeric_limits<double>::quiet_NaN();
};

}  // namespace stage
