// Engineering notation for every message and report: SI prefixes, fixed
// point and percentages, and lists of names. At the bottom of the layers, so that an analysis
// can word a note with figures without reaching up into the reports.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace stage::text {

// 0.0047 -> "4.700 m" + unit; keeps `digits` significant digits; "∞" for
// infinity, "0" for zero and for what rounds to zero in femto (a report's
// -0.000 fV of rounding noise reads as zero), powers of ten beyond tera. A
// unit of "" gives a bare number with prefix.
std::string si(double value, std::string_view unit, int digits = 4);
// The same for a figure that is small but never noise (an uncertainty):
// prefixes down to atto, powers of ten below, zero only for zero.
std::string significant(double value, std::string_view unit, int digits);

// Decibels, degrees and percentages read best without an SI prefix
// ("1.2 m°" would only confuse): fixed point, and a ratio as a percentage
// with four significant digits.
std::string fixed(double value, std::string_view unit, int decimals = 2);
std::string percent(double ratio);

// "1 analysis", "3 analyses": a count with its noun in the right number.
std::string counted(std::size_t count, std::string_view one, std::string_view many);

// Names in a list for a message: "a, b, c" (or another separator).
std::string joined(const std::vector<std::string>& names, std::string_view separator = ", ");

}  // namespace stage::text
