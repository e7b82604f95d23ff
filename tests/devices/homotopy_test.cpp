// Circuits that plain Newton from a cold start does not settle within the
// iteration limit, so that the bias point has to come from a fallback
// homotopy (conductance stepping or source stepping): a string of diodes of
// very unequal sizes directly across a stiff source, a latch held set, and a
// transistor biased through a 10 Gohm base resistor. The solver's junction
// limiting makes plain Newton succeed on each of them in 13 to 17 iterations
// at the default limit of 150, so each test lowers `max_newton_iterations`
// to 12 (a fair way to force the fallback) and first checks, with the default
// limit, that plain Newton really needs more than 12. Each then checks that a
// fallback was used, that KCL holds, and one physical figure worked by hand.
#include <gtest/gtest.h>

#include <cmath>
#include <iostream>
#include <string>
#include <vector>

#include "devices/physical_constants.hpp"
#include "stage/bias.hpp"

namespace {

using stage::BiasMethod;
using stage::Circuit;

const double kVt = stage::devices::thermal_voltage(stage::kRoomTemperature);
constexpr int kLoweredLimit = 12;

void print(const char* what, const stage::BiasResult& r) {
  std::cout << what << ": method " << stage::to_string(r.method) << ", " << r.newton_iterations
            << " Newton iterations in all, max KCL residual " << r.max_kcl_residual << " A\n";
}

// Runs the circuit with the default limit (plain Newton must succeed, taking
// more than kLoweredLimit iterations: otherwise the lowered limit would not
// force a fallback and the test would prove nothing), then with the lowered
// limit, and returns that second result.
stage::BiasResult bias_with_lowered_limit(const Circuit& c, const char* what) {
  const stage::BiasResult plain = stage::run_bias(c);
  print(what, plain);
  EXPECT_EQ(plain.method, BiasMethod::newton) << what;
  EXPECT_GT(plain.newton_iterations, kLoweredLimit) << what;
  stage::SolverOptions lowered;
  lowered.max_newton_iterations = kLoweredLimit;
  const stage::BiasResult r = stage::run_bias(c, lowered);
  print(what, r);
  return r;
}

// Twenty diodes in series across 14 V, areas rising geometrically from 1 to
// 1e4. Newton's first (linear) step splits the 14 V inversely to the tiny
// zero-bias conductances, that is to the areas, so the smallest diodes are
// driven far into forward bias and must be walked back by limiting.
TEST(Homotopy, DiodeStringOfUnequalAreasAcrossStiffSource) {
  constexpr int kDiodes = 20;
  constexpr double kIs = 1e-16, kSpread = 1e4, kSupply = 14.0;
  Circuit c;
  stage::DiodeModel m;
  m.saturation_current = kIs;
  c.add_model("d", m);
  c.add("v1", stage::VoltageSource{"n0", "gnd", kSupply});
  std::vector<double> area(kDiodes);
  for (int i = 0; i < kDiodes; ++i) {
    area[i] = std::pow(kSpread, static_cast<double>(i) / (kDiodes - 1));
    const std::string cathode = i == kDiodes - 1 ? "gnd" : "n" + std::to_string(i + 1);
    c.add("d" + std::to_string(i), stage::Diode{"n" + std::to_string(i), cathode, "d", area[i]});
  }
  const auto r = bias_with_lowered_limit(c, "diode string");
  EXPECT_NE(r.method, BiasMethod::newton);

  // One current I through every diode (KCL), and the diode voltages
  // VT ln(I / (IS a_i) + 1) add up to the supply (KVL, Shockley's law).
  // Dropping the +1 (relative error IS a_i / I, below 1e-9 here) gives
  // ln I = (V / VT + sum ln(IS a_i)) / N: I = IS * geometric mean of the
  // areas (here sqrt(1e4) = 100) * exp(V / (N VT)). Exact solution.
  const double i_hand = kIs * std::sqrt(kSpread) * std::exp(kSupply / (kDiodes * kVt));
  std::cout << "diode string: hand current " << i_hand << " A, simulated " << r.diode("d0").current
            << " A\n";
  for (int i = 0; i < kDiodes; ++i) {
    const auto& d = r.diode("d" + std::to_string(i));
    // Newton stops at its relative tolerance (1e-4) at worst; in practice
    // its last quadratic step lands far below, so 1e-6 (as in circuit_test).
    EXPECT_NEAR(d.current, i_hand, 1e-6 * i_hand) << i;
    // The voltage follows from the current through Shockley's law: an
    // error of 1e-6 in the current is VT * 1e-6 = 2.6e-8 V.
    EXPECT_NEAR(d.voltage, kVt * std::log(i_hand / (kIs * area[i]) + 1), 3e-8) << i;
  }
  // Common practice: KCL holding to a part per million of the smallest
  // current that matters (here the 5.7 mA string current). The solver's own
  // acceptance test is looser (1 pA plus 1e-4 of each node's current scale),
  // but a converged quadratic step lands far below it.
  EXPECT_LT(r.max_kcl_residual, 1e-6 * i_hand);
}

// Two cross-coupled npn transistors (collector loads 1k from 5 V, 10k from
// each collector to the other's base: positive feedback), with Q2's base
// held to ground by 1k. That hold makes the state unique: to turn Q2 on,
// c1 would have to drive 0.6 V / 1k through 10k, i.e. stand above 6.6 V >
// VCC. So Q1 is on and saturated, Q2 off.
TEST(Homotopy, LatchHeldSet) {
  constexpr double kVcc = 5, kRc = 1e3, kRb = 10e3, kBf = 100, kBr = 2;
  Circuit c;
  stage::BipolarModel m;
  m.beta_forward = kBf;
  m.beta_reverse = kBr;
  c.add_model("q", m);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", kVcc});
  c.add("rc1", stage::Resistor{"vcc", "c1", kRc});
  c.add("rc2", stage::Resistor{"vcc", "c2", kRc});
  c.add("rb1", stage::Resistor{"c2", "b1", kRb});
  c.add("rb2", stage::Resistor{"c1", "b2", kRb});
  c.add("rhold", stage::Resistor{"b2", "gnd", 1e3});
  for (const char* n : {"1", "2"}) {
    stage::Bipolar q;
    q.collector = std::string("c") + n;
    q.base = std::string("b") + n;
    q.emitter = "gnd";
    q.model = "q";
    c.add(std::string("q") + n, q);
  }
  const auto r = bias_with_lowered_limit(c, "latch");
  EXPECT_NE(r.method, BiasMethod::newton);
  const auto& q1 = r.bipolar("q1");
  const auto& q2 = r.bipolar("q2");
  std::cout << "latch: v(c1) " << r.voltage("c1") << " V, v(c2) " << r.voltage("c2") << " V, Q1 "
            << to_string(q1.region) << " IC " << q1.collector_current << " A IB " << q1.base_current
            << " A, Q2 " << to_string(q2.region) << "\n";
  EXPECT_EQ(q1.region, stage::Region::saturation);
  EXPECT_EQ(q2.region, stage::Region::cutoff);

  // Q2 off, so RC2 carries only Q1's base current through RB1: by the
  // divider, v(c2) = (VCC RB + VBE1 RC) / (RB + RC) (hand analysis), with the
  // usual hand figure VBE(sat) = 0.8 V for a saturated small silicon
  // transistor (common practice; 0.7 V is the forward-active figure, and the
  // forward-biased collector junction adds base current in saturation). With
  // VBE1 anywhere in 0.7 .. 0.9 V that is within 0.1 V * RC / (RB + RC) =
  // 9.1 mV of the 0.8 V figure, 4.6182 V.
  const double vc2_hand = (kVcc * kRb + 0.8 * kRc) / (kRb + kRc);
  EXPECT_NEAR(r.voltage("c2"), vc2_hand, 0.1 * kRc / (kRb + kRc));

  // Q1 saturated at forced beta bf = IC / IB:
  // VCE(sat) = VT ln((1 + (bf + 1) / BR) / (1 - bf / BF)) (Ebers–Moll; Gray,
  // Hurst, Lewis and Meyer, "Analysis and Design of Analog Integrated
  // Circuits", ch. 1; neglects currents of order IS, 1e-16 A here). Same
  // 1e-6 V as the saturation test in circuit_test.
  const double forced = q1.collector_current / q1.base_current;
  const double vce_hand = kVt * std::log((1 + (forced + 1) / kBr) / (1 - forced / kBf));
  std::cout << "latch: forced beta " << forced << ", hand VCE(sat) " << vce_hand << " V, simulated "
            << q1.vce << " V\n";
  EXPECT_NEAR(q1.vce, vce_hand, 1e-6);

  // Common practice, as above: a part per million of Q1's base current
  // (about 0.39 mA), the smallest current that matters here.
  EXPECT_LT(r.max_kcl_residual, 1e-6 * q1.base_current);
}

// A grounded-emitter stage biased by a 10 Gohm resistor from 12 V to the
// base, 50 Mohm collector load: the base node hangs on 1e-10 S, and the
// base current is about a nanoamp.
TEST(Homotopy, VeryLargeBaseResistor) {
  constexpr double kVcc = 12, kRb = 1e10, kRc = 5e7, kBf = 100, kIs = 1e-16;
  Circuit c;
  stage::BipolarModel m;  // IS 1e-16 A, BF 100, no Early effect
  c.add_model("q", m);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", kVcc});
  c.add("rb", stage::Resistor{"vcc", "b", kRb});
  c.add("rc", stage::Resistor{"vcc", "c", kRc});
  stage::Bipolar q;
  q.collector = "c";
  q.base = "b";
  q.emitter = "gnd";
  q.model = "q";
  c.add("q1", q);
  const auto r = bias_with_lowered_limit(c, "large base resistor");
  EXPECT_NE(r.method, BiasMethod::newton);

  // By hand (Ebers–Moll in forward activity, as in circuit_test's emitter
  // follower): IB = (VCC - VBE) / RB, IC = BF IB, VBE = VT ln(IC / IS + 1),
  // iterated to a fixed point (it contracts by VT / (VCC - VBE), 0.2 %, per
  // pass; 50 passes are far more than enough).
  double vbe = 0.7, ic = 0;
  for (int pass = 0; pass < 50; ++pass) {
    ic = kBf * (kVcc - vbe) / kRb;
    vbe = kVt * std::log(ic / kIs + 1);
  }
  const auto& op = r.bipolar("q1");
  std::cout << "large base resistor: hand IC " << ic << " A, VBE " << vbe << " V, VC "
            << kVcc - ic * kRc << " V; simulated IC " << op.collector_current << " A, VBE "
            << op.vbe << " V, VC " << r.voltage("c") << " V, " << to_string(op.region) << "\n";
  EXPECT_EQ(op.region, stage::Region::forward_active);
  // The hand formulas leave out the reverse-junction terms, of order IS =
  // 1e-16 A against the 1.1 nA base current (1e-7 relative); with Newton's
  // stopping error as above, 1e-6.
  EXPECT_NEAR(op.collector_current, ic, 1e-6 * ic);
  EXPECT_NEAR(r.voltage("c"), kVcc - ic * kRc, 1e-6 * ic * kRc);
  // Common practice, as above: a part per million of the 1.1 nA base
  // current.
  EXPECT_LT(r.max_kcl_residual, 1e-6 * op.base_current);
}

}  // namespace
