// DC solve times on generated linear circuits (an N x N resistor mesh with
// sources, an N-section RC ladder) from 100 to over 100,000 unknowns: the
// whole operating-point solve, one KLU refactor+solve of the same matrix, and
// a dense Eigen LU of it while that stays affordable.
#include <benchmark/benchmark.h>

#include <Eigen/Dense>

#include "analysis/newton.hpp"
#include "analysis/operating_point.hpp"
#include "benchmark_support.hpp"
#include "mna/system.hpp"
#include "simulation/assemble.hpp"

namespace {

// N x N grid of 1 k resistors, a 5 V source at one corner, current sinks
// spread over the grid, the far corner grounded through 10 ohm.
stage::Circuit mesh(int side) {
  stage::Circuit c;
  auto node = [side](int r, int col) { return "m" + std::to_string(r * side + col); };
  int k = 0;
  for (int r = 0; r < side; ++r) {
    for (int col = 0; col < side; ++col) {
      if (col + 1 < side)
        c.add("r" + std::to_string(k++), stage::Resistor{node(r, col), node(r, col + 1), 1e3});
      if (r + 1 < side)
        c.add("r" + std::to_string(k++), stage::Resistor{node(r, col), node(r + 1, col), 1e3});
      if ((r * side + col) % 97 == 13) {
        c.add("i" + std::to_string(k++), stage::CurrentSource{node(r, col), "gnd", 1e-6});
      }
    }
  }
  c.add("v1", stage::VoltageSource{node(0, 0), "gnd", 5.0});
  c.add("rg", stage::Resistor{node(side - 1, side - 1), "gnd", 10.0});
  return c;
}

// N sections of series 100 ohm and 1 nF to ground with a 1 M leak, driven by 1 V.
stage::Circuit ladder(int sections) {
  stage::Circuit c;
  c.add("v1", stage::VoltageSource{"s0", "gnd", 1.0});
  for (int k = 1; k <= sections; ++k) {
    const std::string a = "s" + std::to_string(k - 1), b = "s" + std::to_string(k);
    c.add("r" + std::to_string(k), stage::Resistor{a, b, 100.0});
    c.add("c" + std::to_string(k), stage::Capacitor{b, "gnd", 1e-9});
    c.add("g" + std::to_string(k), stage::Resistor{b, "gnd", 1e6});
  }
  return c;
}

stage::Circuit generate(int kind, int size) { return kind == 0 ? mesh(size) : ladder(size); }

// The whole operating point of a System built once: KLU's symbolic analysis,
// evaluation, numeric factorisation, solve and the convergence check. A new
// solver each time, since a solver keeps the factorisation of an unchanged
// matrix and would skip it on a second run.
void BM_OperatingPoint(benchmark::State& state) {
  const stage::Circuit circuit =
      generate(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  stage::mna::System system = stage::assemble(circuit);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1);
  for (auto _ : state) {
    stage::analysis::NewtonSolver newton(system, stage::SolverOptions{});
    std::fill(x.begin(), x.end(), 0.0);
    benchmark::DoNotOptimize(stage::analysis::solve_operating_point(newton, x));
  }
  state.counters["unknowns"] = system.size();
  state.counters["nonzeros"] = system.pattern().nnz();
}

// One numeric refactorisation and solve of the same matrix.
void BM_RefactorSolve(benchmark::State& state) {
  const stage::Circuit circuit =
      generate(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  stage::mna::System system = stage::assemble(circuit);
  const std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  stage::benchmarks::time_refactor_solve(state, system, x);
}

// Dense LU with partial pivoting of the same matrix (the test oracle).
void BM_DenseLu(benchmark::State& state) {
  const stage::Circuit circuit =
      generate(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  stage::mna::System system = stage::assemble(circuit);
  const int n = system.size();
  std::vector<double> x(static_cast<std::size_t>(n) + 1, 0.0);
  auto w = system.make_workspace();
  system.evaluate(system.request(x.data()), w);
  Eigen::MatrixXd dense = Eigen::MatrixXd::Zero(n, n);
  const auto& p = system.pattern();
  for (int col = 0; col < n; ++col) {
    for (int s = p.column_start[col]; s < p.column_start[col + 1]; ++s)
      dense(p.row[s], col) = w.g[s];
  }
  const Eigen::VectorXd rhs = Eigen::Map<Eigen::VectorXd>(w.f.data() + 1, n);
  for (auto _ : state) benchmark::DoNotOptimize(dense.partialPivLu().solve(rhs).eval());
  state.counters["unknowns"] = n;
}

// Mesh sides 10..320 (100 to 102,400 unknowns); ladders 100..100,000 sections.
void SparseSizes(benchmark::internal::Benchmark* b) {
  for (int side : {10, 20, 40, 80, 160, 320}) b->Args({0, side});
  for (int sections : {100, 1000, 10000, 100000}) b->Args({1, sections});
}
void DenseSizes(benchmark::internal::Benchmark* b) {
  for (int side : {10, 20, 40}) b->Args({0, side});
  for (int sections : {100, 1000}) b->Args({1, sections});
}

BENCHMARK(BM_OperatingPoint)->Apply(SparseSizes)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_RefactorSolve)->Apply(SparseSizes)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_DenseLu)->Apply(DenseSizes)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
