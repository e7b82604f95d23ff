// Reading a large circuit: stage::read_text of the generated RC ladder
// (benchmarks/ladder_text.hpp, three elements a section) at 10k, 100k and 1M
// sections, in-process, the text already in memory. Counters:
//   elements_per_second  elements read per second of wall time;
//   bytes_per_element    the peak of heap bytes in use while reading (the
//                        deck included, the ladder text not) over the element
//                        count. Heap bytes are counted by this program's own
//                        operator new/delete, at malloc_usable_size, so they
//                        are what the allocator hands out, not page-level RSS.
// And the grammar's share: the statements of the 100k ladder parsed alone
// (reading parses each statement once, as it is elaborated).
#include <benchmark/benchmark.h>
#include <malloc.h>

#include <algorithm>
#include <atomic>
#include <cstdlib>
#include <new>

#include "ladder_text.hpp"
#include "reader/grammar.hpp"
#include "stage/reader.hpp"

namespace {

std::atomic<long long> live_bytes{0};
std::atomic<long long> peak_bytes{0};

void* counted_allocation(std::size_t size) {
  void* p = std::malloc(size == 0 ? 1 : size);
  if (p == nullptr) throw std::bad_alloc();
  const long long now = live_bytes += static_cast<long long>(malloc_usable_size(p));
  long long peak = peak_bytes.load();
  while (now > peak && !peak_bytes.compare_exchange_weak(peak, now)) {
  }
  return p;
}

void counted_free(void* p) {
  if (p == nullptr) return;
  live_bytes -= static_cast<long long>(malloc_usable_size(p));
  std::free(p);
}

void BM_ReadLadder(benchmark::State& state) {
  const int sections = static_cast<int>(state.range(0));
  const std::string text = stage::benchmarks::rc_ladder_text(sections);
  std::size_t elements = 0;
  long long peak_growth = 0;
  for (auto _ : state) {
    const long long before = live_bytes.load();
    peak_bytes = before;
    {
      const stage::Deck deck = stage::read_text(text, "ladder.stage");
      elements = deck.circuit.elements().size();
      benchmark::DoNotOptimize(elements);
    }
    peak_growth = std::max(peak_growth, peak_bytes.load() - before);
  }
  state.counters["elements_per_second"] = benchmark::Counter(
      static_cast<double>(elements), benchmark::Counter::kIsIterationInvariantRate);
  state.counters["bytes_per_element"] =
      static_cast<double>(peak_growth) / static_cast<double>(elements);
  state.counters["elements"] = static_cast<double>(elements);
}

BENCHMARK(BM_ReadLadder)
    ->Arg(10'000)
    ->Arg(100'000)
    ->Arg(1'000'000)
    ->Unit(benchmark::kMillisecond)
    ->MeasureProcessCPUTime()
    ->UseRealTime();

void BM_ParseLadder(benchmark::State& state) {
  const std::string text = stage::benchmarks::rc_ladder_text(static_cast<int>(state.range(0)));
  const stage::reader::SourceText source("ladder.stage", text);
  std::size_t statements = 0;
  for (auto _ : state) {
    stage::reader::StatementStream stream(source);
    statements = 0;
    while (stream.next()) ++statements;
  }
  state.counters["statements_per_second"] = benchmark::Counter(
      static_cast<double>(statements), benchmark::Counter::kIsIterationInvariantRate);
}

BENCHMARK(BM_ParseLadder)->Arg(100'000)->Unit(benchmark::kMillisecond);

}  // namespace

void* operator new(std::size_t size) { return counted_allocation(size); }
void* operator new[](std::size_t size) { return counted_allocation(size); }
void operator delete(void* p) noexcept { counted_free(p); }
void operator delete[](void* p) noexcept { counted_free(p); }
void operator delete(void* p, std::size_t) noexcept { counted_free(p); }
void operator delete[](void* p, std::size_t) noexcept { counted_free(p); }

BENCHMARK_MAIN();
