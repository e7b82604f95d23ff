// The source capability of the device contract (mna::SourceAccess): where a
// source's current and voltage are read, and the power it delivers, against
// the definition P = V·I with the sign convention of spec section 3 (a
// voltage source delivers out of p; a current source delivers into b), on a
// two-source resistor network solved by hand.
#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

#include "mna/topology.hpp"
#include "simulation/assemble.hpp"
#include "stage/bias.hpp"

namespace {

using stage::mna::SourceAccess;

// v1 holds a at `volts`; r1 (1 kΩ) joins a and b; r2 (2 kΩ) takes b to
// ground; i1 drives `amps` from `from` through itself into `into` (one of
// them b, the other ground).
struct Network {
  double volts, amps;
  std::string from, into;

  stage::Circuit circuit() const {
    stage::Circuit c;
    c.add("v1", stage::VoltageSource{"a", "gnd", volts});
    c.add("r1", stage::Resistor{"a", "b", 1e3});
    c.add("r2", stage::Resistor{"b", "gnd", 2e3});
    c.add("i1", stage::CurrentSource{from, into, amps});
    return c;
  }
  // KCL at b by hand: (volts - vb) / 1k ± amps = vb / 2k.
  double vb() const {
    const double injected = into == "b" ? amps : -amps;
    return (volts / 1e3 + injected) / (1 / 1e3 + 1 / 2e3);
  }
  double v1_delivers() const { return (volts - vb()) / 1e3; }  // A, out of a through r1
};

// Both deliver; v1 absorbs (the current source pushes b above a); i1 absorbs
// (it draws current out of b).
const Network kNetworks[] = {
    {10, 2e-3, "gnd", "b"},  // vb = 8 V: v1 delivers 20 mW, i1 16 mW
    {5, 10e-3, "gnd", "b"},  // vb = 10 V: v1 delivers -25 mW, i1 100 mW
    {10, 2e-3, "b", "gnd"},  // vb = 5.33 V: v1 delivers 46.7 mW, i1 -10.7 mW
};

// The capability read at the hand solution, with no solver involved: the
// ports name the unknowns the definition multiplies.
TEST(SourceAccess, DeliveredPowerIsVoltageTimesCurrentAtTheHandSolution) {
  for (const Network& net : kNetworks) {
    const stage::mna::System system = stage::assemble(net.circuit());
    const auto& topology = system.topology();
    const stage::mna::Index a = *topology.find_node("a"), b = *topology.find_node("b");
    std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
    x[a] = net.volts;
    x[b] = net.vb();
    x[*topology.find_branch("v1")] = net.v1_delivers();
    const auto at = system.request(x.data());

    const SourceAccess* v1 = system.find_device("v1")->source();
    ASSERT_NE(v1, nullptr);
    const auto vp = v1->ports();
    EXPECT_EQ(vp.drives, SourceAccess::Drives::voltage);
    EXPECT_EQ(vp.out, a);
    EXPECT_EQ(vp.back, stage::mna::kGroundIndex);
    EXPECT_EQ(vp.branch, *topology.find_branch("v1"));
    // Exact: the same products of the same doubles.
    EXPECT_EQ(v1->delivered_current(at), net.v1_delivers());
    EXPECT_EQ(v1->delivered_power(at), net.v1_delivers() * net.volts);

    const SourceAccess* i1 = system.find_device("i1")->source();
    ASSERT_NE(i1, nullptr);
    const auto ip = i1->ports();
    const stage::mna::Index into = net.into == "b" ? b : stage::mna::kGroundIndex;
    const stage::mna::Index from = net.from == "b" ? b : stage::mna::kGroundIndex;
    EXPECT_EQ(ip.drives, SourceAccess::Drives::current);
    EXPECT_EQ(ip.out, into);
    EXPECT_EQ(ip.back, from);
    EXPECT_EQ(i1->delivered_current(at), net.amps);
    EXPECT_EQ(i1->delivered_power(at), net.amps * (x[into] - x[from]));

    EXPECT_EQ(system.find_device("r1")->source(), nullptr);
  }
}

// The value an evaluation stamps and the phasor the frequency response
// drives: a 1 V sine at 1 kHz on 2 V DC, read at a quarter period
// (offset + amplitude = 3 V, spec section 3's sine), at DC (2 V) and at a
// source scale of one half (1 V); an AC value of 1 at 90 degrees is the
// phasor j (exact up to rounding of pi / 2).
TEST(SourceAccess, ValueAtARequestAndPhasor) {
  stage::Circuit c;
  stage::SineWave sine;
  sine.offset = 2;
  c.add("v1", stage::VoltageSource{"a", "gnd", 2, 1, 90, sine});
  c.add("r1", stage::Resistor{"a", "gnd", 1e3});
  const stage::mna::System system = stage::assemble(c);
  const SourceAccess* v1 = system.find_device("v1")->source();
  ASSERT_NE(v1, nullptr);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  auto at = system.request(x.data());
  EXPECT_EQ(v1->value(at), 2.0);
  at.source_scale = 0.5;
  EXPECT_EQ(v1->value(at), 1.0);
  at.source_scale = 1;
  at.dc = false;
  at.time = 0.25e-3;
  EXPECT_NEAR(v1->value(at), 3.0, 1e-12);
  EXPECT_NEAR(v1->phasor().real(), 0.0, 1e-15);
  EXPECT_NEAR(v1->phasor().imag(), 1.0, 1e-15);
}

// The bias report's supply powers come from the capability at the solved
// point: each equals V·I of the solution, and together they equal what the
// resistors dissipate (Tellegen's theorem: the powers of all branches of a
// network sum to zero).
TEST(SourceAccess, BiasSupplyPowersMatchTheSolutionAndBalanceTheResistors) {
  for (const Network& net : kNetworks) {
    const stage::BiasResult bias = stage::run_bias(net.circuit());
    ASSERT_EQ(bias.supplies.size(), 2u);
    const double va = bias.voltage("a"), vb = bias.voltage("b");
    // A linear circuit: Newton's first step is the exact solution up to
    // rounding in the factorisation.
    const double tolerance = 1e-12;
    EXPECT_NEAR(va, net.volts, tolerance);
    EXPECT_NEAR(vb, net.vb(), 1e-9 * net.vb());

    const stage::SupplyPower& v1 = bias.supplies[0];
    EXPECT_EQ(v1.name, "v1");
    EXPECT_NEAR(v1.current, net.v1_delivers(), 1e-9 * std::abs(net.v1_delivers()));
    EXPECT_NEAR(v1.power, bias.current("v1") * va, tolerance);

    const stage::SupplyPower& i1 = bias.supplies[1];
    EXPECT_EQ(i1.name, "i1");
    EXPECT_EQ(i1.current, net.amps);
    const double rise = (net.into == "b" ? vb : 0.0) - (net.from == "b" ? vb : 0.0);
    EXPECT_NEAR(i1.power, net.amps * rise, tolerance);

    const double dissipated = (va - vb) * (va - vb) / 1e3 + vb * vb / 2e3;
    EXPECT_NEAR(v1.power + i1.power, dissipated, 1e-9 * dissipated);
  }
}

}  // namespace
