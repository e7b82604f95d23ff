// Diagnosis of circuits with no unique DC solution: each cause is named.
#include <gtest/gtest.h>

#include <algorithm>

#include "stage/bias.hpp"
#include "stage/errors.hpp"

namespace {

using stage::Circuit;

// Runs bias and returns the error it must throw: every circuit here fails
// the graph check, before anything is solved.
stage::NumericalError failure(const Circuit& c) {
  try {
    stage::run_bias(c);
  } catch (const stage::NumericalError& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::topology) << e.what();
    return e;
  }
  ADD_FAILURE() << "expected a NumericalError";
  return stage::NumericalError(stage::ErrorKind::topology, "", {});
}

bool names(const stage::NumericalError& e, const std::string& who) {
  return std::find(e.involved().begin(), e.involved().end(), who) != e.involved().end();
}

TEST(Singular, FloatingNodeBehindCapacitor) {
  Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 1.0});
  c.add("c1", stage::Capacitor{"in", "island", 1e-9});
  c.add("r1", stage::Resistor{"island", "island2", 1e3});
  const auto e = failure(c);
  EXPECT_TRUE(names(e, "island"));
  EXPECT_TRUE(names(e, "island2"));
  EXPECT_NE(std::string(e.what()).find("no DC path to ground"), std::string::npos);
}

TEST(Singular, LoopOfVoltageSources) {
  Circuit c;
  c.add("v1", stage::VoltageSource{"a", "gnd", 1.0});
  c.add("v2", stage::VoltageSource{"a", "gnd", 2.0});
  c.add("r1", stage::Resistor{"a", "gnd", 1e3});
  const auto e = failure(c);
  EXPECT_TRUE(names(e, "v2"));
  EXPECT_NE(std::string(e.what()).find("loop of voltage sources"), std::string::npos);
}

TEST(Singular, InductorAcrossVoltageSource) {
  Circuit c;
  c.add("v1", stage::VoltageSource{"a", "gnd", 1.0});
  c.add("l1", stage::Inductor{"a", "gnd", 1e-3});
  EXPECT_TRUE(names(failure(c), "l1"));
}

TEST(Singular, CutSetOfCurrentSources) {
  Circuit c;
  c.add("v1", stage::VoltageSource{"a", "gnd", 1.0});
  c.add("r1", stage::Resistor{"a", "gnd", 1e3});
  c.add("i1", stage::CurrentSource{"a", "mid", 1e-3});
  c.add("i2", stage::CurrentSource{"mid", "gnd", 1e-3});
  const auto e = failure(c);
  EXPECT_TRUE(names(e, "i1"));
  EXPECT_TRUE(names(e, "i2"));
  EXPECT_NE(std::string(e.what()).find("cut-set of current sources"), std::string::npos);
}

}  // namespace
