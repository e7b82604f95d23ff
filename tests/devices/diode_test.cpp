// The diode and the shared junction relations at device level against closed
// forms: Shockley current, breakdown, temperature scaling of the saturation
// current, depletion capacitance and its linear continuation.
#include <gtest/gtest.h>

#include <cmath>

#include "device_fixtures.hpp"
#include "devices/physical_constants.hpp"

namespace {

using stage::DiodeModel;
using stage::devices::thermal_voltage;
using namespace stage::testing;

struct JunctionPoint {
  double current, conductance, capacitance;
};

// Current into the anode and dI/dV, dQ/dV of a diode without series
// resistance at junction voltage v.
JunctionPoint at(const DiodeModel& model, double v, double kelvin = stage::kRoomTemperature,
                 double area = 1) {
  auto check = diode_check(model, area);
  const auto e = check.evaluate(check.state({{"a", v}, {"k", 0.0}}), kelvin);
  const int a = *check.topology().find_node("a") - 1;
  return {e.f[a], e.g(a, a), e.c(a, a)};
}

// Shockley: I = area IS (e^(V / N VT) - 1), dI/dV = area IS e^(V / N VT) / (N VT)
// (Sze and Ng, "Physics of Semiconductor Devices", 3rd ed., sec. 2.3).
TEST(Diode, ShockleyWithEmissionAndArea) {
  DiodeModel m;
  m.emission_coefficient = 1.9;
  const double nvt = 1.9 * thermal_voltage(stage::kRoomTemperature);
  for (double v : {-1.0, 0.1, 0.5, 0.9}) {
    const auto p = at(m, v, stage::kRoomTemperature, 3.0);
    const double i = 3 * 1e-14 * (std::exp(v / nvt) - 1);
    EXPECT_NEAR(p.current, i, 1e-13 * std::abs(i));
    EXPECT_NEAR(p.conductance, 3 * 1e-14 * std::exp(v / nvt) / nvt, 1e-13 * p.conductance);
  }
}

// Breakdown carries breakdown_current at v = -breakdown_voltage (the
// parameter's definition, spec section 4) and grows exponentially beyond.
TEST(Diode, BreakdownCurrentAtBreakdownVoltage) {
  DiodeModel m;
  m.breakdown_voltage = 5.6;
  m.breakdown_current = 2e-3;
  EXPECT_NEAR(at(m, -5.6).current, -2e-3, 1e-12);  // plus -IS, negligible
  const double vt = thermal_voltage(stage::kRoomTemperature);
  EXPECT_NEAR(at(m, -5.6 - vt).current / at(m, -5.6).current, std::exp(1.0), 1e-9);
  EXPECT_EQ(at(m, 0).current, 0.0);
}

// Saturation current against temperature (a: its temperature exponent):
// IS(T) = IS (T/Tr)^(a/N)
// exp((T/Tr - 1) Eg / (N VT(T))) (Sze and Ng sec. 2.3 with ni^2 ~ T^3
// exp(-Eg/kT); the usual compact-model statement). Read back from the
// current at a small forward bias.
TEST(Diode, SaturationCurrentTemperatureScaling) {
  DiodeModel m;
  m.saturation_current = 1e-14;
  m.emission_coefficient = 1.3;
  m.bandgap_energy = 1.12;  // eV, silicon at 300 K (Sze and Ng, app. F; from memory)
  m.saturation_current_temperature_exponent = 3;
  for (double t : {233.15, 300.15, 398.15}) {
    const double nvt = 1.3 * thermal_voltage(t);
    const double ratio = t / stage::kRoomTemperature;
    const double expected = 1e-14 * std::pow(ratio, 3 / 1.3) * std::exp((ratio - 1) * 1.12 / nvt);
    const double v = 0.4;
    const double is = at(m, v, t).current / (std::exp(v / nvt) - 1);
    EXPECT_NEAR(is, expected, 1e-12 * expected) << t;
  }
}

// Depletion capacitance C0 / (1 - V/phi)^m below fill * phi, continued
// linearly above with C(v) = C_f (1 + m (v - v_f) / (phi (1 - fill)))
// (Sze and Ng sec. 2.2 for C(V); the linear continuation is common practice
// in compact models).
TEST(Diode, DepletionCapacitance) {
  DiodeModel m;
  m.junction_capacitance = 10e-12;
  m.junction_potential = 0.8;
  m.grading = 0.4;
  for (double v : {-10.0, -1.0, 0.0, 0.3, 0.39}) {
    const double c = 10e-12 / std::pow(1 - v / 0.8, 0.4);
    EXPECT_NEAR(at(m, v).capacitance, c, 1e-12 * c) << v;
  }
  const double cf = 10e-12 / std::pow(0.5, 0.4);
  for (double v : {0.5, 0.9, 2.0}) {
    const double c = cf * (1 + 0.4 * (v - 0.4) / (0.8 * 0.5));
    EXPECT_NEAR(at(m, v).capacitance, c, 1e-12 * c) << v;
  }
}

// Junction potential and capacitance against temperature:
// phi(T) = phi T/Tr - 3 VT ln(T/Tr) - Eg (T/Tr - 1) and C0(T) = C0
// (phi/phi(T))^m (Sze and Ng sec. 2.2, bandgap held at the model's value).
TEST(Diode, DepletionCapacitanceAgainstTemperature) {
  DiodeModel m;
  m.junction_capacitance = 10e-12;
  m.junction_potential = 0.8;
  m.grading = 0.5;
  m.bandgap_energy = 1.12;  // eV, silicon at 300 K (Sze and Ng, app. F; from memory)
  const double t = 373.15, ratio = t / stage::kRoomTemperature;
  const double phi = 0.8 * ratio - 3 * thermal_voltage(t) * std::log(ratio) - 1.12 * (ratio - 1);
  const double c0 = 10e-12 * std::pow(0.8 / phi, 0.5);
  const double v = -2;
  const double c = c0 / std::pow(1 - v / phi, 0.5);
  EXPECT_NEAR(at(m, v, t).capacitance, c, 1e-12 * c);
}

// Diffusion charge transit_time * I adds transit_time * dI/dV.
TEST(Diode, DiffusionCapacitance) {
  DiodeModel m;
  m.transit_time = 4e-9;
  const auto p = at(m, 0.65);
  EXPECT_NEAR(p.capacitance, 4e-9 * p.conductance, 1e-12 * p.capacitance);
}

// Report: small-signal resistance seen at the terminals is the series
// resistance plus the junction's N VT / (I + IS) (Ohm's law plus Shockley).
TEST(Diode, ReportThroughSeriesResistance) {
  DiodeModel m;
  m.series_resistance = 3;
  auto check = diode_check(m);
  const double vj = 0.62;
  const auto x = check.state({{"a", 0.7}, {"k", 0.0}}, [&](const std::string&) { return vj; });
  stage::mna::EvalRequest request;
  request.x = x.data();
  stage::BiasResult out;
  check.device().report(request, out);
  const auto& op = out.diodes.at(0);
  const double vt = thermal_voltage(stage::kRoomTemperature);
  EXPECT_NEAR(op.resistance, 3 + vt / (1e-14 * std::exp(vj / vt)), 1e-9 * op.resistance);
  EXPECT_NEAR(op.current, (0.7 - vj) / 3, 1e-15);
  EXPECT_NEAR(op.voltage, 0.7, 0);
  EXPECT_NEAR(op.power, op.current * 0.7, 1e-15);
}

}  // namespace
