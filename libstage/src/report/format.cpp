// Engineering notation and text tables for the readable reports.
#include "report/format.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace stage::report {
namespace {

// Display width of UTF-8 text (Ω and µ take one column, two bytes).
std::size_t width(const std::string& s) {
  return static_cast<std::size_t>(
      std::count_if(s.begin(), s.end(), [](char c) { return (c & 0xC0) != 0x80; }));
}

}  // namespace

std::string si(double value, std::string_view unit, int digits) {
  const std::string space = unit.empty() ? "" : " ";
  if (std::isnan(value)) return "nan";
  if (std::isinf(value)) return std::string(value < 0 ? "-inf" : "inf") + space + std::string(unit);
  static constexpr const char* kPrefixes[] = {"f", "p", "n", "µ", "m", "", "k", "M", "G", "T"};
  int exponent = 0;
  if (value != 0.0) {
    exponent = static_cast<int>(std::floor(std::log10(std::abs(value)) / 3.0)) * 3;
    exponent = std::clamp(exponent, -15, 12);
  }
  double scaled = value / std::pow(10.0, exponent);
  const auto decimals_for = [digits](double v) {
    const int integer_digits = std::abs(v) >= 100 ? 3 : std::abs(v) >= 10 ? 2 : 1;
    return std::max(0, digits - integer_digits);
  };
  // 999.96 m rounds to "1000.0 m": show it as 1.000 of the next prefix.
  const double step = std::pow(10.0, -decimals_for(scaled));
  if (std::abs(std::round(scaled / step) * step) >= 1000 && exponent < 12) {
    exponent += 3;
    scaled /= 1000;
  }
  const int decimals = decimals_for(scaled);
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, scaled);
  const char* prefix = kPrefixes[(exponent + 15) / 3];
  return std::string(buffer) + space + prefix + std::string(unit);
}

std::string fixed(double value, std::string_view unit, int decimals) {
  char buffer[48];
  std::snprintf(buffer, sizeof buffer, "%.*f %s", decimals, value, std::string(unit).c_str());
  return buffer;
}

std::string percent(double ratio) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.4g %%", 100.0 * ratio);
  return buffer;
}

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

std::string csv_number(double value) {
  if (std::isinf(value)) return value < 0 ? "-inf" : "inf";
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.10g", value);
  return buffer;
}

}  // namespace stage::report
