// The energy ledger of an element sensed through an ammeter: its power is
// read at the terminal node behind the ammeter, and the ammeter takes none.
#include "large_signal/energy_ledger.hpp"

#include <gtest/gtest.h>

#include <numeric>

#include "simulation/assemble.hpp"

namespace {

TEST(EnergyLedger, SensedResistorKeepsItsJouleHeat) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 5.0});
  c.add("r1", stage::Resistor{"in", "gnd", 1e3});
  c.add("f1", stage::CurrentControlledCurrentSource{"gnd", "out", "r1", 2.0});
  c.add("rl", stage::Resistor{"out", "gnd", 1e3});
  const stage::mna::System system = stage::assemble(c);
  const stage::mna::Topology& t = system.topology();
  // The hand solution: 5 mA through r1 (Ohm's law), delivered by v1 and
  // carried by r1's ammeter; f1 drives 10 mA into rl: 10 V.
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  x[*t.find_node("in")] = 5.0;
  x[*t.find_node("r1:a")] = 5.0;
  x[*t.find_node("out")] = 10.0;
  x[*t.find_branch("v1")] = 5e-3;
  x[*t.find_branch("r1:a")] = 5e-3;

  stage::analysis::EnergyLedger ledger(c, system);
  ledger.start(0.0);
  ledger.step(0.0, x);
  ledger.step(1e-3, x);
  const std::vector<double> power = ledger.mean_power();
  const auto of = [&](const std::string& name) {
    for (std::size_t d = 0; d < power.size(); ++d) {
      if (system.devices()[d]->name() == name) return power[d];
    }
    ADD_FAILURE() << "no device " << name;
    return 0.0;
  };
  // Joule: V²/R = 25 mW in r1 and 100 mW in rl; v1 delivers 25 mW.
  EXPECT_NEAR(of("r1"), 25e-3, 1e-15);
  EXPECT_NEAR(of("rl"), 100e-3, 1e-15);
  EXPECT_NEAR(of("v1"), -25e-3, 1e-15);
  EXPECT_NEAR(of("r1:a"), 0.0, 1e-15);  // the ammeter: no element, no power
  // Tellegen's theorem: the powers of a solution sum to zero.
  EXPECT_NEAR(std::accumulate(power.begin(), power.end(), 0.0), 0.0, 1e-15);
}

}  // namespace
