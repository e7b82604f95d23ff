// Charge conservation with a voltage-dependent capacitance, and the failure
// of a step that cannot converge at any size. Both use test-only devices
// written to the contract of mna/device.hpp.
#include <gtest/gtest.h>

#include <cmath>

#include "analysis/transient.hpp"
#include "devices/stamp.hpp"
#include "mna/topology_check.hpp"
#include "reference.hpp"
#include "simulation/assemble.hpp"
#include "stage/errors.hpp"

namespace {

// q(v) = C0 (v + k v^3 / 3), so C(v) = C0 (1 + k v^2): 10 % larger at 1 V.
class CubicCapacitor final : public stage::mna::Device {
 public:
  static constexpr double c0 = 1e-6, k = 0.1;
  CubicCapacitor(stage::mna::Index a) : Device("cnl"), a_(a) {}
  static double charge(double v) { return c0 * (v + k * v * v * v / 3.0); }
  void declare(stage::mna::PatternBuilder& p) override {
    slots_.declare(p, a_, stage::mna::kGroundIndex, a_, stage::mna::kGroundIndex);
  }
  void evaluate(const stage::mna::EvalRequest& r, stage::mna::EvalOutput& out) override {
    const double v = r.x[a_];
    out.q[a_] += charge(v);
    slots_.add(out.c, c0 * (1.0 + k * v * v));
  }
  bool nonlinear() const override { return true; }
  void describe_topology(stage::mna::TopologyCheck& check) const override {
    check.capacitive(a_, stage::mna::kGroundIndex, name());
  }

 private:
  stage::mna::Index a_;
  stage::devices::PairSlots slots_;
};

// Drives +-1 mA into its node according to the sign of the node voltage
// after 1 ms, with no conductance: with a capacitor and resistor on the node
// the step equation v (1/R + a C) = -sign(v) 1 mA has no solution for any
// step, so the transient must stop there with a NumericalError.
class SignFlipper final : public stage::mna::Device {
 public:
  explicit SignFlipper(stage::mna::Index a) : Device("flip"), a_(a) {}
  void declare(stage::mna::PatternBuilder&) override {}
  void evaluate(const stage::mna::EvalRequest& r, stage::mna::EvalOutput& out) override {
    if (!r.dc && r.time > 1e-3) out.f[a_] += r.x[a_] >= 0 ? 1e-3 : -1e-3;
  }
  bool nonlinear() const override { return true; }
  void describe_topology(stage::mna::TopologyCheck&) const override {}

 private:
  stage::mna::Index a_;
};

// +1 mA for ~1 ms, then -1 mA for as long, with 1-2 us ramps: net charge 0.
stage::PiecewiseWave charge_and_return() {
  return {{{0.0, 0.0},
           {1e-6, 1e-3},
           {1e-3, 1e-3},
           {1.002e-3, -1e-3},
           {2.001e-3, -1e-3},
           {2.002e-3, 0.0}},
          false};
}

// The voltage where q(v) = Q: Newton on the cubic.
double voltage_for_charge(double charge) {
  double v = charge / CubicCapacitor::c0;
  for (int i = 0; i < 50; ++i) {
    v -= (CubicCapacitor::charge(v) - charge) /
         (CubicCapacitor::c0 * (1 + CubicCapacitor::k * v * v));
  }
  return v;
}

class ChargeConservation : public ::testing::TestWithParam<stage::Integration> {};

// The integrated quantity is the charge, so after the current source has
// delivered Q(t) = integral of i dt the capacitor holds exactly q(v) = Q(t)
// (charge balance at the node). Leakage through 1 Tohm is below 2e-15 C.
// The only formula error is in the backward-Euler steps after the ramp
// corners, where i is linear in t: h^2/2 |di/dt| with h <= 0.1 us per
// corner, under 1e-10 C in all, 1e-4 V on 1 uF; the bounds are that.
TEST_P(ChargeConservation, CubicCapacitorReturnsToItsStartCharge) {
  stage::Circuit c;
  c.add("i1", stage::CurrentSource{"gnd", "x", 0.0, 0.0, 0.0, charge_and_return()});
  c.add("rleak", stage::Resistor{"x", "gnd", 1e12});
  const stage::mna::System system = stage::assemble(
      c, {[](stage::mna::Topology& t) { return std::make_unique<CubicCapacitor>(t.node("x")); }});
  stage::TransientOptions o;
  o.stop = 3e-3;
  o.start = stage::TransientStart::zero;
  const auto r = stage::analysis::integrate(system, stage::testing::solver(GetParam()), o);
  const auto& v = r.signal("x");
  const auto at = [&](double t) {
    return v[std::find(r.time.begin(), r.time.end(), t) - r.time.begin()];
  };
  // Q(1 ms) = 0.5 nC (ramp) + 1 mA * 0.999 ms.
  EXPECT_NEAR(at(1e-3), voltage_for_charge(0.5e-9 + 0.999e-6), 1e-4);
  EXPECT_NEAR(CubicCapacitor::charge(v.back()), 0.0, 1e-10);
}

INSTANTIATE_TEST_SUITE_P(Formulas, ChargeConservation,
                         ::testing::Values(stage::Integration::tr_bdf2,
                                           stage::Integration::trapezoidal,
                                           stage::Integration::bdf2),
                         stage::testing::integration_name);

TEST(StepFailure, NamesTheTimeAndTheNode) {
  stage::Circuit c;
  c.add("r1", stage::Resistor{"x", "gnd", 1e3});
  c.add("c1", stage::Capacitor{"x", "gnd", 1e-6});
  const stage::mna::System system = stage::assemble(
      c, {[](stage::mna::Topology& t) { return std::make_unique<SignFlipper>(t.node("x")); }});
  stage::TransientOptions o;
  o.stop = 2e-3;
  try {
    stage::analysis::integrate(system, stage::SolverOptions{}, o);
    FAIL() << "the step cannot converge after 1 ms";
  } catch (const stage::NumericalError& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::step_too_small) << e.what();
    EXPECT_NE(std::string(e.what()).find("t = 0.001 s"), std::string::npos) << e.what();
    ASSERT_FALSE(e.involved().empty());
    EXPECT_EQ(e.involved().front(), "x");
  }
}

}  // namespace
