// Writing the reports of a bias point of a generated RC ladder (10k and 100k
// sections, a node each): the JSON document, the tables and the CSV. Only
// the writing is timed. The counter time_per_node (CPU time per iteration
// over the nodes, shown in ns) stays flat as the ladder grows when the
// writing is linear in its size.
#include <benchmark/benchmark.h>

#include <cstddef>
#include <map>
#include <ostream>
#include <streambuf>
#include <string>
#include <variant>

#include "ladder_text.hpp"
#include "report/bias_report.hpp"
#include "stage/reader.hpp"
#include "stage/report.hpp"
#include "stage/run.hpp"

namespace {

// The run of a ladder's bias point, read and run once per size for all
// benchmarks.
const stage::RunResult& ladder_run(int sections) {
  static std::map<int, stage::RunResult> runs;
  auto [it, added] = runs.try_emplace(sections);
  if (added) {
    it->second =
        stage::run_deck(stage::read_text(stage::benchmarks::rc_ladder_text(sections), "ladder"));
  }
  return it->second;
}

// A stream that counts what is written and keeps none of it, so the table
// and the CSV are timed without growing a buffer.
class CountingBuffer : public std::streambuf {
 public:
  std::size_t written() const { return written_; }

 protected:
  std::streamsize xsputn(const char*, std::streamsize n) override {
    written_ += static_cast<std::size_t>(n);
    return n;
  }
  int_type overflow(int_type c) override {
    ++written_;
    return traits_type::not_eof(c);
  }

 private:
  std::size_t written_ = 0;
};

const stage::BiasResult& bias_of(const stage::RunResult& run) {
  return std::get<stage::BiasResult>(run.analyses.front());
}

// The CPU time per iteration divided by the nodes (an inverted rate, which
// Google Benchmark shows with its time prefix: "650ns").
void count_per_node(benchmark::State& state, const stage::RunResult& run, std::size_t bytes) {
  const auto nodes = static_cast<double>(bias_of(run).node_voltages.size());
  state.counters["nodes"] = nodes;
  state.counters["time_per_node"] = benchmark::Counter(
      nodes, benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
  state.counters["bytes"] = static_cast<double>(bytes);
}

void BM_Json(benchmark::State& state) {
  const auto& run = ladder_run(static_cast<int>(state.range(0)));
  std::size_t bytes = 0;
  for (auto _ : state) {
    const std::string document = stage::json_document(run);
    bytes = document.size();
    benchmark::DoNotOptimize(document.data());
  }
  count_per_node(state, run, bytes);
}

void BM_Table(benchmark::State& state) {
  const auto& run = ladder_run(static_cast<int>(state.range(0)));
  CountingBuffer buffer;
  std::ostream out(&buffer);
  for (auto _ : state) stage::print_report(out, run);
  count_per_node(state, run, buffer.written() / state.iterations());
}

// The CSV file's text of the bias point (write_csv_files writes this to a file).
void BM_Csv(benchmark::State& state) {
  const auto& run = ladder_run(static_cast<int>(state.range(0)));
  const auto& bias = bias_of(run);
  CountingBuffer buffer;
  std::ostream out(&buffer);
  for (auto _ : state) stage::report::write_csv(out, bias);
  count_per_node(state, run, buffer.written() / state.iterations());
}

}  // namespace

BENCHMARK(BM_Json)->Arg(10'000)->Arg(100'000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_Table)->Arg(10'000)->Arg(100'000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_Csv)->Arg(10'000)->Arg(100'000)->Unit(benchmark::kMillisecond);

BENCHMARK_MAIN();
