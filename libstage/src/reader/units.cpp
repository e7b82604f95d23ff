// Unit symbols and unit names for messages, and the reading of a unit word
// with its SI prefix (the prefixes are common/si_prefixes.hpp's). One table
// lists every unit symbol so that reading and printing cannot drift apart.
#include <array>
#include <cctype>
#include <string>

#include "common/constants.hpp"
#include "common/si_prefixes.hpp"
#include "reader/unit_table.hpp"

namespace stage {
namespace {

struct UnitSymbol {
  std::string_view symbol;
  Quantity quantity;
  double scale;
  double offset;
  bool takes_prefix;
};

constexpr std::array kUnits{
    UnitSymbol{"V", Quantity::voltage, 1, 0, true},
    UnitSymbol{"A", Quantity::current, 1, 0, true},
    UnitSymbol{"Ω", Quantity::resistance, 1, 0, true},  // U+03A9
    UnitSymbol{"Ω", Quantity::resistance, 1, 0, true},  // U+2126 OHM SIGN
    UnitSymbol{"ohm", Quantity::resistance, 1, 0, true},
    UnitSymbol{"S", Quantity::conductance, 1, 0, true},
    UnitSymbol{"F", Quantity::capacitance, 1, 0, true},
    UnitSymbol{"H", Quantity::inductance, 1, 0, true},
    UnitSymbol{"s", Quantity::time, 1, 0, true},
    UnitSymbol{"Hz", Quantity::frequency, 1, 0, true},
    UnitSymbol{"W", Quantity::power, 1, 0, true},
    UnitSymbol{"K", Quantity::temperature, 1, 0, true},
    UnitSymbol{"°C", Quantity::temperature, 1, kZeroCelsius, false},
    UnitSymbol{"degC", Quantity::temperature, 1, kZeroCelsius, false},
    UnitSymbol{"eV", Quantity::energy, 1, 0, true},
    UnitSymbol{"%", Quantity::ratio, kPercent, 0, false},
    UnitSymbol{"dB", Quantity::decibel, 1, 0, false},
    UnitSymbol{"deg", Quantity::angle, 1, 0, false},
};

}  // namespace

std::string_view unit_name(Quantity quantity) {
  switch (quantity) {
    case Quantity::dimensionless:
      return "no unit";
    case Quantity::voltage:
      return "V";
    case Quantity::current:
      return "A";
    case Quantity::resistance:
      return "Ω";
    case Quantity::conductance:
      return "S";
    case Quantity::capacitance:
      return "F";
    case Quantity::inductance:
      return "H";
    case Quantity::time:
      return "s";
    case Quantity::frequency:
      return "Hz";
    case Quantity::power:
      return "W";
    case Quantity::temperature:
      return "K";
    case Quantity::energy:
      return "eV";
    case Quantity::angle:
      return "deg";
    case Quantity::ratio:
      return "%";
    case Quantity::decibel:
      return "dB";
  }
  return "?";
}

namespace reader {
namespace {

// The reading itself; read_unit adds what a failed word probably meant.
UnitReading read_known_unit(std::string_view word, bool touching) {
  for (const UnitSymbol& unit : kUnits) {
    if (word == unit.symbol) return {unit.scale, unit.offset, unit.quantity, {}};
  }
  for (const text::SiPrefix& prefix : text::kSiPrefixes) {
    if (!word.starts_with(prefix.symbol)) continue;
    const std::string_view rest = word.substr(prefix.symbol.size());
    if (rest.empty()) {
      if (touching) return {text::scale_of(prefix), 0, std::nullopt, {}};
      return {1, 0, std::nullopt,
              "the prefix '" + std::string(word) +
                  "' must touch the number (write it without a space, e.g. 4.7k)"};
    }
    for (const UnitSymbol& unit : kUnits) {
      if (rest == unit.symbol && unit.takes_prefix) {
        return {text::scale_of(prefix) * unit.scale, 0, unit.quantity, {}};
      }
    }
  }
  return {1, 0, std::nullopt, "'" + std::string(word) + "' is not a unit or SI prefix"};
}

// "; did you mean 'kΩ'?" when the word reads with its first letter's case
// swapped (prefixes are case-sensitive: m is milli, M mega), else "".
std::string other_case_hint(std::string_view word) {
  if (word.empty() || !std::isalpha(static_cast<unsigned char>(word[0]))) return "";
  std::string swapped(word);
  const auto c = static_cast<unsigned char>(swapped[0]);
  swapped[0] = static_cast<char>(std::isupper(c) ? std::tolower(c) : std::toupper(c));
  if (!read_known_unit(swapped, true).error.empty()) return "";
  return "; did you mean '" + swapped + "'? (prefixes are case-sensitive: k kilo, m milli, M mega)";
}

}  // namespace

UnitReading read_unit(std::string_view word, bool touching) {
  UnitReading reading = read_known_unit(word, touching);
  if (!reading.error.empty() && reading.error.ends_with("is not a unit or SI prefix")) {
    reading.error += other_case_hint(word);
  }
  return reading;
}

bool units_fit(Quantity given, Quantity wanted) {
  const auto fraction = [](Quantity q) {
    return q == Quantity::dimensionless || q == Quantity::ratio;
  };
  return given == wanted || (fraction(given) && fraction(wanted));
}

}  // namespace reader
}  // namespace stage
