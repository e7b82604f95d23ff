// Collects, over an analysis, the worst excess of every rated quantity of
// every device: devices report each sample that exceeds a rating, the log
// keeps one entry per device and quantity (first time, worst value).
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "stage/ratings.hpp"

namespace stage::mna {

class RatingLog {
 public:
  // A sample of `quantity` of `device` at `time` (NaN at a bias point) that
  // exceeds its limit. Allocates only for a device and quantity not yet
  // in the log.
  void record(const std::string& device, std::string_view quantity, double value, double limit,
              double time);
  bool empty() const { return violations_.empty(); }
  const std::vector<RatingViolation>& violations() const { return violations_; }

 private:
  std::vector<RatingViolation> violations_;
};

}  // namespace stage::mna
