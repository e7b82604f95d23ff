// Shared pieces of every readable report: engineering notation with SI
// prefixes, and aligned text tables.
#pragma once

#include <nlohmann/json.hpp>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

namespace stage::report {

// The JSON document keeps keys in the order written (spec section 7 puts
// "kind" first), so every report builds ordered objects.
using Json = nlohmann::ordered_json;

// 0.0047 -> "4.70 m" + unit; keeps `digits` significant digits; "inf" for
// infinity. A unit of "" gives a bare number with prefix.
std::string si(double value, std::string_view unit, int digits = 4);

// Decibels, degrees and percentages read best without an SI prefix
// ("1.2 m°" would only confuse): fixed point, and a ratio as a percentage
// with four significant digits.
std::string fixed(double value, std::string_view unit, int decimals = 2);
std::string percent(double ratio);

// A table printed with columns aligned; the first column left-aligned, the
// rest right-aligned.
class TextTable {
 public:
  explicit TextTable(std::vector<std::string> header);
  void add_row(std::vector<std::string> cells);
  void print(std::ostream& out, int indent = 2) const;
  bool empty() const { return rows_.empty(); }

 private:
  std::vector<std::string> header_;
  std::vector<std::vector<std::string>> rows_;
};

// A value for a CSV cell: full precision, "inf" written out.
std::string csv_number(double value);

}  // namespace stage::report
