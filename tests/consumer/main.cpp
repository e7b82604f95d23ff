// Consumer of the installed package: a divider solved through the public API.
// Exits 0 when v(out) is 10 V * 1k / (1k + 3k) = 2.5 V (Ohm's law).
#include <cmath>
#include <cstdio>

#include "stage/bias.hpp"

int main() {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 10.0});
  c.add("r1", stage::Resistor{"in", "out", 3e3});
  c.add("r2", stage::Resistor{"out", "gnd", 1e3});
  const double v = stage::run_bias(c).voltage("out");
  std::printf("v(out) = %.12g V\n", v);
  return std::abs(v - 2.5) < 1e-12 ? 0 : 1;
}
