// Checks of a bipolar transistor against its maximum ratings.
#include "devices/ratings.hpp"

#include <algorithm>
#include <cmath>

namespace stage::devices {

bool has_ratings(const BipolarModel& m) {
  return std::isfinite(m.max_collector_emitter_voltage) ||
         std::isfinite(m.max_collector_base_voltage) || std::isfinite(m.max_emitter_base_voltage) ||
         std::isfinite(m.max_collector_current) || std::isfinite(m.max_dissipation);
}

double derated_dissipation(const BipolarModel& m, double case_kelvin) {
  if (case_kelvin <= m.rated_case_temperature || !std::isfinite(m.max_junction_temperature))
    return m.max_dissipation;
  const double span = m.max_junction_temperature - m.rated_case_temperature;
  return m.max_dissipation * std::max(m.max_junction_temperature - case_kelvin, 0.0) / span;
}

double safe_area_current(const BipolarModel& m, double vce, double case_kelvin) {
  double allowed = std::min(m.max_collector_current, derated_dissipation(m, case_kelvin) / vce);
  if (vce > m.second_breakdown_voltage) {
    // Straight on log axes from (V_sb, P_max / V_sb) to (VCE_max, I_sb).
    const double start = m.max_dissipation / m.second_breakdown_voltage;
    const double slope = std::log(m.second_breakdown_current / start) /
                         std::log(m.max_collector_emitter_voltage / m.second_breakdown_voltage);
    allowed = std::min(allowed, start * std::pow(vce / m.second_breakdown_voltage, slope));
  }
  return allowed;
}

void check_ratings(const std::string& device, const BipolarModel& m, const BipolarStress& s,
                   double case_kelvin, double time, mna::RatingLog& log) {
  const auto check = [&](const char* quantity, double value, double limit) {
    if (value > limit) log.record(device, quantity, value, limit, time);
  };
  check("collector_emitter_voltage", s.vce, m.max_collector_emitter_voltage);
  check("collector_base_voltage", s.vcb, m.max_collector_base_voltage);
  check("emitter_base_voltage", s.veb, m.max_emitter_base_voltage);
  check("collector_current", s.collector_current, m.max_collector_current);
  check("dissipation", s.power, derated_dissipation(m, case_kelvin));
  // The boundary is a limit on the current at each voltage; the plain
  // current and power ratings above already name the cases it shares.
  if (s.vce > 0 && s.collector_current > 0 && std::isfinite(m.second_breakdown_voltage) &&
      s.vce > m.second_breakdown_voltage) {
    check("safe_operating_area", s.collector_current, safe_area_current(m, s.vce, case_kelvin));
  }
}

}  // namespace stage::devices
