// The system's split evaluation (device.hpp: linear devices stamped once,
// their f and q formed as G x and C x plus the sources' excitations) against
// the plain sum of every device's own evaluation, on a circuit with every
// kind, at an arbitrary point and time; and the guard against a device that
// hides an excitation.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <stdexcept>

#include "mna/pattern.hpp"
#include "mna/system.hpp"
#include "mna/topology.hpp"
#include "simulation/assemble.hpp"

namespace {

using stage::mna::Workspace;

// Values our own; the transistor and diode models are the defaults.
stage::Circuit every_kind() {
  stage::Circuit c;
  c.add_model("npn", stage::BipolarModel{});
  c.add_model("d", stage::DiodeModel{});
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.5, 1.0, 0.0, stage::SineWave{0.3, 1e3, 0.5}});
  c.add("iin", stage::CurrentSource{"gnd", "a", 1e-3, 0.0, 0.0,
                                    stage::PulseWave{0.0, 2e-3, 1e-3, 4e-4, 1e-5, 1e-5, 0.0}});
  c.add("r1", stage::Resistor{"in", "b", 10e3});
  c.add("c1", stage::Capacitor{"b", "gnd", 1e-9});
  c.add("l1", stage::Inductor{"vcc", "col", 1e-3});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "col", "b", "e", {}, "npn"});
  c.add("re", stage::Resistor{"e", "gnd", 1e3});
  c.add("d1", stage::Diode{"a", "gnd", "d"});
  c.add("ra", stage::Resistor{"a", "b", 2e3});
  c.add("e1", stage::VoltageControlledVoltageSource{"x1", "gnd", "b", "e", 2.0});
  c.add("g1", stage::VoltageControlledCurrentSource{"x1", "gnd", "a", "gnd", 1e-3});
  c.add("f1", stage::CurrentControlledCurrentSource{"x2", "gnd", "re", 3.0});
  c.add("h1", stage::CurrentControlledVoltageSource{"x3", "gnd", "q1.collector", 100.0});
  c.add("rx2", stage::Resistor{"x2", "gnd", 1e3});
  c.add("rx3", stage::Resistor{"x3", "gnd", 1e3});
  return c;
}

TEST(ConstantStamp, EqualsTheSumOfEveryDevicesOwnEvaluation) {
  const stage::mna::System system = stage::assemble(every_kind());
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> volts(-0.8, 0.8);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  for (std::size_t i = 1; i < x.size(); ++i) x[i] = volts(rng);
  stage::mna::EvalRequest request = system.request(x.data());
  request.time = 3.7e-4;
  request.dc = false;
  request.source_scale = 0.8;

  Workspace split = system.make_workspace();
  system.evaluate(request, split);
  Workspace sum = system.make_workspace();
  stage::mna::EvalOutput out = sum.output();
  for (const auto& d : system.devices()) d->evaluate(request, out);

  // The same terms added in another order: equal to the rounding of a few
  // additions, 1e-14 relative (or of 1e-15 in the units of the row, A, C,
  // S or F, where terms cancel).
  const auto close = [](double a, double b) {
    return std::abs(a - b) <= 1e-14 * std::max(std::abs(a), std::abs(b)) + 1e-15;
  };
  for (std::size_t i = 1; i < x.size(); ++i) {
    const std::string name = system.topology().name(static_cast<int>(i));
    EXPECT_TRUE(close(split.f[i], sum.f[i])) << name << ": " << split.f[i] << " " << sum.f[i];
    EXPECT_TRUE(close(split.q[i], sum.q[i])) << name << ": " << split.q[i] << " " << sum.q[i];
  }
  for (int s = 0; s < system.pattern().nnz(); ++s) {
    EXPECT_TRUE(close(split.g[s], sum.g[s])) << "slot " << s;
    EXPECT_TRUE(close(split.c[s], sum.c[s])) << "slot " << s;
  }
}

// A value changed through the system reaches the next evaluation.
TEST(ConstantStamp, FollowsAChangedValue) {
  stage::mna::System system = stage::assemble(every_kind());
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  const int in = *system.topology().find_node("in"), b = *system.topology().find_node("b");
  x[in] = 1.0;
  Workspace w = system.make_workspace();
  system.evaluate(system.request(x.data()), w);
  const double before = w.f[b];
  ASSERT_TRUE(system.set_value(*system.find_device("r1"), 5e3));
  system.evaluate(system.request(x.data()), w);
  // r1 carries (0 - 1 V) / R into b's KCL row: -1e-4 A at 10 k, -2e-4 A at 5 k.
  EXPECT_NEAR(w.f[b] - before, -1.0 / 5e3 + 1.0 / 10e3, 1e-15);
}

// A linear device that leaves a current at x = 0 without declaring an
// excitation would have that current dropped: the system refuses it.
class HiddenSource final : public stage::mna::Device {
 public:
  explicit HiddenSource(stage::mna::Topology& t) : Device("hidden"), a_(t.node("in")) {}
  void declare(stage::mna::PatternBuilder&) override {}
  void evaluate(const stage::mna::EvalRequest&, stage::mna::EvalOutput& out) override {
    out.f[a_] += 1e-3;
  }
  void describe_topology(stage::mna::TopologyCheck&) const override {}

 private:
  stage::mna::Index a_;
};

TEST(ConstantStamp, RefusesADeviceThatHidesAnExcitation) {
  const stage::mna::System system = stage::assemble(
      every_kind(), {[](stage::mna::Topology& t) { return std::make_unique<HiddenSource>(t); }});
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  Workspace w = system.make_workspace();
  EXPECT_THROW(system.evaluate(system.request(x.data()), w), std::logic_error);
}

}  // namespace
