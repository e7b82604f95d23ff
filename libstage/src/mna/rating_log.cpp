// The rating log: one entry per device and quantity, keeping the worst excess.
#include "mna/rating_log.hpp"

#include <algorithm>

namespace stage::mna {

void RatingLog::record(const std::string& device, std::string_view quantity, double value,
                       double limit, double time) {
  const auto same = [&](const RatingViolation& v) {
    return v.device == device && v.quantity == quantity;
  };
  auto it = std::find_if(violations_.begin(), violations_.end(), same);
  if (it == violations_.end()) {
    violations_.push_back({device, std::string(quantity), value, limit, time, time});
    return;
  }
  // Worst: the largest ratio of value to limit (the SOA limit moves with the
  // voltage, so the ratio, not the value, ranks the samples).
  if (value / limit > it->value / it->limit) {
    it->value = value;
    it->limit = limit;
    it->worst_time = time;
  }
}

}  // namespace stage::mna
