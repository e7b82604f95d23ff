// Engineering notation with the SI prefixes of common/si_prefixes.hpp,
// fixed-point and percent figures.
#include "common/si_format.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "common/constants.hpp"
#include "common/si_prefixes.hpp"

namespace stage::text {
namespace {

// Reports print from femto to tera: a figure outside is shown with the
// nearest of them (0.001 fA), as it always has been.
constexpr int kSmallestExponent = -15;
constexpr int kLargestExponent = 12;

}  // namespace

std::string si(double value, std::string_view unit, int digits) {
  const std::string space = unit.empty() ? "" : " ";
  if (std::isnan(value)) return "nan";
  if (std::isinf(value)) return std::string(value < 0 ? "-inf" : "inf") + space + std::string(unit);
  int exponent = 0;
  if (value != 0.0) {
    exponent = static_cast<int>(std::floor(std::log10(std::abs(value)) / 3.0)) * 3;
    exponent = std::clamp(exponent, kSmallestExponent, kLargestExponent);
  }
  double scaled = value / std::pow(10.0, exponent);
  const auto decimals_for = [digits](double v) {
    const int integer_digits = std::abs(v) >= 100 ? 3 : std::abs(v) >= 10 ? 2 : 1;
    return std::max(0, digits - integer_digits);
  };
  // 999.96 m rounds to "1000.0 m": show it as 1.000 of the next prefix.
  const double step = std::pow(10.0, -decimals_for(scaled));
  if (std::abs(std::round(scaled / step) * step) >= 1000 && exponent < kLargestExponent) {
    exponent += 3;
    scaled /= 1000;
  }
  const int decimals = decimals_for(scaled);
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, scaled);
  return std::string(buffer) + space + std::string(*standard_prefix(exponent)) + std::string(unit);
}

std::string fixed(double value, std::string_view unit, int decimals) {
  char buffer[48];
  std::snprintf(buffer, sizeof buffer, "%.*f %s", decimals, value, std::string(unit).c_str());
  return buffer;
}

std::string percent(double ratio) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.4g %%", in_percent(ratio));
  return buffer;
}

std::string joined(const std::vector<std::string>& names, std::string_view separator) {
  std::string list;
  for (const auto& n : names) list += (list.empty() ? "" : std::string(separator)) + n;
  return list;
}

}  // namespace stage::text
