// DC operating point of generated transistor circuits with 10 to 2,000
// transistors (chains of emitter followers, arrays of resistor-loaded
// differential pairs): Newton iterations and time of a whole solve from zero,
// and how an iteration splits between device evaluation and the KLU
// refactor+solve of the same matrix.
#include <benchmark/benchmark.h>

#include <algorithm>
#include <cmath>

#include "analysis/newton.hpp"
#include "analysis/operating_point.hpp"
#include "benchmark_support.hpp"
#include "mna/system.hpp"
#include "simulation/assemble.hpp"

namespace {

using stage::benchmarks::generic_npn;

// Direct-coupled chain of followers, each with its own emitter resistor; a
// divider biases the first base. Alternating 12 V rails keep every stage active.
stage::Circuit follower_chain(int transistors) {
  stage::Circuit c;
  c.add_model("npn", generic_npn());
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 24.0});
  c.add("rb1", stage::Resistor{"vcc", "e0", 10e3});
  c.add("rb2", stage::Resistor{"e0", "gnd", 10e3});
  for (int k = 1; k <= transistors; ++k) {
    const std::string base = "e" + std::to_string(k - 1), emitter = "e" + std::to_string(k);
    c.add("q" + std::to_string(k),
          stage::Bipolar{stage::Polarity::npn, "vcc", base, emitter, {}, "npn"});
    c.add("re" + std::to_string(k), stage::Resistor{emitter, "gnd", 20e3});
    // Pull each node back up so that the chain does not run out of headroom.
    c.add("rp" + std::to_string(k), stage::Resistor{"vcc", emitter, 40e3});
  }
  return c;
}

// Independent differential pairs with a shared tail per pair, inputs offset
// by a few millivolts from a common bias.
stage::Circuit differential_pairs(int transistors) {
  stage::Circuit c;
  c.add_model("npn", generic_npn());
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
  c.add("vee", stage::VoltageSource{"vee", "gnd", -12.0});
  c.add("vin", stage::VoltageSource{"inp", "gnd", 0.005});
  for (int k = 0; k < transistors / 2; ++k) {
    const std::string s = std::to_string(k);
    c.add("qa" + s, stage::Bipolar{stage::Polarity::npn, "ca" + s, "inp", "t" + s, {}, "npn"});
    c.add("qb" + s, stage::Bipolar{stage::Polarity::npn, "cb" + s, "gnd", "t" + s, {}, "npn"});
    c.add("rca" + s, stage::Resistor{"vcc", "ca" + s, 10e3});
    c.add("rcb" + s, stage::Resistor{"vcc", "cb" + s, 10e3});
    c.add("rt" + s, stage::Resistor{"t" + s, "vee", 11.3e3});
  }
  return c;
}

stage::Circuit generate(int kind, int transistors) {
  return kind == 0 ? follower_chain(transistors) : differential_pairs(transistors);
}

// Arguments: circuit kind, transistors, and optionally k for a relative
// tolerance of 10^-k (default: the SolverOptions default). Counters: Newton
// iterations, and the largest KCL residual at the solution, so the cost and
// the gain of a tighter tolerance read side by side.
void BM_BiasFromZero(benchmark::State& state) {
  const auto circuit = generate(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  stage::mna::System system = stage::assemble(circuit);
  stage::SolverOptions solver;
  if (state.range(2) > 0) solver.relative_tolerance = std::pow(10.0, -state.range(2));
  stage::analysis::NewtonSolver newton(system, solver);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1);
  int iterations = 0;
  for (auto _ : state) {
    std::fill(x.begin(), x.end(), 0.0);
    iterations = stage::analysis::solve_operating_point(newton, x).newton_iterations;
  }
  state.counters["newton_iterations"] = iterations;
  state.counters["unknowns"] = system.size();
  auto w = system.make_workspace();
  system.evaluate(system.request(x.data()), w);
  double largest = 0;
  for (stage::mna::Index i = 1; i <= system.size(); ++i) {
    if (system.topology().kind(i) == stage::mna::UnknownKind::voltage)
      largest = std::max(largest, std::abs(w.f[i]));
  }
  state.counters["largest_kcl_residual_A"] = largest;
  // Seconds per Newton iteration: elapsed / (runs * iterations per run).
  state.counters["seconds_per_newton_iteration"] = benchmark::Counter(
      iterations, benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}

// One evaluation of every device at the solution, as each DC Newton
// iteration asks it before the linear solve: limited, without charges.
void BM_DeviceEvaluation(benchmark::State& state) {
  const auto circuit = generate(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  stage::mna::System system = stage::assemble(circuit);
  stage::analysis::NewtonSolver newton(system, stage::SolverOptions{});
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  stage::analysis::solve_operating_point(newton, x);
  auto w = system.make_workspace();
  auto request = system.request(x.data());
  request.limit = true;
  request.charges = false;
  for (auto _ : state) {
    system.evaluate(request, w);
    benchmark::DoNotOptimize(w.f.data());
  }
}

// The linear-algebra half of an iteration: KLU refactor and solve.
void BM_RefactorSolve(benchmark::State& state) {
  const auto circuit = generate(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  stage::mna::System system = stage::assemble(circuit);
  stage::analysis::NewtonSolver newton(system, stage::SolverOptions{});
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  stage::analysis::solve_operating_point(newton, x);
  stage::benchmarks::time_refactor_solve(state, system, x);
}

void Sizes(benchmark::internal::Benchmark* b) {
  for (int kind : {0, 1}) {
    for (int n : {10, 100, 500, 2000}) b->Args({kind, n, 0});
  }
}

// The default relative tolerance (1e-4) against 1e-5 and 1e-6.
void Tolerances(benchmark::internal::Benchmark* b) {
  for (int kind : {0, 1}) {
    for (int k : {4, 5, 6}) b->Args({kind, 500, k});
  }
}

BENCHMARK(BM_BiasFromZero)->Apply(Sizes)->Unit(benchmark::kMicrosecond);
BENCHMARK(BM_BiasFromZero)->Apply(Tolerances)->Unit(benchmark::kMicrosecond);
BENCHMARK(BM_DeviceEvaluation)->Apply(Sizes)->Unit(benchmark::kMicrosecond);
BENCHMARK(BM_RefactorSolve)->Apply(Sizes)->Unit(benchmark::kMicrosecond);

}  // namespace

BENCHMARK_MAIN();
