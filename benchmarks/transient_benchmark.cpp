// Transient speed: a 10,000-node RC ladder (linear), 100 emitter followers
// (nonlinear) over several periods of a sine, and issue 10's chain of twenty
// charge-storing capacitor-coupled followers under each integration method. Counters: steps per
// second, Newton iterations and factorisations per step; the KLU benchmarks
// beside them time one solve (and one refactorisation plus solve) of the
// same matrix G + a C, the floor a step's cost is measured against.
#include <benchmark/benchmark.h>

#include <cmath>
#include <string>

#include "analysis/follower_chain.hpp"
#include "analysis/newton.hpp"
#include "analysis/transient.hpp"
#include "simulation/assemble.hpp"

namespace {

constexpr double kFrequency = 1e3;

stage::Circuit rc_ladder(int nodes) {
  stage::Circuit c;
  c.add("vin", stage::VoltageSource{"n0", "gnd", 0.0, 0.0, 0.0, stage::SineWave{1.0, kFrequency}});
  for (int k = 1; k <= nodes; ++k) {
    const std::string here = "n" + std::to_string(k), before = "n" + std::to_string(k - 1);
    c.add("r" + std::to_string(k), stage::Resistor{before, here, 1.0});
    c.add("c" + std::to_string(k), stage::Capacitor{here, "gnd", 1e-9});
  }
  return c;
}

stage::Circuit follower_array(int stages) {
  stage::Circuit c;
  c.add_model("small_npn", stage::BipolarModel{});
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
  c.add("vin",
        stage::VoltageSource{"in", "gnd", 6.0, 0.0, 0.0, stage::SineWave{4.0, kFrequency, 6.0}});
  for (int k = 0; k < stages; ++k) {
    const std::string s = std::to_string(k);
    c.add("rb" + s, stage::Resistor{"in", "b" + s, 1e3});
    c.add("q" + s, stage::Bipolar{stage::Polarity::npn, "vcc", "b" + s, "e" + s, {}, "small_npn"});
    c.add("re" + s, stage::Resistor{"e" + s, "gnd", 1e3});
    c.add("ce" + s, stage::Capacitor{"e" + s, "gnd", 100e-9});
  }
  return c;
}

void run(benchmark::State& state, const stage::Circuit& circuit, const std::string& probe,
         double periods = 5, double steps_per_period = 100,
         const stage::SolverOptions& solver = {}) {
  const stage::mna::System system = stage::assemble(circuit);
  stage::TransientOptions options;
  options.stop = periods / kFrequency;
  options.max_step = 1 / kFrequency / steps_per_period;
  options.signals = {stage::SignalRef::node(probe)};
  stage::TransientResult last;
  for (auto _ : state) last = stage::analysis::integrate(system, solver, options);
  const double steps = last.accepted_steps + last.rejected_steps;
  state.counters["steps"] = steps;
  state.counters["steps_per_s"] = benchmark::Counter(
      steps * static_cast<double>(state.iterations()), benchmark::Counter::kIsRate);
  state.counters["newton_per_step"] = last.newton_iterations / steps;
  state.counters["factorizations"] = last.factorizations;
  state.counters["factorizations_per_step"] = last.factorizations / steps;
  state.counters["time_per_step"] =
      benchmark::Counter(steps * static_cast<double>(state.iterations()),
                         benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
}

void BM_TransientRcLadder(benchmark::State& state) { run(state, rc_ladder(10000), "n10000"); }
// At 2000 steps a period the error test never limits the step: after the
// first steps grow to max_step the factorisation count stays put.
void BM_TransientRcLadderConstantStep(benchmark::State& state) {
  run(state, rc_ladder(10000), "n10000", 5, 2000);
}
void BM_TransientFollowers(benchmark::State& state) { run(state, follower_array(100), "e99"); }
// The same at a relative tolerance of 10^-k, k = 4 (the default), 5, 6: the
// cost of a tighter Newton and step-error criterion.
void BM_TransientFollowersByTolerance(benchmark::State& state) {
  stage::SolverOptions solver;
  solver.relative_tolerance = std::pow(10.0, -static_cast<double>(state.range(0)));
  run(state, follower_array(100), "e99", 5, 100, solver);
}
// The twenty-follower chain, 10 mV at 1 kHz, 2 ms at most 10 us a step (the
// run of issue 10), by integration method: 0 TR-BDF2, 1 trapezoidal rule,
// 2 BDF2.
void BM_TransientFollowerChain(benchmark::State& state) {
  stage::SolverOptions solver;
  solver.integration = static_cast<stage::Integration>(state.range(0));
  run(state, stage::testing::follower_chain(20), "out", 2, 100, solver);
}

// One solve, or refactorisation plus solve, of G + a C at the operating point
// with a = 2 / max_step (the trapezoidal rule's coefficient).
void klu(benchmark::State& state, const stage::Circuit& circuit, bool refactor) {
  const stage::mna::System system = stage::assemble(circuit);
  stage::mna::Workspace w = system.make_workspace();
  std::vector<double> x(w.f.size(), 0.0);
  system.evaluate(system.request(x.data()), w);
  const double a = 2 * kFrequency * 100;
  std::vector<double> matrix(w.g.size()), b(x.size() - 1, 1.0);
  for (std::size_t s = 0; s < matrix.size(); ++s) matrix[s] = w.g[s] + a * w.c[s];
  stage::mna::SparseLu<double> lu(system.pattern());
  lu.factor(matrix.data());
  for (auto _ : state) {
    if (refactor) lu.factor(matrix.data());
    lu.solve(b.data());
    benchmark::DoNotOptimize(b.data());
  }
}

void BM_KluSolveRcLadder(benchmark::State& state) { klu(state, rc_ladder(10000), false); }
void BM_KluRefactorSolveFollowers(benchmark::State& state) {
  klu(state, follower_array(100), true);
}

BENCHMARK(BM_TransientRcLadder)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_TransientRcLadderConstantStep)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_KluSolveRcLadder)->Unit(benchmark::kMicrosecond);
BENCHMARK(BM_TransientFollowers)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_KluRefactorSolveFollowers)->Unit(benchmark::kMicrosecond);
BENCHMARK(BM_TransientFollowersByTolerance)->DenseRange(4, 6)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_TransientFollowerChain)->DenseRange(0, 2)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
