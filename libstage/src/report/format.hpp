// Shared pieces of every readable report: aligned text tables and the JSON
// type, with the engineering notation of common/si_format.hpp.
#pragma once

#include <nlohmann/json.hpp>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include "common/si_format.hpp"
#include "report/indexed_object.hpp"

namespace stage::report {

using text::fixed;
using text::percent;
using text::si;

// The JSON document keeps keys in the order written (spec section 7 puts
// "kind" first), so every report builds ordered objects; they are indexed, so
// that an object of n names fills in O(n) time.
using Json = nlohmann::basic_json<IndexedObject>;

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

// The unit of a recorded signal: "<element>.current" is a current ("A"),
// every other signal a voltage ("V").
std::string_view signal_unit(std::string_view signal);

// A value for a CSV cell: full precision, "inf" written out.
std::string csv_number(double value);

}  // namespace stage::report
