// Text tables for the readable reports.
#include "report/format.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>

namespace stage::report {
namespace {

// Display width of UTF-8 text (Ω and µ take one column, two bytes).
std::size_t width(const std::string& s) {
  return static_cast<std::size_t>(
      std::count_if(s.begin(), s.end(), [](char c) { return (c & 0xC0) != 0x80; }));
}

}  // namespace

TextTable::TextTable(std::vector<std::string> header) : header_(std::move(header)) {}

void TextTable::add_row(std::vector<std::string> cells) {
  cells.resize(header_.size());
  rows_.push_back(std::move(cells));
}

void TextTable::print(std::ostream& out, int indent) const {
  std::vector<std::size_t> widths(header_.size());
  for (std::size_t c = 0; c < header_.size(); ++c) {
    widths[c] = width(header_[c]);
    for (const auto& row : rows_) widths[c] = std::max(widths[c], width(row[c]));
  }
  auto line = [&](const std::vector<std::string>& cells) {
    out << std::string(static_cast<std::size_t>(indent), ' ');
    for (std::size_t c = 0; c < cells.size(); ++c) {
      const std::string pad(widths[c] - width(cells[c]), ' ');
      if (c > 0) out << "  ";
      out << (c == 0 ? cells[c] + pad : pad + cells[c]);
    }
    out << '\n';
  };
  line(header_);
  for (const auto& row : rows_) line(row);
}

std::string_view signal_unit(std::string_view signal) {
  return signal.ends_with(".current") ? "A" : "V";
}

// Ten significant digits, as printf's "%.10g" writes them; std::to_chars
// takes a constant time where printf slows down on tiny values (1e-40 V at
// the far end of a long ladder).
std::string csv_number(double value) {
  if (std::isinf(value)) return value < 0 ? "-inf" : "inf";
  char buffer[32];
  const auto end =
      std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::general, 10).ptr;
  return std::string(buffer, end);
}

}  // namespace stage::report
