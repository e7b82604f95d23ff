// Writing a 100,000-sample transient (two signals, a sine and its
// derivative, built by hand) as CSV, as the HTML report's chart
// specification (decimated for display, min/max per bucket) and as the whole
// HTML page (bundles read and embedded); only the writing is timed. The
// page should cost at most a few times the CSV.
#include <benchmark/benchmark.h>

#include <cmath>
#include <filesystem>
#include <numbers>
#include <sstream>

#include "report/charts.hpp"
#include "report/transient_report.hpp"
#include "stage/report.hpp"

namespace {

constexpr std::size_t kSamples = 100000;

const stage::RunResult& long_transient() {
  static const stage::RunResult run = [] {
    stage::TransientResult t;
    stage::TransientSignal out{"out", {}, {}, {}}, slope{"in", {}, {}, {}};
    for (std::size_t k = 0; k < kSamples; ++k) {
      const double time = 1e-6 * static_cast<double>(k);
      t.time.push_back(time);
      out.values.push_back(std::sin(2 * std::numbers::pi * 1e3 * time));
      slope.values.push_back(std::cos(2 * std::numbers::pi * 1e3 * time));
    }
    t.signals = {out, slope};
    stage::RunResult r;
    r.analyses.emplace_back(std::move(t));
    return r;
  }();
  return run;
}

void BM_TransientCsv(benchmark::State& state) {
  const auto& t = std::get<stage::TransientResult>(long_transient().analyses.front());
  for (auto _ : state) {
    std::ostringstream out;
    stage::report::write_csv(out, t);
    benchmark::DoNotOptimize(out.str().size());
  }
}
BENCHMARK(BM_TransientCsv)->Unit(benchmark::kMillisecond);

void BM_TransientChartSpecification(benchmark::State& state) {
  const auto& t = std::get<stage::TransientResult>(long_transient().analyses.front());
  for (auto _ : state) {
    benchmark::DoNotOptimize(stage::report::charts_of(t, "1_transient").front().spec.dump().size());
  }
}
BENCHMARK(BM_TransientChartSpecification)->Unit(benchmark::kMillisecond);

void BM_TransientHtmlReport(benchmark::State& state) {
  const auto page = std::filesystem::temp_directory_path() / "stage_report_benchmark.html";
  for (auto _ : state) stage::write_html_report(page, long_transient());
}
BENCHMARK(BM_TransientHtmlReport)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
