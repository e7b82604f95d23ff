// An emitter follower and a common-emitter stage (npn models built in code,
// values our own) against the hybrid-pi small-signal model evaluated with the
// transistor's own reported gm, r_pi and r_out (exact for that model, so
// tight), and against the textbook approximations of Sedra & Smith,
// "Microelectronic Circuits", 7th ed., sections 7.5-7.7 and 10.3 (within
// their stated approximation error). Direct coupling (no coupling
// capacitors) keeps the midband flat, so every frequency point is midband.
#include <gtest/gtest.h>

#include "analysis/response_checks.hpp"
#include "stage/frequency.hpp"

namespace {

using stage::Circuit;
using stage::test::Complex;

constexpr double kRs = 600, kR1 = 33e3, kR2 = 22e3, kRe = 2.2e3, kRc = 3.3e3, kRl = 10e3;
constexpr double kRb = kR1 * kR2 / (kR1 + kR2);  // R'B, the divider seen from the base
// The hybrid-pi network is exact for the device's linearisation up to the
// base current's dependence on VCE (reverse B-C diffusion, ~1e-20 S here):
// what is left is LU rounding, 1e-9 is far above it.
constexpr double kTight = 1e-9;

double parallel(double a, double b) { return a * b / (a + b); }

stage::BipolarModel npn(bool with_capacitances) {
  stage::BipolarModel m;
  m.saturation_current = 5e-15;
  m.beta_forward = 180;
  m.early_voltage_forward = 75;
  if (with_capacitances) {
    m.be_capacitance = 6e-12;
    m.bc_capacitance = 2.5e-12;
    m.forward_transit_time = 0.4e-9;
  }
  return m;
}

stage::FrequencyOptions options(const std::string& output, const std::string& load) {
  stage::FrequencyOptions o;
  o.from = 100;
  o.to = 1e5;
  o.per_decade = 3;
  o.input = "vin";
  o.output = stage::SignalRef::node(output);
  o.load = load;
  return o;
}

// vin (with its 2.5 V bias) - rs - base; r1/r2 divider; collector on vcc;
// re and the load rl from the emitter to ground.
Circuit follower() {
  Circuit c;
  c.add_model("npn", npn(false));
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
  c.add("vin", stage::VoltageSource{"in", "gnd", 2.5, 1.0});
  c.add("rs", stage::Resistor{"in", "b", kRs});
  c.add("r1", stage::Resistor{"vcc", "b", kR1});
  c.add("r2", stage::Resistor{"b", "gnd", kR2});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "vcc", "b", "e", {}, "npn"});
  c.add("re", stage::Resistor{"e", "gnd", kRe});
  c.add("rl", stage::Resistor{"e", "gnd", kRl});
  return c;
}

TEST(TransistorStages, EmitterFollower) {
  const auto r = stage::run_frequency(follower(), options("e", "rl"));
  const auto& q = r.bias.bipolar("q1");
  ASSERT_EQ(q.region, stage::Region::forward_active);
  const double gm = q.gm, rpi = q.r_pi, ro = q.r_out, beta = gm * rpi;
  const double re_load = parallel(parallel(kRe, kRl), ro);  // R'E, r_o to the AC-grounded collector
  // Hybrid-pi: looking into the base, r_pi + (1 + gm r_pi) R'E.
  const double r_base = rpi + (1 + beta) * re_load;
  const double r_in_base = parallel(kRb, r_base);
  const double gain = r_in_base / (kRs + r_in_base) * (1 + beta) * re_load / r_base;
  // Into the emitter: (r_pi + RS || R'B) / (1 + gm r_pi), beside RE and r_o.
  const double r_out = parallel(parallel(kRe, ro), (rpi + parallel(kRs, kRb)) / (1 + beta));
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    const double f = r.frequencies[i];
    stage::test::expect_response(r.response[i], gain, kTight, "gain", f);
    stage::test::expect_response(r.input_impedance[i], kRs + r_in_base, kTight, "Zin", f);
    stage::test::expect_response(r.output_impedance[i], r_out, kTight, "Zout", f);
  }

  // Textbook (Sedra & Smith 7.7.6), re = 1/gm, base to emitter:
  // A = R'E / (R'E + re), Rin = R'B || beta (re + R'E), Rout = RE || (re + (RS || R'B)/beta).
  // They take beta for beta + 1 and alpha for 1: error of order 1/beta (0.6 %);
  // 2 % allows for both in one figure.
  const double re = 1 / gm;
  const double base_gain = r.response[0].real() * (kRs + r_in_base) / r_in_base;
  EXPECT_NEAR(base_gain, re_load / (re_load + re), 0.02 * base_gain);
  const double rin = r.input_impedance[0].real() - kRs;
  EXPECT_NEAR(rin, parallel(kRb, beta * (re + re_load)), 0.02 * rin);
  const double rout = r.output_impedance[0].real();
  EXPECT_NEAR(rout, parallel(kRe, re + parallel(kRs, kRb) / beta), 0.02 * rout);
}

// Grounded-emitter stage: vin (its 0.68 V sets about 1 mA) - rs - base;
// divider; rc to vcc; rl from the collector to ground.
Circuit common_emitter(bool with_capacitances) {
  Circuit c;
  c.add_model("npn", npn(with_capacitances));
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.68, 1.0});
  c.add("rs", stage::Resistor{"in", "b", kRs});
  c.add("r1", stage::Resistor{"vcc", "b", 150e3});
  c.add("r2", stage::Resistor{"b", "gnd", 10e3});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "c", "b", "gnd", {}, "npn"});
  c.add("rc", stage::Resistor{"vcc", "c", kRc});
  c.add("rl", stage::Resistor{"c", "gnd", kRl});
  return c;
}

TEST(TransistorStages, CommonEmitterMidband) {
  const auto r = stage::run_frequency(common_emitter(false), options("c", "rl"));
  const auto& q = r.bias.bipolar("q1");
  ASSERT_EQ(q.region, stage::Region::forward_active);
  const double rb = parallel(150e3, 10e3);
  const double r_in_base = parallel(rb, q.r_pi);
  const double r_load = parallel(parallel(kRc, kRl), q.r_out);  // R'L
  // Hybrid-pi: v_b from the divider RS : (R'B || r_pi), then -gm R'L.
  const double gain = -r_in_base / (kRs + r_in_base) * q.gm * r_load;
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    const double f = r.frequencies[i];
    stage::test::expect_response(r.response[i], gain, kTight, "gain", f);
    stage::test::expect_response(r.input_impedance[i], kRs + r_in_base, kTight, "Zin", f);
    stage::test::expect_response(r.output_impedance[i], parallel(kRc, q.r_out), kTight, "Zout", f);
  }
  // Inverting: 180 degrees, modulo whole turns (the unwrapping starts anywhere).
  EXPECT_NEAR(std::abs(stage::test::phase_difference_deg(r.phase_deg[0], 180.0)), 0.0, 1e-6);
}

// Miller effect (Sedra & Smith 10.3.3): the input capacitance at the base is
// C_in ~ C_pi + C_mu (1 + gm R'L). The approximation takes the low-frequency
// gain across C_mu; at 10 kHz the gain's own roll-off and C_mu's feedforward
// are below w R'L C_mu ~ 1e-3, so 1 % covers it.
TEST(TransistorStages, CommonEmitterMillerInputCapacitance) {
  auto o = options("c", "rl");
  o.from = 1e3;
  o.to = 1e4;
  o.per_decade = 1;
  const auto r = stage::run_frequency(common_emitter(true), o);
  const auto& q = r.bias.bipolar("q1");
  ASSERT_GT(q.c_mu, 0.0);
  const double f = r.frequencies.back();
  ASSERT_DOUBLE_EQ(f, 1e4);
  const double r_load = parallel(parallel(kRc, kRl), q.r_out);
  const double miller = q.c_pi + q.c_mu * (1 + q.gm * r_load);
  // The base node's admittance without RS: 1/R'B + 1/r_pi + jw C_in.
  const Complex y_base = 1.0 / (r.input_impedance.back() - kRs);
  const double c_in = y_base.imag() / (2 * M_PI * f);
  EXPECT_NEAR(c_in, miller, 0.01 * miller);
  EXPECT_GT(c_in, 10 * q.c_mu);  // the multiplication is there, not just C_pi + C_mu
}

}  // namespace
