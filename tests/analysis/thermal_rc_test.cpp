// An unknown of the temperature kind, through the bias point and the
// transient: a test-only device (a thermal RC) owns one, beside an ordinary
// resistive circuit, and its results, names and tolerances are those of a
// temperature (kelvin, heat flows in watts), not of a node voltage.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "analysis/operating_point.hpp"
#include "analysis/transient.hpp"
#include "mna/pattern.hpp"
#include "mna/topology.hpp"
#include "reference.hpp"
#include "simulation/assemble.hpp"
#include "stage/errors.hpp"

namespace {

using stage::mna::UnknownKind;

struct ThermalValues {
  double power = 0.5;          // W into the thermal capacitance
  double resistance = 100;     // K/W to the ambient
  double capacitance = 0.01;   // J/K: tau = R_th C_th = 1 s
  double ambient = 300.15;     // K
  double runaway_scale = 0.0;  // 1/K: the power grows as exp((T - ambient) x this)
};

// Heat P into a thermal capacitance C_th that loses it to the ambient
// through R_th, on one temperature unknown T of its own:
//   heat balance  f = (T - T_amb) / R_th - P,   heat  q = C_th T,
// so that C_th dT/dt = P - (T - T_amb) / R_th, the thermal analogue of a
// capacitor charged by a current source through a resistor. Its power
// scales with source stepping, as an independent source's value does, and
// may grow with its own temperature (runaway_scale). In a transient from
// given conditions it starts at the ambient. Without runaway it is linear,
// and its excitation (device.hpp) is f at T = 0: -T_amb / R_th - P.
class ThermalRc final : public stage::mna::Device {
 public:
  ThermalRc(stage::mna::Topology& topology, const ThermalValues& values)
      : Device("heater"),
        values_(values),
        t_(topology.add_unknown("heater", UnknownKind::temperature)) {}

  void declare(stage::mna::PatternBuilder& pattern) override { slot_ = pattern.entry(t_, t_); }
  void evaluate(const stage::mna::EvalRequest& r, stage::mna::EvalOutput& out) override {
    const double rise = r.x[t_] - values_.ambient;
    const double power = r.source_scale * values_.power * std::exp(values_.runaway_scale * rise);
    out.f[t_] += rise / values_.resistance - power;
    out.g[slot_] += 1.0 / values_.resistance - values_.runaway_scale * power;
    out.q[t_] += values_.capacitance * r.x[t_];
    out.c[slot_] += values_.capacitance;
  }
  bool nonlinear() const override { return values_.runaway_scale != 0.0; }
  bool has_excitation() const override { return true; }
  void add_excitation(const stage::mna::EvalRequest& r, double* f) const override {
    f[t_] -= values_.ambient / values_.resistance + r.source_scale * values_.power;
  }
  void describe_topology(stage::mna::TopologyCheck&) const override {}
  std::optional<stage::mna::InitialCondition> initial_condition() const override {
    return stage::mna::InitialCondition{t_, stage::mna::kGroundIndex, values_.ambient};
  }
  stage::mna::Index unknown() const { return t_; }

 private:
  ThermalValues values_;
  stage::mna::Index t_;
  stage::mna::Slot slot_ = 0;
};

// The heater beside a 1 V source across 1 kohm, which it does not touch.
stage::mna::System heated_system(const ThermalValues& values) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"in", "gnd", 1.0});
  c.add("r1", stage::Resistor{"in", "gnd", 1e3});
  return stage::assemble(
      c, {[values](stage::mna::Topology& t) { return std::make_unique<ThermalRc>(t, values); }});
}

stage::mna::Index heater_unknown(const stage::mna::System& system) {
  return *system.topology().find_unknown("heater.temperature");
}

stage::BiasResult bias(const stage::mna::System& system, const stage::SolverOptions& solver = {}) {
  stage::analysis::NewtonSolver newton(system, solver);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  const auto how = stage::analysis::solve_operating_point(newton, x);
  return stage::analysis::describe_operating_point(system, x, how);
}

// The unknown is numbered, named and described as a temperature.
TEST(ThermalRc, TheUnknownIsATemperature) {
  const stage::mna::System system = heated_system({});
  const auto& topology = system.topology();
  const stage::mna::Index t = heater_unknown(system);
  EXPECT_EQ(topology.kind(t), UnknownKind::temperature);
  EXPECT_EQ(topology.owner(t), "heater");
  EXPECT_FALSE(topology.is_circuit_node(t));
  EXPECT_EQ(topology.description(t), "the temperature of heater");
  EXPECT_EQ(topology.kind(*topology.find_branch("v1")), UnknownKind::current);
  EXPECT_EQ(topology.description(*topology.find_node("in")), "the voltage at node 'in'");
  EXPECT_EQ(system.elements_at(t), std::vector<std::string>{"heater"});
}

// At DC the heat balance gives T = T_amb + P R_th (the thermal Ohm's law);
// the system is linear, so one Newton step solves it to rounding. The
// circuit beside it keeps its own figures (1 V across 1 kohm: 1 mA).
TEST(ThermalRc, BiasTemperatureRiseIsPowerTimesThermalResistance) {
  const ThermalValues values;
  const stage::BiasResult r = bias(heated_system(values));
  ASSERT_EQ(r.element_temperatures.size(), 1u);
  EXPECT_EQ(r.element_temperatures.front().first, "heater.temperature");
  EXPECT_NEAR(r.temperature_of("heater"), values.ambient + values.power * values.resistance,
              1e-9 * values.ambient);         // exact: thermal Ohm's law
  EXPECT_EQ(r.node_voltages.size(), 1u);      // "in" alone: a temperature is no node
  EXPECT_NEAR(r.current("v1"), 1e-3, 1e-12);  // Ohm's law: the source delivers 1 mA
}

stage::TransientResult heating(const ThermalValues& values, const stage::SolverOptions& solver) {
  const stage::mna::System system = heated_system(values);
  stage::TransientOptions o;
  o.stop = 5 * values.resistance * values.capacitance;
  o.max_step = o.stop;  // the tolerance alone sets the step
  o.start = stage::TransientStart::zero;
  return stage::analysis::integrate(system, solver, o);
}

// From the ambient with the power on at t = 0:
//   T(t) = T_amb + P R_th (1 - e^{-t / (R_th C_th)}),
// the exact solution of the linear first-order equation above (the step
// response of an RC). The temperature is recorded by default under its
// name. With the relative tolerance far below the temperature tolerance,
// each step's error is held to about 1e-5 K, and over the ~200 steps the
// decaying errors add to at most their sum, 2e-3 K (measured 2e-4 K); 1e-3 K
// of a 50 K rise is the bound, where a wrong heat capacity or stamp would be
// off by kelvins.
TEST(ThermalRc, TransientFollowsTheExactStepResponse) {
  const ThermalValues values;
  stage::SolverOptions solver;
  solver.relative_tolerance = 1e-9;
  solver.temperature_tolerance = 1e-5;
  const stage::TransientResult r = heating(values, solver);
  const double tau = values.resistance * values.capacitance;
  const double rise = values.power * values.resistance;
  const auto exact = [&](double t) { return values.ambient + rise * (1 - std::exp(-t / tau)); };
  RecordProperty("accepted_steps", r.accepted_steps);
  EXPECT_NEAR(r.signal("heater.temperature").front(), values.ambient, 1e-6);
  EXPECT_LT(stage::testing::max_error(r, "heater.temperature", exact), 1e-3);
}

// The step control holds a temperature row to the temperature tolerance
// (times the heat capacity), not to the voltage or current tolerance. With
// the relative tolerance negligible the absolute one sets every step: a
// hundred times looser, the steps of a second-order method grow by about
// 100^(1/3) = 4.6 (local error ~ h^3; Hairer, Nørsett & Wanner, Solving
// ODEs I, section II.4), so the run takes several times fewer (3 to 6.5:
// steps change in discrete jumps; measured 97 against 24). Voltage and current tolerances a
// thousand times apart change nothing: the same steps, the same values.
TEST(ThermalRc, TemperatureToleranceSetsTheStep) {
  const ThermalValues values;
  stage::SolverOptions tight;
  tight.relative_tolerance = 1e-9;
  tight.temperature_tolerance = 1e-4;
  stage::SolverOptions loose = tight;
  loose.temperature_tolerance = 1e-2;
  const auto tight_run = heating(values, tight), loose_run = heating(values, loose);
  RecordProperty("tight_steps", tight_run.accepted_steps);
  RecordProperty("loose_steps", loose_run.accepted_steps);
  const double ratio = static_cast<double>(tight_run.accepted_steps) / loose_run.accepted_steps;
  EXPECT_GT(ratio, 3.0);
  EXPECT_LT(ratio, 6.5);

  stage::SolverOptions electrical = tight;
  electrical.voltage_tolerance *= 1e3;
  electrical.current_tolerance *= 1e3;
  const auto electrical_run = heating(values, electrical);
  EXPECT_EQ(electrical_run.accepted_steps, tight_run.accepted_steps);
  EXPECT_EQ(electrical_run.rejected_steps, tight_run.rejected_steps);
  EXPECT_EQ(electrical_run.signal("heater.temperature"), tight_run.signal("heater.temperature"));
}

// Newton's residual test holds the heat balance to the heat-flow tolerance:
// the bias point with its temperature moved by 1 mK leaves 1e-5 W on that
// row (1 mK / 100 K/W). With the relative tolerance negligible, that passes
// a 1e-4 W heat-flow tolerance and fails the default 1e-6 W, however loose
// the voltage and current tolerances, and the failure names the row.
TEST(ThermalRc, HeatBalanceIsHeldToTheHeatFlowTolerance) {
  const stage::mna::System system = heated_system({});
  stage::analysis::NewtonSolver newton(system, stage::SolverOptions{});
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  stage::analysis::solve_operating_point(newton, x);
  x[heater_unknown(system)] += 1e-3;

  stage::SolverOptions solver;
  solver.relative_tolerance = 1e-12;
  solver.voltage_tolerance = 1.0;
  solver.current_tolerance = 1.0;
  solver.heat_flow_tolerance = 1e-4;
  EXPECT_NO_THROW(stage::analysis::verify_operating_point(system, solver, x));
  solver.heat_flow_tolerance = stage::SolverOptions{}.heat_flow_tolerance;
  try {
    stage::analysis::verify_operating_point(system, solver, x);
    ADD_FAILURE() << "a heat balance off by 1e-5 W passed a 1e-6 W tolerance";
  } catch (const stage::NumericalError& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::no_convergence);
    EXPECT_NE(std::string(e.what()).find("heat balance residual"), std::string::npos) << e.what();
    EXPECT_EQ(e.involved(), std::vector<std::string>{"heater.temperature"});
  }
}

// Thermal runaway: with the power P0 exp((T - T_amb) / T0), the balance
// (T - T_amb) / R_th = P0 exp((T - T_amb) / T0) has a solution only while
// P0 R_th / T0 <= 1/e (Semenov's critical condition of thermal explosion;
// with u = (T - T_amb) / T0 it reads u e^{-u} = P0 R_th / T0, and u e^{-u}
// is at most 1/e). At P0 R_th / T0 = 10 there is none, and the failure says
// which unknown ran away: the heater's temperature, by its name and owner.
// Source stepping, which scales the heater's power, solves up to the
// critical fraction T0 / (e P0 R_th) = 10 / (e 100) = 3.68 % (same
// condition) and no further.
TEST(ThermalRc, RunawayIsNamedAsATemperature) {
  ThermalValues values;
  values.power = 1.0;
  values.runaway_scale = 0.1;  // T0 = 10 K: P0 R_th / T0 = 1 * 100 / 10
  try {
    bias(heated_system(values));
    ADD_FAILURE() << "a heater past thermal runaway found a bias point";
  } catch (const stage::NumericalError& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::no_convergence);
    const std::string message = e.what();
    EXPECT_NE(message.find("the temperature of heater"), std::string::npos) << message;
    EXPECT_NE(message.find("up to 3.68 % of their values"), std::string::npos) << message;
    const auto& involved = e.involved();
    EXPECT_NE(std::find(involved.begin(), involved.end(), "heater.temperature"), involved.end());
    EXPECT_NE(std::find(involved.begin(), involved.end(), "heater"), involved.end());
  }
}

}  // namespace
