// Look-ups in the one table of SI prefixes (si_prefixes.hpp).
#include "common/si_prefixes.hpp"

namespace stage::text {

static_assert(power_of_ten(-18) == 1e-18 && power_of_ten(-15) == 1e-15 &&
                  power_of_ten(-12) == 1e-12 && power_of_ten(-9) == 1e-9 &&
                  power_of_ten(-6) == 1e-6 && power_of_ten(-3) == 1e-3 && power_of_ten(3) == 1e3 &&
                  power_of_ten(6) == 1e6 && power_of_ten(9) == 1e9 && power_of_ten(12) == 1e12,
              "each prefix's scale is the literal it replaces");

std::optional<std::string_view> standard_prefix(int exponent) {
  if (exponent == 0) return "";
  for (const SiPrefix& prefix : kSiPrefixes) {
    if (prefix.exponent == exponent && prefix.spelling == Spelling::standard) return prefix.symbol;
  }
  return std::nullopt;
}

std::optional<double> prefixed_unit_scale(std::string_view text, std::string_view unit) {
  if (text == unit) return 1.0;
  if (!text.ends_with(unit)) return std::nullopt;
  const std::string_view prefix = text.substr(0, text.size() - unit.size());
  for (const SiPrefix& p : kSiPrefixes) {
    if (p.symbol == prefix) return scale_of(p);
  }
  return std::nullopt;
}

std::string listed_prefixes() {
  std::string list;
  for (const SiPrefix& prefix : kSiPrefixes) {
    if (prefix.spelling == Spelling::lookalike) continue;
    list += (list.empty() ? "" : " ") + std::string(prefix.symbol);
  }
  return list;
}

}  // namespace stage::text
