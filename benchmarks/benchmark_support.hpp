// Pieces the benchmark programs share: a generic transistor model for
// generated circuits, and the timing of one KLU refactor+solve of a system's
// matrix, the floor every analysis step is compared with.
#pragma once

#include <benchmark/benchmark.h>

#include <algorithm>
#include <vector>

#include "mna/sparse_lu.hpp"
#include "mna/system.hpp"

namespace stage::benchmarks {

// Generic textbook-typical small-signal npn values (not any real part).
inline BipolarModel generic_npn() {
  BipolarModel m;
  m.saturation_current = 1e-15;
  m.beta_forward = 150;
  m.early_voltage_forward = 80;
  m.base_resistance = 50;
  m.be_capacitance = 10e-12;
  m.bc_capacitance = 4e-12;
  m.forward_transit_time = 0.4e-9;
  return m;
}

// Times KLU refactor and solve of G at x (the Jacobian an iteration there
// would factor) with the residual as right-hand side.
inline void time_refactor_solve(benchmark::State& state, const mna::System& system,
                                const std::vector<double>& x) {
  auto w = system.make_workspace();
  system.evaluate(system.request(x.data()), w);
  mna::SparseLu<double> lu(system.pattern());
  lu.factor(w.g.data());
  std::vector<double> rhs(w.f.begin() + 1, w.f.end());
  for (auto _ : state) {
    lu.factor(w.g.data());
    std::copy(w.f.begin() + 1, w.f.end(), rhs.begin());
    lu.solve(rhs.data());
    benchmark::DoNotOptimize(rhs.data());
  }
  state.counters["unknowns"] = system.size();
}

}  // namespace stage::benchmarks
