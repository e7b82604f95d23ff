// The sparse complex solve (KLU, symbolic analysis once, pivots reused from
// frequency to frequency) against a dense LU with partial pivoting (Eigen
// PartialPivLU) of the same G + jwC, assembled entry by entry from the
// compressed-column pattern: the conformance check of style.md item 6.
#include <gtest/gtest.h>

#include <Eigen/Dense>
#include <cstdio>
#include <random>

#include "analysis/operating_point.hpp"
#include "analysis/small_signal.hpp"
#include "simulation/assemble.hpp"

namespace {

using stage::Circuit;
using stage::analysis::Complex;

Circuit rc_low_pass() {
  Circuit c;
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("r1", stage::Resistor{"in", "out", 1.5e3});
  c.add("c1", stage::Capacitor{"out", "gnd", 47e-9});
  return c;
}

Circuit rlc_band_pass() {
  Circuit c;
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("l1", stage::Inductor{"in", "a", 10e-3});
  c.add("c1", stage::Capacitor{"a", "out", 2.5e-6});
  c.add("r1", stage::Resistor{"out", "gnd", 220.0});
  return c;
}

// A random network on `nodes` nodes: a chain of inductors (a tree, so no loop
// of inductors is a short at DC) and random resistors and capacitors across
// random pairs, every node with a resistor to ground.
Circuit random_network(int nodes, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_int_distribution<int> pick(0, nodes - 1);
  std::uniform_real_distribution<double> decades(0.0, 3.0);
  auto node = [](int k) { return "n" + std::to_string(k); };
  Circuit c;
  c.add("vin", stage::VoltageSource{node(0), "gnd", 0.0, 1.0});
  for (int k = 0; k < nodes; ++k) {
    c.add("rg" + std::to_string(k),
          stage::Resistor{node(k), "gnd", 1e2 * std::pow(10, decades(rng))});
    if (k + 1 < nodes) {
      c.add("l" + std::to_string(k),
            stage::Inductor{node(k), node(k + 1), 1e-6 * std::pow(10, decades(rng))});
    }
  }
  for (int e = 0; e < 2 * nodes; ++e) {
    const int a = pick(rng), b = pick(rng);
    if (a == b) continue;
    c.add("r" + std::to_string(e),
          stage::Resistor{node(a), node(b), 1e2 * std::pow(10, decades(rng))});
    c.add("c" + std::to_string(e),
          stage::Capacitor{node(a), node(b), 1e-12 * std::pow(10, decades(rng))});
  }
  return c;
}

// Solves with both at several frequencies, for the same right-hand side.
void compare_with_dense(const Circuit& circuit) {
  stage::mna::System system = stage::assemble(circuit);
  stage::analysis::NewtonSolver newton(system, stage::SolverOptions{});
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  stage::analysis::solve_operating_point(newton, x);
  stage::analysis::SmallSignalSystem linear(system, x);

  const int n = system.size();
  const auto& pattern = system.pattern();
  std::mt19937 rng(7);
  std::normal_distribution<double> normal;
  for (double f : {1.0, 1e3, 1e6, 1e9}) {
    const double omega = 2 * M_PI * f;
    Eigen::MatrixXcd dense = Eigen::MatrixXcd::Zero(n, n);
    for (int col = 0; col < n; ++col) {
      for (int s = pattern.column_start[col]; s < pattern.column_start[col + 1]; ++s) {
        dense(pattern.row[s], col) +=
            Complex(linear.conductance()[s], omega * linear.capacitance()[s]);
      }
    }
    auto b = linear.make_vector();
    Eigen::VectorXcd rhs(n);
    for (int k = 1; k <= n; ++k) rhs[k - 1] = b[k] = Complex(normal(rng), normal(rng));

    linear.factor(omega);
    linear.solve(b);
    const Eigen::VectorXcd want = dense.partialPivLu().solve(rhs);
    Eigen::VectorXcd got(n);
    for (int k = 1; k <= n; ++k) got[k - 1] = b[k];

    // Both solvers are backward stable, so each is within cond(A) times a
    // small multiple of n eps of the exact solution (Higham, "Accuracy and
    // Stability of Numerical Algorithms", 2nd ed., thm. 9.5 and eq. 7.2).
    const Eigen::JacobiSVD<Eigen::MatrixXcd> svd(dense);
    const double cond = svd.singularValues()(0) / svd.singularValues()(n - 1);
    const double bound = 10.0 * n * std::numeric_limits<double>::epsilon() * cond;
    const double difference = (got - want).norm() / want.norm();
    EXPECT_LE(difference, bound) << "at " << f << " Hz, cond " << cond;
    char figures[96];
    std::snprintf(figures, sizeof figures, "f %.0e Hz: difference %.2e, bound %.2e", f, difference,
                  bound);
    testing::Test::RecordProperty("dense_" + std::to_string(static_cast<long>(f)), figures);
  }
}

TEST(DenseReference, RcLowPass) { compare_with_dense(rc_low_pass()); }
TEST(DenseReference, RlcBandPass) { compare_with_dense(rlc_band_pass()); }
TEST(DenseReference, RandomRcRlNetworks) {
  for (unsigned seed : {1u, 2u, 3u}) compare_with_dense(random_network(40, seed));
}

}  // namespace
