// Frequency analysis of a generated circuit of up to 1,000 transistors: a
// chain of capacitor-coupled emitter followers, each biased by its own base
// divider, swept over 200 frequencies. Compares the time per frequency point
// of the whole analysis (bias point and corner refinement included, spread
// over the points) with one complex KLU refactor+solve of the same G + jwC,
// the floor a sweep point cannot go below.
#include <benchmark/benchmark.h>

#include <cmath>

#include "analysis/operating_point.hpp"
#include "analysis/small_signal.hpp"
#include "benchmark_support.hpp"
#include "simulation/assemble.hpp"
#include "stage/frequency.hpp"

namespace {

constexpr int kPoints = 200;

stage::Circuit coupled_followers(int transistors) {
  stage::Circuit c;
  c.add_model("npn", stage::benchmarks::generic_npn());
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", 15.0});
  c.add("vin", stage::VoltageSource{"src", "gnd", 0.0, 1.0});
  c.add("rs", stage::Resistor{"src", "e0", 600});
  for (int k = 1; k <= transistors; ++k) {
    const std::string s = std::to_string(k), base = "b" + s, emitter = "e" + s;
    c.add("cc" + s, stage::Capacitor{"e" + std::to_string(k - 1), base, 1e-6});
    c.add("rb1_" + s, stage::Resistor{"vcc", base, 47e3});
    c.add("rb2_" + s, stage::Resistor{base, "gnd", 47e3});
    c.add("q" + s, stage::Bipolar{stage::Polarity::npn, "vcc", base, emitter, {}, "npn"});
    c.add("re" + s, stage::Resistor{emitter, "gnd", 4.7e3});
  }
  return c;
}

stage::FrequencyOptions sweep_options(int transistors) {
  stage::FrequencyOptions o;
  o.from = 1;
  o.per_decade = 20;
  o.to = std::pow(10.0, (kPoints - 1) / 20.0);  // exactly kPoints grid points
  o.input = "vin";
  o.output = stage::SignalRef::node("e" + std::to_string(transistors));
  return o;
}

void BM_FrequencyAnalysis(benchmark::State& state) {
  const int transistors = static_cast<int>(state.range(0));
  const auto circuit = coupled_followers(transistors);
  const auto options = sweep_options(transistors);
  std::size_t points = 0;
  for (auto _ : state) {
    const auto result = stage::run_frequency(circuit, options);
    points = result.frequencies.size();
    benchmark::DoNotOptimize(result.response.data());
  }
  state.counters["points"] = static_cast<double>(points);
  state.counters["time_per_point"] = benchmark::Counter(
      static_cast<double>(points),
      benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}

// The bias point alone, to separate it from the sweep's own cost.
void BM_BiasOnly(benchmark::State& state) {
  const auto circuit = coupled_followers(static_cast<int>(state.range(0)));
  for (auto _ : state) benchmark::DoNotOptimize(stage::run_bias(circuit).converged);
}

// One complex refactorisation and one solve of the same G + jwC at 1 kHz.
void BM_ComplexFactorSolve(benchmark::State& state) {
  const auto circuit = coupled_followers(static_cast<int>(state.range(0)));
  stage::mna::System system = stage::assemble(circuit);
  stage::analysis::NewtonSolver newton(system, stage::SolverOptions{});
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  stage::analysis::solve_operating_point(newton, x);
  stage::analysis::SmallSignalSystem linear(system, x);
  auto b = linear.make_vector();
  linear.factor(2 * M_PI * 1e3);  // the first, full factorisation
  for (auto _ : state) {
    linear.factor(2 * M_PI * 1e3);
    b.assign(b.size(), 0.0);
    b[1] = 1.0;
    linear.solve(b);
    benchmark::DoNotOptimize(b.data());
  }
  state.counters["unknowns"] = system.size();
  state.counters["nonzeros"] = system.pattern().nnz();
}

BENCHMARK(BM_FrequencyAnalysis)->Arg(10)->Arg(100)->Arg(1000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_BiasOnly)->Arg(10)->Arg(100)->Arg(1000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_ComplexFactorSolve)->Arg(10)->Arg(100)->Arg(1000)->Unit(benchmark::kMicrosecond);

}  // namespace

BENCHMARK_MAIN();
