// Numbers, SI prefixes, units and expressions (spec section 1). Expected
// values are worked by hand in the comments.
#include <cmath>
#include <numbers>

#include "reader_test_support.hpp"

namespace stage::testing {
namespace {

double resistance(const std::string& value) {
  return element<Resistor>(read("r = resistor(a, gnd, " + value + ")\n"), "r").resistance;
}

double let_value(const std::string& expression, const std::string& lets = "") {
  // A let is read through a resistor so the value is observable.
  const Deck deck = read(lets + "let x = " + expression + "\nr = resistor(a, gnd, x)\n");
  return element<Resistor>(deck, "r").resistance;
}

TEST(Numbers, PrefixesTouchTheNumber) {
  EXPECT_DOUBLE_EQ(resistance("4.7k"), 4700);     // 4.7 * 1e3
  EXPECT_DOUBLE_EQ(resistance("4.7 kΩ"), 4700);   // prefix + Ω after a space
  EXPECT_DOUBLE_EQ(resistance("4.7kohm"), 4700);  // prefix + ohm touching
  EXPECT_DOUBLE_EQ(resistance("4.7 kΩ"), 4700);   // U+2126 ohm sign
  EXPECT_DOUBLE_EQ(resistance("1M"), 1e6);        // mega
  EXPECT_DOUBLE_EQ(resistance("1m"), 1e-3);       // milli: case matters
  EXPECT_DOUBLE_EQ(resistance("2.2µ"), 2.2e-6);   // micro sign
  EXPECT_DOUBLE_EQ(resistance("1e3"), 1000);      // exponent, no prefix
  EXPECT_DOUBLE_EQ(resistance("1.5e-3k"), 1.5);   // 1.5e-3 * 1e3
  EXPECT_DOUBLE_EQ(resistance("3G"), 3e9);
  EXPECT_DOUBLE_EQ(resistance("0.5T"), 5e11);
}

TEST(Numbers, CapacitanceAndOtherUnits) {
  const Deck deck = read(
      "c1 = capacitor(a, gnd, 100n)\nc2 = capacitor(a, gnd, 2.2 uF)\n"
      "l1 = inductor(a, b, 10 mH)\nv1 = voltage(b, gnd, 1.5 V)\ni1 = current(a, gnd, dc = 2 mA)\n");
  EXPECT_DOUBLE_EQ(element<Capacitor>(deck, "c1").capacitance, 1e-7);
  EXPECT_DOUBLE_EQ(element<Capacitor>(deck, "c2").capacitance, 2.2e-6);
  EXPECT_DOUBLE_EQ(element<Inductor>(deck, "l1").inductance, 1e-2);
  EXPECT_DOUBLE_EQ(element<VoltageSource>(deck, "v1").dc, 1.5);
  EXPECT_DOUBLE_EQ(element<CurrentSource>(deck, "i1").dc, 2e-3);
}

TEST(Numbers, TemperaturesAndPercent) {
  EXPECT_DOUBLE_EQ(read("temperature 27 °C\n").circuit.temperature, 300.15);  // 27 + 273.15
  EXPECT_DOUBLE_EQ(read("temperature 50 degC\n").circuit.temperature, 323.15);
  EXPECT_DOUBLE_EQ(read("temperature 310 K\n").circuit.temperature, 310);
  EXPECT_DOUBLE_EQ(read("temperature -40 °C\n").circuit.temperature,
                   233.15);  // sign is the number's
  const Deck deck = read(
      "v = voltage(a, gnd, 1)\nr = resistor(a, gnd, 1k)\n"
      "analyze headroom(input = v, output = a, distortion_limit = 1 %)\n");
  EXPECT_DOUBLE_EQ(std::get<HeadroomOptions>(deck.analyses[0].options).distortion_limit, 0.01);
}

TEST(Numbers, InfinityIsAValue) {
  const Deck deck = read("model m = npn { early_voltage_forward = inf }\n");
  EXPECT_TRUE(std::isinf(deck.circuit.bipolar_models().at("m").early_voltage_forward));
}

TEST(Expressions, Arithmetic) {
  EXPECT_DOUBLE_EQ(let_value("1 + 2 * 3"), 7);  // * before +
  EXPECT_DOUBLE_EQ(let_value("(1 + 2) * 3"), 9);
  EXPECT_DOUBLE_EQ(let_value("2 ^ 3 ^ 2"), 512);  // right-grouping: 2^9
  EXPECT_DOUBLE_EQ(let_value("-2 ^ 2 + 10"), 6);  // -(2^2) + 10
  EXPECT_DOUBLE_EQ(let_value("10 / 4 - 1"), 1.5);
  EXPECT_DOUBLE_EQ(let_value("2 ^ -1 * 8"), 4);  // 0.5 * 8
  EXPECT_DOUBLE_EQ(let_value("- -3"), 3);
}

TEST(Expressions, FunctionsAndPi) {
  EXPECT_DOUBLE_EQ(let_value("sqrt(16)"), 4);
  EXPECT_DOUBLE_EQ(let_value("exp(0) + ln(1) + 1"), 2);  // 1 + 0 + 1
  EXPECT_DOUBLE_EQ(let_value("log10(1000)"), 3);
  EXPECT_DOUBLE_EQ(let_value("1 + sin(0) + cos(0)"), 2);  // 1 + 0 + 1
  EXPECT_DOUBLE_EQ(let_value("1 + tan(pi / 4)"), 2);      // tan 45° = 1
  EXPECT_DOUBLE_EQ(let_value("atan(1) * 4"), std::numbers::pi);
  EXPECT_DOUBLE_EQ(let_value("abs(-3)"), 3);
  EXPECT_DOUBLE_EQ(let_value("min(5, 2, 9) + max(1, 4)"), 6);  // 2 + 4
  EXPECT_DOUBLE_EQ(let_value("pow(2, 10)"), 1024);
  EXPECT_DOUBLE_EQ(let_value("2 * pi"), 2 * std::numbers::pi);
}

TEST(Expressions, LetNamesAndResonance) {
  // f0 = 1 / (2π sqrt(L C)) with L = 1 mH, C = 1 µF: sqrt(1e-9) = 3.16228e-5,
  // 2π * 3.16228e-5 = 1.98692e-4, so f0 = 5032.92 Hz.
  const double f0 = let_value("1 / (2*pi*sqrt(l1 * c1))", "let l1 = 1 mH\nlet c1 = 1 uF\n");
  EXPECT_NEAR(f0, 5032.921210448704, 1e-9);
  EXPECT_DOUBLE_EQ(let_value("rl * 2", "let rl = 32 Ω\n"), 64);
}

TEST(Expressions, UnitsFollowValues) {
  expect_error("let rl = 32 Ω\nc = capacitor(a, gnd, rl)\n", 2, 23, "expected a value in F");
  expect_error("let x = 1 V + 2 mA\n", 1, 13, "cannot add A to a value in V");
  expect_error("let x = 1 / 0\n", 1, 11, "division by zero");
  expect_error("let x = sqrt(-1)\n", 1, 9, "sqrt is not defined");
  expect_error("let x = sqr(2)\n", 1, 9, "nearest: sqrt");
  expect_error("let rload = 8\nlet x = rlaod * 2\n", 2, 9, "nearest: rload");
}

TEST(Numbers, UnitErrors) {
  expect_error("r = resistor(a, b, 4.7 k)\n", 1, 24, "must touch the number");
  expect_error("r = resistor(a, b, 10 nF)\n", 1, 20,
               "expected a value in Ω, but this value is in F");
  expect_error("r = resistor(a, b, 10 kX)\n", 1, 23, "'kX' is not a unit");
  expect_error("r = resistor(a, b, 1e999)\n", 1, 20, "too large");
}

}  // namespace
}  // namespace stage::testing
