// A whole run as the command does it, in one process: read the generated
// RC ladder's text (benchmarks/ladder_text.hpp), solve its bias point and
// print the tables (or the JSON document), at 10k, 100k and 1M sections.
// Counters: sections and the time per section, so that growth faster than
// the work shows as a rising per-section figure; and the transient runs a
// headroom search of the follower example takes.
#include <benchmark/benchmark.h>

#include <sstream>

#include "ladder_text.hpp"
#include "stage/headroom.hpp"
#include "stage/reader.hpp"
#include "stage/report.hpp"
#include "stage/run.hpp"

namespace {

// range(0): sections; range(1): 0 tables, 1 JSON.
void BM_WholeRun(benchmark::State& state) {
  const int sections = static_cast<int>(state.range(0));
  const std::string text = stage::benchmarks::rc_ladder_text(sections);
  std::size_t written = 0;
  for (auto _ : state) {
    const stage::Deck deck = stage::read_text(text, "ladder.stage");
    const stage::RunResult result = stage::run_deck(deck);
    if (state.range(1) == 0) {
      std::ostringstream out;
      stage::print_report(out, result);
      written = out.str().size();
    } else {
      written = stage::json_document(result).size();
    }
    benchmark::DoNotOptimize(written);
  }
  state.counters["sections"] = sections;
  state.counters["bytes_written"] = static_cast<double>(written);
  state.counters["time_per_section"] = benchmark::Counter(
      sections, benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}

// The follower example's headroom search: transient runs per search.
void BM_HeadroomFollowerExample(benchmark::State& state) {
  const stage::Deck deck =
      stage::read_file(std::string(STAGE_SOURCE_DIR) + "/apps/examples/follower_32ohm.stage");
  const stage::HeadroomOptions* options = nullptr;
  for (const auto& statement : deck.analyses) {
    if (const auto* h = std::get_if<stage::HeadroomOptions>(&statement.options)) options = h;
  }
  int runs = 0;
  for (auto _ : state)
    runs = stage::run_headroom(deck.circuit, *options, deck.solver).transient_runs;
  state.counters["transient_runs"] = runs;
}

BENCHMARK(BM_WholeRun)
    ->Args({10'000, 0})
    ->Args({10'000, 1})
    ->Args({100'000, 0})
    ->Args({100'000, 1})
    ->Args({1'000'000, 0})
    ->Iterations(1)
    ->Unit(benchmark::kSecond);
BENCHMARK(BM_HeadroomFollowerExample)->Iterations(1)->Unit(benchmark::kSecond);

}  // namespace

BENCHMARK_MAIN();
