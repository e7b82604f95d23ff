// Curve-file units: see units.hpp. The prefixes are the `.stage` language's
// (spec section 1), so a curve file reads like a circuit file.
#include "curves/units.hpp"

#include "common/constants.hpp"
#include "common/si_prefixes.hpp"
#include "curves/curve_kinds.hpp"

namespace stage::curves {

std::optional<UnitScale> parse_unit(std::string_view text, CurveQuantity quantity) {
  const std::string_view unit = info(quantity).unit;
  if (unit == "1") {
    if (text == "1" || text.empty()) return UnitScale{};
    return std::nullopt;
  }
  if (quantity == CurveQuantity::temperature) {
    if (text == "K") return UnitScale{};
    if (text == "degC" || text == "°C") return UnitScale{1, kZeroCelsius};
    return std::nullopt;
  }
  if (const auto factor = text::prefixed_unit_scale(text, unit)) return UnitScale{*factor, 0};
  return std::nullopt;
}

std::string unit_help(CurveQuantity quantity) {
  const std::string unit(info(quantity).unit);
  if (unit == "1") return "a plain number: write 1";
  if (quantity == CurveQuantity::temperature) return "K or degC";
  return unit + " with an optional prefix " + text::listed_prefixes() + ", as in m" + unit;
}

std::optional<double> parse_tolerance_unit(std::string_view text, CurveQuantity quantity) {
  const auto unit = stage::tolerance_unit(text);
  if (!unit || unit->ratio != info(quantity).by_ratio) return std::nullopt;
  return unit->factor;
}

}  // namespace stage::curves

namespace stage {

std::optional<ToleranceUnit> tolerance_unit(std::string_view text) {
  if (text == "%") return ToleranceUnit{true, kPercent};
  if (const auto volts = text::prefixed_unit_scale(text, "V")) return ToleranceUnit{false, *volts};
  return std::nullopt;
}

}  // namespace stage
