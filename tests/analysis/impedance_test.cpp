// Input and output impedance of a resistive/RC network against series and
// parallel combinations worked by hand (Thevenin's theorem: the output
// impedance is the network's with every independent source zeroed), and the
// removal of the load.
#include <gtest/gtest.h>

#include "analysis/response_checks.hpp"
#include "stage/errors.hpp"
#include "stage/frequency.hpp"

namespace {

using stage::Circuit;
using stage::test::Complex;
using stage::test::jw;

constexpr double kR1 = 1e3, kR2 = 3.3e3, kR3 = 680, kR4 = 10e3, kC1 = 22e-9;
constexpr double kTolerance = 1e-9;  // LU on 4 unknowns; see filters_test.cpp

Complex parallel(Complex a, Complex b) { return a * b / (a + b); }

// vin - r1 - a; r2 and c1 from a to ground; r3 from a to out; r4 (load) from
// out to ground.
Circuit network(bool current_input) {
  Circuit c;
  if (current_input) {
    c.add("iin", stage::CurrentSource{"gnd", "a", 0.0, 1e-3});  // drives current into a
  } else {
    c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
    c.add("r1", stage::Resistor{"in", "a", kR1});
  }
  c.add("r2", stage::Resistor{"a", "gnd", kR2});
  c.add("c1", stage::Capacitor{"a", "gnd", kC1});
  c.add("r3", stage::Resistor{"a", "out", kR3});
  c.add("r4", stage::Resistor{"out", "gnd", kR4});
  return c;
}

stage::FrequencyOptions options(std::string input, stage::SignalRef output,
                                std::optional<std::string> load) {
  stage::FrequencyOptions o;
  o.from = 100;
  o.to = 1e7;
  o.per_decade = 5;
  o.input = std::move(input);
  o.output = std::move(output);
  o.load = std::move(load);
  return o;
}

Complex zc(double f) { return 1.0 / (jw(f) * kC1); }

// Zin = R1 + (R2 || C1 || (R3 + R4)); with the load r4 removed, looking into
// out: Zout = R3 + (R1 || R2 || C1); with no load named, that || R4.
TEST(Impedance, VoltageInputNodeOutput) {
  const auto with_load =
      stage::run_frequency(network(false), options("vin", stage::SignalRef::node("out"), "r4"));
  const auto no_load = stage::run_frequency(
      network(false), options("vin", stage::SignalRef::node("out"), std::nullopt));
  for (std::size_t i = 0; i < with_load.frequencies.size(); ++i) {
    const double f = with_load.frequencies[i];
    const Complex zin = kR1 + parallel(parallel(kR2, zc(f)), kR3 + kR4);
    const Complex zout = kR3 + parallel(parallel(kR1, kR2), zc(f));
    stage::test::expect_response(with_load.input_impedance[i], zin, kTolerance, "Zin", f);
    stage::test::expect_response(with_load.output_impedance[i], zout, kTolerance, "Zout", f);
    stage::test::expect_response(no_load.output_impedance[i], parallel(zout, kR4), kTolerance,
                                 "Zout with load", f);
    // Voltage division: out/vin = [Zin - R1]/Zin * R4/(R3 + R4).
    stage::test::expect_response(with_load.response[i], (zin - kR1) / zin * kR4 / (kR3 + kR4),
                                 kTolerance, "response", f);
  }
}

// A current-source input sees the node's impedance: R2 || C1 || (R3 + R4); the
// transfer out/iin is then a transimpedance (ohm).
TEST(Impedance, CurrentInput) {
  const auto r =
      stage::run_frequency(network(true), options("iin", stage::SignalRef::node("out"), "r4"));
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    const double f = r.frequencies[i];
    const Complex za = parallel(parallel(kR2, zc(f)), kR3 + kR4);
    stage::test::expect_response(r.input_impedance[i], za, kTolerance, "Zin", f);
    stage::test::expect_response(r.response[i], za * kR4 / (kR3 + kR4), kTolerance, "response", f);
    // With the current source open, out looks back through R3 into R2 || C1.
    stage::test::expect_response(r.output_impedance[i], kR3 + parallel(kR2, zc(f)), kTolerance,
                                 "Zout", f);
  }
}

// Output across the pair (a, out) with r3 (which connects them) as the load:
// without r3, a and out are joined only through ground: (R1 || R2 || C1) + R4.
TEST(Impedance, NodePairOutputWithLoadBetweenThem) {
  const auto r = stage::run_frequency(network(false),
                                      options("vin", stage::SignalRef::pair("a", "out"), "r3"));
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    const double f = r.frequencies[i];
    stage::test::expect_response(r.output_impedance[i], parallel(parallel(kR1, kR2), zc(f)) + kR4,
                                 kTolerance, "Zout", f);
  }
}

// A current output has no output impedance: omitted with a note.
TEST(Impedance, CurrentOutputOmitsOutputImpedance) {
  const auto r =
      stage::run_frequency(network(false), options("vin", stage::SignalRef::current("r4"), "r4"));
  EXPECT_TRUE(r.output_impedance.empty());
  EXPECT_FALSE(r.notes.empty());
  // i(r4) = v(out) / R4 (Ohm's law), v(out) as in VoltageInputNodeOutput.
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    const double f = r.frequencies[i];
    const Complex zin = kR1 + parallel(parallel(kR2, zc(f)), kR3 + kR4);
    stage::test::expect_response(r.response[i], (zin - kR1) / zin / (kR3 + kR4), kTolerance,
                                 "i(r4)", f);
  }
}

// Reported currents follow spec section 3: a voltage source's is the current
// it delivers, so i(vin) / vin = 1 / Zin.
TEST(Impedance, SourceCurrentOutputIsDeliveredCurrent) {
  const auto r =
      stage::run_frequency(network(false), options("vin", stage::SignalRef::current("vin"), {}));
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    stage::test::expect_response(r.response[i], 1.0 / r.input_impedance[i], kTolerance, "i(vin)",
                                 r.frequencies[i]);
  }
}

TEST(Impedance, LoadMustConnectTheOutputNodes) {
  const auto o = options("vin", stage::SignalRef::node("out"), "r2");
  const auto why = stage::frequency_options_error(network(false), o);
  ASSERT_TRUE(why);
  EXPECT_NE(why->find("must connect the output's nodes"), std::string::npos) << *why;
  EXPECT_THROW(stage::run_frequency(network(false), o), stage::Error);
}

TEST(Impedance, OptionsAreChecked) {
  const Circuit c = network(false);
  auto o = options("vin", stage::SignalRef::node("out"), {});
  EXPECT_FALSE(stage::frequency_options_error(c, o));
  auto bad = o;
  bad.to = bad.from;  // one frequency: allowed
  EXPECT_FALSE(stage::frequency_options_error(c, bad));
  bad.to = bad.from / 2;
  EXPECT_TRUE(stage::frequency_options_error(c, bad));
  bad = o;
  bad.per_decade = 0;
  EXPECT_TRUE(stage::frequency_options_error(c, bad));
  bad = o;
  bad.input = "r1";
  EXPECT_TRUE(stage::frequency_options_error(c, bad));
  bad = o;
  bad.output = stage::SignalRef::node("nowhere");
  EXPECT_TRUE(stage::frequency_options_error(c, bad));
  bad = o;
  bad.load = "vin";
  EXPECT_TRUE(stage::frequency_options_error(c, bad));
}

}  // namespace
