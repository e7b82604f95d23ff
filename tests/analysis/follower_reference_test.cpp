// A transistor stage against an independent integration: an emitter follower
// with input and output coupling capacitors, biased by a resistor divider and
// driven hard enough that the negative half clips at cutoff. The reference
// writes the circuit as an ODE in the two capacitor voltages, solves the
// resistive part (base and emitter voltages) at every right-hand-side
// evaluation by Newton's method on KCL with the Ebers–Moll transistor written
// out here, and integrates with Boost.Odeint's Dormand–Prince stepper at a
// tight tolerance.
#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <iomanip>
#include <numbers>
#include <sstream>
#include <vector>

#include "ebers_moll_reference.hpp"
#include "stage/transient.hpp"

namespace {

// The stage: 12 V supply, divider 47k/47k to the base, 1k emitter resistor,
// a 5 V, 1 kHz source behind 1k into 10 uF, 100 uF out into a 1k load.
// Quiescent emitter current ~4.6 mA, so the output can fall only about
// IE (RE || RL) ~ 2.3 V before the transistor cuts off, while it can rise
// almost the whole drive: the negative side clips, the positive does not.
constexpr double kVcc = 12, kAmplitude = 5, kF = 1e3;
constexpr double kRs = 1e3, kR1 = 47e3, kR2 = 47e3, kRe = 1e3, kRl = 1e3;
constexpr double kCin = 10e-6, kCout = 100e-6;
constexpr double kIs = 1e-14, kBf = 150, kBr = 2;
constexpr double kKelvin = 300.15;

const stage::testing::EbersMoll kTransistor{kIs, kBf, kBr,
                                            stage::testing::thermal_voltage(kKelvin)};

// Base and emitter voltages of the resistive part.
struct Nodes {
  double vb = 0, ve = 0;
};

// Solves KCL at base and emitter for the capacitor voltages
// vcin = v(in) - v(base), vcout = v(e) - v(out) and the source voltage vs,
// by Newton from `start` (the last solution: it moves little between
// right-hand-side evaluations). With `dc` the coupling branches carry no
// current (capacitors open): the bias point.
Nodes solve_nodes(double vs, double vcin, double vcout, Nodes start, bool dc = false) {
  const double gs = dc ? 0 : 1 / kRs, gl = dc ? 0 : 1 / kRl;
  const auto kcl = [&](const Eigen::VectorXd& v, Eigen::VectorXd& f, Eigen::MatrixXd& j) {
    const auto q = kTransistor(v[0] - v[1], v[0] - kVcc);
    // Currents into the base node and into the emitter node.
    f[0] = (vs - vcin - v[0]) * gs + (kVcc - v[0]) / kR1 - v[0] / kR2 - q.ib;
    f[1] = q.ic + q.ib - v[1] / kRe - (v[1] - vcout) * gl;
    j(0, 0) = -gs - 1 / kR1 - 1 / kR2 - q.dib_dvbe - q.dib_dvbc;
    j(0, 1) = q.dib_dvbe;
    j(1, 0) = q.dic_dvbe + q.dic_dvbc + q.dib_dvbe + q.dib_dvbc;
    j(1, 1) = -q.dic_dvbe - q.dib_dvbe - 1 / kRe - gl;
  };
  Eigen::VectorXd x(2);
  x << start.vb, start.ve;
  if (!stage::testing::solve_kcl(kcl, x, kTransistor.vt)) {
    ADD_FAILURE() << "reference Newton did not converge at vs = " << vs;
  }
  return {x[0], x[1]};
}

double source(double t) { return kAmplitude * std::sin(2 * std::numbers::pi * kF * t); }

TEST(FollowerReference, ClippedOutputAgreesWithDormandPrince) {
  stage::Circuit c;
  c.temperature = kKelvin;
  stage::BipolarModel npn;  // with the rest at its defaults: plain Ebers–Moll
  npn.saturation_current = kIs;
  npn.beta_forward = kBf;
  npn.beta_reverse = kBr;
  c.add_model("npn", npn);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", kVcc});
  c.add("vs", stage::VoltageSource{"src", "gnd", 0.0, 0.0, 0.0, stage::SineWave{kAmplitude, kF}});
  c.add("rs", stage::Resistor{"src", "in", kRs});
  c.add("cin", stage::Capacitor{"in", "base", kCin});
  c.add("r1", stage::Resistor{"vcc", "base", kR1});
  c.add("r2", stage::Resistor{"base", "gnd", kR2});
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "vcc", "base", "e", {}, "npn"});
  c.add("re", stage::Resistor{"e", "gnd", kRe});
  c.add("cout", stage::Capacitor{"e", "out", kCout});
  c.add("rl", stage::Resistor{"out", "gnd", kRl});
  // Tight tolerances, so that the simulator's own integration and Newton
  // error stay two orders below the 0.1 % budget and a wrong model or stamp,
  // not the integrator, is what would break the check. The relative
  // tolerance serves both the charges' local error and the Newton
  // convergence test; 1 uV and 1 pA are the absolute floors (the defaults).
  stage::SolverOptions solver;
  solver.relative_tolerance = 1e-6;
  solver.voltage_tolerance = 1e-6;
  solver.current_tolerance = 1e-12;
  stage::TransientOptions o;
  o.stop = 5 / kF;
  // At most 1/200 of a period per step (1.8 degrees of the sine). The
  // trapezoidal rule's phase error on a sinusoid is (w h)^2 / 12 per radian
  // (from its amplification factor), 8e-5 here, and the knee into cutoff,
  // where the capacitor currents only bend, is resolved to that angle: the
  // error estimate, which watches the charges, does not see the knee itself.
  o.max_step = 1 / (200 * kF);
  const auto r = stage::run_transient(c, o, solver);

  // The run starts from the bias point with the source at zero: capacitors
  // open, so vcin = -v(base) and vcout = v(e).
  Nodes nodes = solve_nodes(0, 0, 0, {kVcc / 2, kVcc / 2 - 0.6}, true);
  using State = std::array<double, 2>;  // vcin, vcout
  State state{-nodes.vb, nodes.ve};
  const auto rhs = [&](const State& v, State& dv, double t) {
    const double vs = source(t);
    nodes = solve_nodes(vs, v[0], v[1], nodes);
    dv[0] = (vs - v[0] - nodes.vb) / kRs / kCin;
    dv[1] = (nodes.ve - v[1]) / kRl / kCout;
  };
  std::vector<double> reference;
  stage::testing::dormand_prince_at(rhs, state, r.time, [&](const State& v, double t) {
    const Nodes n = solve_nodes(source(t), v[0], v[1], nodes);
    reference.push_back(n.ve - v[1]);  // v(out) = v(e) - vcout
  });
  ASSERT_EQ(reference.size(), r.time.size());

  const auto& out = r.signal("out");
  const auto [low, high] = std::minmax_element(reference.begin(), reference.end());
  // Full scale: the largest excursion of the reference output (its positive peak).
  const double full_scale = std::max(std::abs(*low), std::abs(*high));
  double worst = 0;
  for (std::size_t k = 0; k < out.size(); ++k) {
    worst = std::max(worst, std::abs(out[k] - reference[k]));
  }
  std::ostringstream fraction;
  fraction << std::setprecision(3) << worst / full_scale;
  RecordProperty("worst_fraction_of_full_scale", fraction.str());
  RecordProperty("points", static_cast<int>(out.size()));
  EXPECT_LT(worst, 1e-3 * full_scale);  // 0.1 % of full scale (Boost.Odeint reference)

  const auto [out_low, out_high] = std::minmax_element(out.begin(), out.end());
  // It follows: the positive peak is near the drive, the follower's gain
  // being close to one (hand analysis: 17.9k / (1k + 17.9k) into the base).
  EXPECT_GT(*out_high, 0.8 * kAmplitude);
  // It clips: the negative peak stops near -IE (RE || RL) ~ -2.3 V at cutoff
  // (hand analysis, the AC load line), well short of the positive one.
  EXPECT_LT(-*out_low, 0.7 * *out_high);
}

}  // namespace
