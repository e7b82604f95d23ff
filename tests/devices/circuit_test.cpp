// The semiconductor devices inside whole circuits, solved by run_bias and
// checked against hand analysis: a diode with series resistor (exact Lambert W
// solution), a saturated transistor against the Ebers–Moll VCE(sat) formula,
// an emitter follower, and the temperature coefficient of VBE.
#include <gtest/gtest.h>

#include <boost/math/special_functions/lambert_w.hpp>
#include <cmath>

#include "devices/physical_constants.hpp"
#include "stage/bias.hpp"

namespace {

using stage::Circuit;

const double kVt = stage::devices::thermal_voltage(stage::kRoomTemperature);

// I = (N VT / R) W0(IS R / (N VT) exp((V + IS R) / (N VT))) - IS (Banwell and
// Jayakumar, "Exact analytical solution for current flow through diode with
// series resistance", Electronics Letters 36(4), 2000).
TEST(DiodeCircuit, SeriesResistorMatchesLambertW) {
  for (double v : {0.3, 0.7, 5.0}) {
    Circuit c;
    stage::DiodeModel m;
    m.saturation_current = 1e-14;
    m.emission_coefficient = 1.5;
    c.add_model("d", m);
    c.add("v1", stage::VoltageSource{"in", "gnd", v});
    c.add("r1", stage::Resistor{"in", "a", 1e3});
    c.add("d1", stage::Diode{"a", "gnd", "d"});
    const auto bias = stage::run_bias(c);
    const double nvt = 1.5 * kVt, is = 1e-14, r = 1e3;
    const double i =
        nvt / r * boost::math::lambert_w0(is * r / nvt * std::exp((v + is * r) / nvt)) - is;
    // Newton stops at the solver's relative tolerance (1e-4) at worst; in
    // practice the last quadratic step lands far below it.
    EXPECT_NEAR(bias.diode("d1").current, i, 1e-6 * i) << v;
    EXPECT_NEAR(bias.current("r1"), i, 1e-6 * i) << v;
  }
}

// Saturation with forced beta bf = IC / IB < BF:
// VCE(sat) = VT ln((1 + (bf + 1) / BR) / (1 - bf / BF)) (Ebers–Moll; Gray,
// Hurst, Lewis and Meyer ch. 1; neglects currents of order IS).
TEST(BipolarCircuit, SaturationVoltageAgainstForcedBeta) {
  for (double forced : {5.0, 10.0, 50.0}) {
    Circuit c;
    stage::BipolarModel m;
    m.beta_forward = 100;
    m.beta_reverse = 2;
    c.add_model("q", m);
    const double ic = 10e-3;
    c.add("ib", stage::CurrentSource{"gnd", "b", ic / forced});
    c.add("ic", stage::CurrentSource{"gnd", "c", ic});
    stage::Bipolar q;
    q.collector = "c";
    q.base = "b";
    q.emitter = "gnd";
    q.model = "q";
    c.add("q1", q);
    const auto bias = stage::run_bias(c);
    const double vce = kVt * std::log((1 + (forced + 1) / 2) / (1 - forced / 100));
    EXPECT_NEAR(bias.voltage("c"), vce, 1e-6) << forced;
    EXPECT_EQ(bias.bipolar("q1").region, stage::Region::saturation);
  }
}

// Emitter follower, base held at 5 V, 1 kOhm to ground: by hand,
// IE = (5 - VBE) / RE with VBE = VT ln(IE / ((1 + 1/BF) IS)) (Ebers–Moll in
// forward activity), iterated to a fixed point. Then gm = IC / VT.
TEST(BipolarCircuit, EmitterFollowerByHand) {
  Circuit c;
  stage::BipolarModel m;
  c.add_model("q", m);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12});
  c.add("vb", stage::VoltageSource{"b", "gnd", 5});
  c.add("re", stage::Resistor{"e", "gnd", 1e3});
  stage::Bipolar q;
  q.collector = "vcc";
  q.base = "b";
  q.emitter = "e";
  q.model = "q";
  c.add("q1", q);
  const auto bias = stage::run_bias(c);
  double ie = 4.3e-3;
  for (int k = 0; k < 50; ++k) ie = (5 - kVt * std::log(ie / (1.01 * 1e-16))) / 1e3;
  EXPECT_NEAR(bias.voltage("e"), ie * 1e3, 1e-6);
  const auto& op = bias.bipolar("q1");
  // The bias point is Newton's, good to its voltage tolerance (1 uV), which
  // moves IC by IC * 1 uV / VT ~ 4e-5 relative at most.
  EXPECT_NEAR(op.collector_current, ie * 100 / 101, 4e-5 * ie);
  EXPECT_NEAR(op.gm, op.collector_current / kVt, 1e-6 * op.gm);
  EXPECT_EQ(op.region, stage::Region::forward_active);
  EXPECT_NEAR(op.power, op.collector_current * op.vce + op.base_current * op.vbe, 1e-9 * op.power);
}

// VBE at constant collector current (100 uA, IS = 10 fA, so VBE ~ 0.6 V)
// falls about 2 mV/K (rule of thumb, Gray et al. ch. 1). From
// VBE = VT ln(IC / IS(T)) and IS(T) as in junction.hpp:
// dVBE/dT = (VBE - Eg - a VT) / T, a the saturation-current temperature
// exponent (Gray et al. ch. 1, temperature
// dependence of VBE).
TEST(BipolarCircuit, BaseEmitterVoltageTemperatureCoefficient) {
  auto vbe_at = [](double kelvin) {
    Circuit c;
    c.temperature = kelvin;
    stage::BipolarModel m;
    m.saturation_current = 1e-14;
    m.bandgap_energy = 1.12;  // eV, silicon at 300 K (Sze and Ng, app. F; from memory)
    m.saturation_current_temperature_exponent = 3;
    c.add_model("q", m);
    c.add("i1", stage::CurrentSource{"gnd", "c", 100e-6});
    stage::Bipolar q;
    q.collector = "c";
    q.base = "c";
    q.emitter = "gnd";
    q.model = "q";
    c.add("q1", q);
    return stage::run_bias(c).voltage("c");
  };
  const double t = stage::kRoomTemperature;
  const double slope = (vbe_at(t + 0.5) - vbe_at(t - 0.5)) / 1.0;
  const double vbe = vbe_at(t);
  EXPECT_NEAR(slope, (vbe - 1.12 - 3 * kVt) / t, 2e-6);
  EXPECT_NEAR(slope, -2e-3, 0.4e-3);
}

}  // namespace
