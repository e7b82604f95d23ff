// The sparse solution against a dense Eigen LU solve of the same matrix, on
// randomly generated connected resistor networks with sources; and the KCL
// residual of each sparse solution.
#include <gtest/gtest.h>

#include <Eigen/Dense>
#include <random>

#include "analysis/newton.hpp"
#include "mna/system.hpp"
#include "simulation/assemble.hpp"
#include "stage/bias.hpp"

namespace {

// A connected random network: a spanning tree of resistors plus random
// chords, a voltage source, current sources and a vcvs.
stage::Circuit random_network(int nodes, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> log_r(1.0, 6.0), volts(-10.0, 10.0);
  std::uniform_int_distribution<int> pick(0, nodes - 1);
  auto name = [](int k) { return k == 0 ? std::string("gnd") : "n" + std::to_string(k); };
  stage::Circuit c;
  int element = 0;
  auto r = [&] { return std::pow(10.0, log_r(rng)); };
  for (int k = 1; k < nodes; ++k) {
    c.add("r" + std::to_string(element++), stage::Resistor{name(k), name(pick(rng) % k), r()});
  }
  for (int k = 0; k < 2 * nodes; ++k) {
    const int a = pick(rng), b = pick(rng);
    if (a != b) c.add("r" + std::to_string(element++), stage::Resistor{name(a), name(b), r()});
  }
  c.add("v1", stage::VoltageSource{"n1", "gnd", volts(rng)});
  c.add("i1", stage::CurrentSource{name(2), name(3), volts(rng) * 1e-3});
  c.add("i2", stage::CurrentSource{name(4), "gnd", volts(rng) * 1e-3});
  c.add("e1", stage::VoltageControlledVoltageSource{"drive", "gnd", name(5), name(6), 3.0});
  c.add("re", stage::Resistor{"drive", name(7), r()});
  return c;
}

TEST(DenseOracle, RandomNetworksAgreeWithDenseLu) {
  for (unsigned seed = 1; seed <= 20; ++seed) {
    const stage::Circuit circuit = random_network(40, seed);
    stage::mna::System system = stage::assemble(circuit);
    const int n = system.size();
    std::vector<double> zero(static_cast<std::size_t>(n) + 1, 0.0);
    auto w = system.make_workspace();
    system.evaluate(system.request(zero.data()), w);
    // At x = 0 the residual is -b, and G is the whole (constant) Jacobian.
    Eigen::MatrixXd dense = Eigen::MatrixXd::Zero(n, n);
    const auto& p = system.pattern();
    for (int col = 0; col < n; ++col) {
      for (int s = p.column_start[col]; s < p.column_start[col + 1]; ++s)
        dense(p.row[s], col) += w.g[s];
    }
    Eigen::VectorXd rhs(n);
    for (int i = 0; i < n; ++i) rhs[i] = -w.f[i + 1];
    const Eigen::VectorXd reference = dense.partialPivLu().solve(rhs);

    const auto bias = stage::run_bias(circuit);
    double largest = 0;
    for (int i = 0; i < n; ++i) largest = std::max(largest, std::abs(reference[i]));
    for (const auto& [node, v] : bias.node_voltages) {
      const int i = *system.topology().find_node(node) - 1;
      // Both are backward stable: agreement to a modest multiple of the
      // condition number times machine epsilon (Golub and Van Loan, 3.3);
      // these networks' resistances span five decades.
      EXPECT_NEAR(v, reference[i], 1e-9 * largest) << "seed " << seed << " node " << node;
    }
    EXPECT_LT(bias.max_kcl_residual, 1e-12) << seed;
  }
}

}  // namespace
