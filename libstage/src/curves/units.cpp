// Curve-file units: see units.hpp. The prefixes are the `.stage` language's
// (spec section 1), so a curve file reads like a circuit file.
#include "curves/units.hpp"

#include <array>
#include <utility>

#include "curves/curve_kinds.hpp"

namespace stage::curves {
namespace {

constexpr std::array<std::pair<std::string_view, double>, 10> kPrefixes{{{"f", 1e-15},
                                                                         {"p", 1e-12},
                                                                         {"n", 1e-9},
                                                                         {"u", 1e-6},
                                                                         {"µ", 1e-6},
                                                                         {"m", 1e-3},
                                                                         {"k", 1e3},
                                                                         {"M", 1e6},
                                                                         {"G", 1e9},
                                                                         {"", 1}}};

std::optional<double> prefixed(std::string_view text, std::string_view unit) {
  for (const auto& [prefix, factor] : kPrefixes) {
    if (text.size() == prefix.size() + unit.size() && text.substr(0, prefix.size()) == prefix &&
        text.substr(prefix.size()) == unit) {
      return factor;
    }
  }
  return std::nullopt;
}

}  // namespace

std::optional<UnitScale> parse_unit(std::string_view text, CurveQuantity quantity) {
  const std::string_view unit = info(quantity).unit;
  if (unit == "1") {
    if (text == "1" || text.empty()) return UnitScale{};
    return std::nullopt;
  }
  if (quantity == CurveQuantity::temperature) {
    if (text == "K") return UnitScale{};
    if (text == "degC" || text == "°C") return UnitScale{1, 273.15};
    return std::nullopt;
  }
  if (const auto factor = prefixed(text, unit)) return UnitScale{*factor, 0};
  return std::nullopt;
}

std::string unit_help(CurveQuantity quantity) {
  const std::string unit(info(quantity).unit);
  if (unit == "1") return "a plain number: write 1";
  if (quantity == CurveQuantity::temperature) return "K or degC";
  return unit + " with an optional prefix f p n u m k M G, as in m" + unit;
}

std::optional<double> parse_tolerance_unit(std::string_view text, CurveQuantity quantity) {
  if (info(quantity).by_ratio) {
    if (text == "%") return 0.01;
    return std::nullopt;
  }
  return prefixed(text, "V");
}

}  // namespace stage::curves
