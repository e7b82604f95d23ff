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

// Reports print up to tera; a larger figure in powers of ten.
constexpr int kLargestExponent = 12;

// What a figure smaller than the smallest prefix becomes.
enum class Below { rounded_in_smallest, power_of_ten };

std::string engineering(double value, std::string_view unit, int digits, int smallest_exponent,
                        Below below) {
  const std::string suffix = unit.empty() ? "" : " " + std::string(unit);
  if (std::isnan(value)) return "nan";
  if (std::isinf(value)) return (value < 0 ? "-∞" : "∞") + suffix;
  char buffer[64];
  const auto power_of_ten = [&] {
    std::snprintf(buffer, sizeof buffer, "%.*e", std::max(0, digits - 1), value);
    return std::string(buffer) + suffix;
  };
  int exponent = 0;
  if (value != 0.0) {
    exponent = static_cast<int>(std::floor(std::log10(std::abs(value)) / 3.0)) * 3;
    if (exponent < smallest_exponent && below == Below::power_of_ten) return power_of_ten();
    exponent = std::clamp(exponent, smallest_exponent, kLargestExponent);
  }
  double scaled = value / std::pow(10.0, exponent);
  const auto decimals_for = [digits](double v) {
    const int integer_digits = std::abs(v) >= 100 ? 3 : std::abs(v) >= 10 ? 2 : 1;
    return std::max(0, digits - integer_digits);
  };
  // 999.96 m rounds to "1000.0 m": show it as 1.000 of the next prefix.
  const double step = std::pow(10.0, -decimals_for(scaled));
  const double rounded = std::round(scaled / step) * step;
  // Below what the smallest prefix shows ("-0.000 f"): zero, plainly.
  if (rounded == 0.0) return "0" + suffix;
  if (std::abs(rounded) >= 1000) {
    // Beyond the largest prefix: powers of ten keep the column narrow.
    if (exponent == kLargestExponent) return power_of_ten();
    exponent += 3;
    scaled /= 1000;
  }
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals_for(scaled), scaled);
  return std::string(buffer) + (unit.empty() ? "" : " ") + std::string(*standard_prefix(exponent)) +
         std::string(unit);
}

}  // namespace

std::string si(double value, std::string_view unit, int digits) {
  return engineering(value, unit, digits, -15, Below::rounded_in_smallest);
}

std::string significant(double value, std::string_view unit, int digits) {
  return engineering(value, unit, digits, -18, Below::power_of_ten);
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

std::string counted(std::size_t count, std::string_view one, std::string_view many) {
  return std::to_string(count) + " " + std::string(count == 1 ? one : many);
}

std::string joined(const std::vector<std::string>& names, std::string_view separator) {
  std::string list;
  for (const auto& n : names) list += (list.empty() ? "" : std::string(separator)) + n;
  return list;
}

}  // namespace stage::text
