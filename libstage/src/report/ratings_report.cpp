// Reports of exceeded maximum ratings.
#include "report/ratings_report.hpp"

#include <cmath>
#include <string_view>

namespace stage::report {
namespace {

std::string_view unit_of(std::string_view quantity) {
  if (quantity.ends_with("voltage")) return "V";
  if (quantity == "dissipation") return "W";
  return "A";  // the collector current, also against the safe operating area
}

}  // namespace

Json ratings_json(const std::vector<RatingViolation>& violations) {
  Json list = Json::array();
  for (const auto& v : violations) {
    Json entry{{"device", v.device},
               {"quantity", v.quantity},
               {"unit", std::string(unit_of(v.quantity))},
               {"value", v.value},
               {"limit", v.limit}};
    if (!std::isnan(v.first_time)) {  // a transient's; a bias point has no time
      entry["first_time_s"] = v.first_time;
      entry["worst_time_s"] = v.worst_time;
    }
    list.push_back(std::move(entry));
  }
  return list;
}

void print_ratings(std::ostream& out, const std::vector<RatingViolation>& violations) {
  if (violations.empty()) return;
  const bool timed = !std::isnan(violations.front().first_time);
  std::vector<std::string> header{"rating exceeded", "device", "worst", "limit there"};
  if (timed) header.insert(header.end(), {"first at", "worst at"});
  TextTable table(header);
  for (const auto& v : violations) {
    const auto unit = unit_of(v.quantity);
    std::vector<std::string> row{v.quantity, v.device, si(v.value, unit), si(v.limit, unit)};
    if (timed) row.insert(row.end(), {si(v.first_time, "s"), si(v.worst_time, "s")});
    table.add_row(row);
  }
  out << "\nMaximum ratings exceeded (simulated; the device's own ratings and safe operating area "
         "govern):\n";
  table.print(out);
}

}  // namespace stage::report
