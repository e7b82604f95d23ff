// The text of a generated RC ladder in the circuit language, the scale test
// of the reading, whole-run and output benchmarks: a 1 V source, then per
// section a series resistor, a capacitor and a leakage resistor to ground
// (three elements a section, values our own).
#pragma once

#include <string>
#include <string_view>

namespace stage::benchmarks {

inline std::string rc_ladder_text(int sections, std::string_view analyses = "analyze bias()\n") {
  std::string text = "title \"RC ladder\"\nvin = voltage(n0, gnd, 1 V)\n";
  text.reserve(text.size() + static_cast<std::size_t>(sections) * 110 + analyses.size());
  for (int k = 1; k <= sections; ++k) {
    const std::string here = std::to_string(k), before = std::to_string(k - 1);
    text += "r" + here + " = resistor(n" + before + ", n" + here + ", 1 Ω)\n";
    text += "c" + here + " = capacitor(n" + here + ", gnd, 1 nF)\n";
    text += "g" + here + " = resistor(n" + here + ", gnd, 1 MΩ)\n";
  }
  text += analyses;
  return text;
}

}  // namespace stage::benchmarks
