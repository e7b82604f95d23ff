// A chain of twenty capacitor-coupled emitter followers (Ebers–Moll
// transistors, no junction charges) under every integration method against
// an independent integration: the reference writes the chain as an ODE in
// its coupling-capacitor voltages, solves every node voltage at each
// right-hand-side evaluation by Newton on KCL with the Ebers–Moll transistor
// written out in ebers_moll_reference.hpp, and integrates with
// Boost.Odeint's Dormand–Prince stepper at a tight tolerance (issue 10).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "ebers_moll_reference.hpp"
#include "follower_chain.hpp"
#include "reference.hpp"
#include "stage/transient.hpp"

namespace {

using stage::Integration;
using namespace stage::testing;
using stage::BipolarModel, stage::Circuit, stage::TransientOptions, stage::TransientResult;

constexpr int kStages = 20;
// 1 V into the chain: each emitter current swings by about a quarter of its
// ~4 mA bias, so the junctions work well off their small-signal line.
constexpr double kAmplitude = 1.0;
// Generic textbook-typical small-signal npn values, not any real part:
// IS 1e-15 A, BF 100, BR 1, and nothing else (plain Ebers–Moll).
constexpr double kIs = 1e-15, kBf = 100, kBr = 1;

// Node voltages in the order e0, b1, e1, ..., bN, eN: index of b_k and e_k.
constexpr Eigen::Index base(int k) { return 2 * k - 1; }
constexpr Eigen::Index emitter(int k) { return 2 * k; }

// KCL of the chain at node voltages v, source voltage vs, coupling-capacitor
// voltages vc (vc[k - 1] = v(e_{k-1}) - v(b_k), the last entry the output
// capacitor's v(e_N) - v(out)). Each capacitor ties its two nodes into one:
// its b_k row states the tie and its current joins e_{k-1}'s row. With `dc`
// the capacitors are open instead (the bias point): each b_k row is KCL at
// b_k alone.
void chain_kcl(const EbersMoll& q, double vs, const std::vector<double>& vc, bool dc,
               const Eigen::VectorXd& v, Eigen::VectorXd& f, Eigen::MatrixXd& j) {
  const double gs = 1 / kChainSourceResistance, gd = 1 / kChainDivider;
  const double ge = 1 / kChainEmitterResistance, gl = 1 / kChainLoad;
  f[0] = (vs - v[0]) * gs;
  j(0, 0) = -gs;
  for (int k = 1; k <= kStages; ++k) {
    const Eigen::Index b = base(k), e = emitter(k), before = emitter(k - 1);
    const auto t = q(v[b] - v[e], v[b] - kChainSupply);
    // Current leaving b_k into its divider and its transistor's base.
    const double into_base = (v[b] - kChainSupply) * gd + v[b] * gd + t.ib;
    const double dbase_db = 2 * gd + t.dib_dvbe + t.dib_dvbc, dbase_de = -t.dib_dvbe;
    if (dc) {
      f[b] = into_base;
      j(b, b) = dbase_db;
      j(b, e) = dbase_de;
    } else {
      f[b] = v[before] - v[b] - vc[k - 1];
      j(b, before) = 1;
      j(b, b) = -1;
      f[before] -= into_base;
      j(before, b) -= dbase_db;
      j(before, e) -= dbase_de;
    }
    f[e] = t.ic + t.ib - v[e] * ge;
    j(e, b) = t.dic_dvbe + t.dic_dvbc + t.dib_dvbe + t.dib_dvbc;
    j(e, e) = -t.dic_dvbe - t.dib_dvbe - ge;
  }
  if (!dc) {
    const Eigen::Index last = emitter(kStages);
    f[last] -= (v[last] - vc[kStages]) * gl;
    j(last, last) -= gl;
  }
}

class FollowerChainReference : public ::testing::TestWithParam<Integration> {};

// Tolerance: the simulator runs at a relative tolerance of 1e-9 and an
// absolute one of 1 nV, so each coupling capacitor's local error is held to
// about 1e-15 C (1 nV on 1 uF: the absolute floor times the capacitance
// dominates), and the reference at 1e-10. Over the run the capacitor
// voltages drift by a few uV at most and every node with them: 1e-5 of the
// 1 V drive (10 uV) leaves twice the measured worst (3 to 5 uV, by method),
// while a wrong stamp, model term or formula coefficient moves the
// nonlinear chain by millivolts. (At the default 1 uV floor the step is
// never error-limited here and the methods' own errors, 40 to 300 uV on
// the output, would be what is measured.)
TEST_P(FollowerChainReference, EveryNodeAgreesWithDormandPrince) {
  BipolarModel npn;  // the rest at its defaults: plain Ebers–Moll
  npn.saturation_current = kIs;
  npn.beta_forward = kBf;
  npn.beta_reverse = kBr;
  Circuit c = follower_chain(kStages, npn, kAmplitude);
  stage::SolverOptions solver;
  solver.integration = GetParam();
  solver.relative_tolerance = 1e-9;
  solver.voltage_tolerance = 1e-9;
  TransientOptions o;
  o.stop = 3 / kChainFrequency;
  o.max_step = 1 / (100 * kChainFrequency);
  const TransientResult r = stage::run_transient(c, o, solver);

  const EbersMoll q{kIs, kBf, kBr, thermal_voltage(c.temperature)};
  Eigen::VectorXd v = Eigen::VectorXd::Constant(2 * kStages + 1, kChainSupply / 2);
  v[0] = 0;
  for (int k = 1; k <= kStages; ++k) v[emitter(k)] -= 0.6;
  // The run starts from the bias point with the source at zero: capacitors
  // open, so each vc is the difference of the DC node voltages.
  std::vector<double> state(kStages + 1, 0.0);
  const auto solve = [&](double vs, const std::vector<double>& vc, bool dc) {
    const auto kcl = [&](const Eigen::VectorXd& x, Eigen::VectorXd& f, Eigen::MatrixXd& j) {
      chain_kcl(q, vs, vc, dc, x, f, j);
    };
    if (!solve_kcl(kcl, v, q.vt)) ADD_FAILURE() << "reference Newton did not converge";
  };
  solve(0, state, true);
  for (int k = 1; k <= kStages; ++k) state[k - 1] = v[emitter(k - 1)] - v[base(k)];
  state[kStages] = v[emitter(kStages)];

  const auto drive = [](double t) {
    return kAmplitude * std::sin(2 * std::numbers::pi * kChainFrequency * t);
  };
  // C dvc/dt is the current through each capacitor: into b_k's divider and
  // base, and through the load.
  const auto rhs = [&](const std::vector<double>& vc, std::vector<double>& dvc, double t) {
    solve(drive(t), vc, false);
    for (int k = 1; k <= kStages; ++k) {
      const double vb = v[base(k)], ib = q(vb - v[emitter(k)], vb - kChainSupply).ib;
      dvc[k - 1] = ((vb - kChainSupply) / kChainDivider + vb / kChainDivider + ib) / kChainCoupling;
    }
    dvc[kStages] = (v[emitter(kStages)] - vc[kStages]) / kChainLoad / kChainOutputCoupling;
  };
  // Every emitter and the output, at every time the simulator took.
  std::vector<std::vector<double>> reference(kStages + 1);
  dormand_prince_at(rhs, state, r.time, [&](const std::vector<double>& vc, double t) {
    solve(drive(t), vc, false);
    for (int k = 1; k <= kStages; ++k) reference[k - 1].push_back(v[emitter(k)]);
    reference[kStages].push_back(v[emitter(kStages)] - vc[kStages]);
  });

  double worst = 0;
  for (int k = 1; k <= kStages + 1; ++k) {
    const std::string node = k <= kStages ? "e" + std::to_string(k) : "out";
    const auto& simulated = r.signal(node);
    ASSERT_EQ(reference[k - 1].size(), simulated.size());
    for (std::size_t s = 0; s < simulated.size(); ++s) {
      worst = std::max(worst, std::abs(simulated[s] - reference[k - 1][s]));
    }
  }
  RecordProperty("worst_difference_V", std::to_string(worst));
  EXPECT_LT(worst, 1e-5 * kAmplitude);  // Boost.Odeint Dormand–Prince reference

  // It follows: the output's swing is near the drive's (hand analysis: the
  // 1k source into ~19k of divider and base, then twenty followers of gain
  // just below one).
  const auto& out = r.signal("out");
  const auto [low, high] = std::minmax_element(out.begin(), out.end());
  EXPECT_GT(*high - *low, 1.4 * kAmplitude);
  EXPECT_LT(*high - *low, 2 * kAmplitude);
}

INSTANTIATE_TEST_SUITE_P(EveryMethod, FollowerChainReference,
                         ::testing::Values(Integration::tr_bdf2, Integration::trapezoidal,
                                           Integration::bdf2),
                         integration_name);

}  // namespace
