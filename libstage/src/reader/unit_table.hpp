// The unit symbols of the language (spec section 1) and the rule that turns
// the word written after a number, with its SI prefix (common/si_prefixes.hpp),
// into a scale, an offset and the quantity it measures.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "stage/units.hpp"

namespace stage::reader {

struct UnitReading {
  double scale = 1;
  double offset = 0;                 // only °C: added after scaling
  std::optional<Quantity> quantity;  // empty for a bare prefix
  std::string error;                 // non-empty when the word is not a unit
};

// `touching`: the word follows the number with no space (`4.7k`), which a
// bare prefix requires.
UnitReading read_unit(std::string_view word, bool touching);

// Quantities a value of `given` may be used as `wanted`.
bool units_fit(Quantity given, Quantity wanted);

}  // namespace stage::reader
