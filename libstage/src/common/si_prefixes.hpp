// The one table of SI prefixes (spec section 1: a f p n u µ m k M G T):
// the reader's numbers and units, the curve files' units, the reports'
// engineering notation and the command's tolerances all read it.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <string_view>

namespace stage::text {

// How a prefix is written.
enum class Spelling {
  standard,  // the SI symbol: what reports print and messages list
  ascii,     // an ASCII stand-in input may use (u for µ); messages list it
  lookalike  // another code point that looks the same (Greek μ for the micro sign µ)
};

struct SiPrefix {
  std::string_view symbol;
  int exponent;  // the prefix stands for 10^exponent
  Spelling spelling = Spelling::standard;
};

// In the spec's order. No symbol begins another, so a word's prefix is
// found whatever the order.
inline constexpr std::array<SiPrefix, 12> kSiPrefixes{{
    {"a", -18},
    {"f", -15},
    {"p", -12},
    {"n", -9},
    {"u", -6, Spelling::ascii},
    {"µ", -6},                       // U+00B5 MICRO SIGN
    {"μ", -6, Spelling::lookalike},  // U+03BC GREEK SMALL LETTER MU
    {"m", -3},
    {"k", 3},
    {"M", 6},
    {"G", 9},
    {"T", 12},
}};

// 10^exponent, equal to the literal 1e<exponent> for |exponent| <= 22:
// every power of ten up to 1e22 is exact in a double, so the product is
// exact and the one division rounds 1 / 10^n correctly, as the literal is.
constexpr double power_of_ten(int exponent) {
  double magnitude = 1;
  for (int k = 0; k < (exponent < 0 ? -exponent : exponent); ++k) magnitude *= 10;
  return exponent < 0 ? 1 / magnitude : magnitude;
}

constexpr double scale_of(const SiPrefix& prefix) { return power_of_ten(prefix.exponent); }

// The standard symbol of 10^exponent ("" for 0); nothing when no prefix
// stands for it.
std::optional<std::string_view> standard_prefix(int exponent);

// `text` read as `unit` with an optional prefix touching it: its scale
// ("mV" as "V" gives 1e-3, "V" gives 1); nothing when it is not that unit.
std::optional<double> prefixed_unit_scale(std::string_view text, std::string_view unit);

// The prefixes for a message, separated by spaces: "a f p n u µ m k M G T".
std::string listed_prefixes();

}  // namespace stage::text
