// What a prepared simulation saves a caller that runs the same circuit again
// and again (a design tool in a loop, a sweep, a tolerance run): a bias point
// and a short transient through one stage::Simulation, against the one-shot
// functions that build the system, the factorisation's symbolic analysis and
// the bias point afresh each call. On the two example output stages.
#include <benchmark/benchmark.h>

#include <string>

#include "stage/reader.hpp"
#include "stage/simulation.hpp"

namespace {

stage::Circuit example(const std::string& name) {
  return stage::read_file(std::string(STAGE_SOURCE_DIR) + "/apps/examples/" + name).circuit;
}

// One millisecond (one period of the examples' 1 kHz drive) from the bias point.
stage::TransientOptions one_period() {
  stage::TransientOptions o;
  o.stop = 1e-3;
  o.max_step = 5e-6;
  o.signals = {stage::SignalRef::node("out")};
  return o;
}

// The supply moves by 1 mV between runs, so each bias point is solved
// again (from the last one), not returned unchanged.
void BM_BiasPrepared(benchmark::State& state, const std::string& name) {
  stage::Simulation simulation(example(name));
  double supply = 12.0;
  for (auto _ : state) {
    supply = supply == 12.0 ? 12.001 : 12.0;
    simulation.set_value("vpos", supply);
    benchmark::DoNotOptimize(simulation.bias());
  }
}

void BM_BiasOneShot(benchmark::State& state, const std::string& name) {
  const stage::Circuit circuit = example(name);
  for (auto _ : state) benchmark::DoNotOptimize(stage::run_bias(circuit));
}

void BM_TransientPrepared(benchmark::State& state, const std::string& name) {
  stage::Simulation simulation(example(name));
  for (auto _ : state) benchmark::DoNotOptimize(simulation.transient(one_period()));
}

void BM_TransientOneShot(benchmark::State& state, const std::string& name) {
  const stage::Circuit circuit = example(name);
  for (auto _ : state) benchmark::DoNotOptimize(stage::run_transient(circuit, one_period()));
}

BENCHMARK_CAPTURE(BM_BiasPrepared, follower, std::string("follower_32ohm.stage"));
BENCHMARK_CAPTURE(BM_BiasOneShot, follower, std::string("follower_32ohm.stage"));
BENCHMARK_CAPTURE(BM_BiasPrepared, push_pull, std::string("push_pull_class_ab.stage"));
BENCHMARK_CAPTURE(BM_BiasOneShot, push_pull, std::string("push_pull_class_ab.stage"));
BENCHMARK_CAPTURE(BM_TransientPrepared, follower, std::string("follower_32ohm.stage"));
BENCHMARK_CAPTURE(BM_TransientOneShot, follower, std::string("follower_32ohm.stage"));
BENCHMARK_CAPTURE(BM_TransientPrepared, push_pull, std::string("push_pull_class_ab.stage"));
BENCHMARK_CAPTURE(BM_TransientOneShot, push_pull, std::string("push_pull_class_ab.stage"));

}  // namespace

BENCHMARK_MAIN();
