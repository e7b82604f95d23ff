// The model library in models/*.stage: every file reads, holds the models it
// announces, and the complementary output pair biases a push-pull follower
// into forward activity (a sanity check of the values, from memory of how
// such a stage behaves).
#include <gtest/gtest.h>

#include "stage/bias.hpp"
#include "stage/reader.hpp"

namespace {

const std::string kModels = std::string(STAGE_SOURCE_DIR) + "/models/";

TEST(ModelLibrary, TransistorsAndDiodesRead) {
  const auto transistors = stage::read_file(kModels + "transistors.stage");
  for (const char* name : {"small_npn", "small_pnp", "power_npn", "power_pnp"}) {
    EXPECT_EQ(transistors.circuit.bipolar_models().count(name), 1u) << name;
  }
  const auto diodes = stage::read_file(kModels + "diodes.stage");
  for (const char* name : {"signal_diode", "rectifier_diode"}) {
    EXPECT_EQ(diodes.circuit.diode_models().count(name), 1u) << name;
  }
}

// Class-AB follower: bases 0.6 V either side of the input through two
// sources, 0.22 Ohm emitter resistors, 8 Ohm load, +/-15 V. With the input at
// 0 V both devices conduct a modest idle current and the output sits near
// 0 V.
TEST(ModelLibrary, ComplementaryPairBiasesAPushPullFollower) {
  stage::Circuit c = stage::read_file(kModels + "transistors.stage").circuit;
  c.add("vp", stage::VoltageSource{"vp", "gnd", 15});
  c.add("vn", stage::VoltageSource{"gnd", "vn", 15});
  c.add("bp", stage::VoltageSource{"bn_", "gnd", 0.6});
  c.add("bm", stage::VoltageSource{"gnd", "bp_", 0.6});
  stage::Bipolar top;
  top.collector = "vp";
  top.base = "bn_";
  top.emitter = "et";
  top.model = "power_npn";
  c.add("q1", top);
  stage::Bipolar bottom;
  bottom.polarity = stage::Polarity::pnp;
  bottom.collector = "vn";
  bottom.base = "bp_";
  bottom.emitter = "eb";
  bottom.model = "power_pnp";
  c.add("q2", bottom);
  c.add("r1", stage::Resistor{"et", "out", 0.22});
  c.add("r2", stage::Resistor{"out", "eb", 0.22});
  c.add("rl", stage::Resistor{"out", "gnd", 8});
  const auto bias = stage::run_bias(c);
  EXPECT_EQ(bias.bipolar("q1").region, stage::Region::forward_active);
  EXPECT_EQ(bias.bipolar("q2").region, stage::Region::forward_active);
  EXPECT_GT(bias.bipolar("q1").collector_current, 1e-3);
  EXPECT_LT(bias.bipolar("q2").collector_current, -1e-3);
  EXPECT_NEAR(bias.voltage("out"), 0, 0.05);
}

}  // namespace
