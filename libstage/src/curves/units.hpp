// Units of curve-file columns and conditions: an SI prefix and the
// quantity's unit ("mA", "pF", "MHz"), degrees Celsius for temperature, and
// the units tolerances are written in (% for ratios, V or mV for voltages).
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "stage/curves.hpp"

namespace stage::curves {

// value_in_si = value * factor + offset (the offset is for degC only).
struct UnitScale {
  double factor = 1;
  double offset = 0;
  double to_si(double value) const { return value * factor + offset; }
};

std::optional<UnitScale> parse_unit(std::string_view text, CurveQuantity quantity);
// What may be written for the quantity, for messages.
std::string unit_help(CurveQuantity quantity);
// The factor from a tolerance's unit to a fraction (ratios) or volts.
std::optional<double> parse_tolerance_unit(std::string_view text, CurveQuantity quantity);

}  // namespace stage::curves
