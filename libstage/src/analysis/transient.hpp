// The transient integrator on an MNA system, for run_transient and for tests
// and benchmarks that build a system with their own devices.
#pragma once

#include <functional>
#include <vector>

#include "analysis/newton.hpp"
#include "mna/system.hpp"
#include "stage/transient.hpp"

namespace stage::analysis {

// Called with the time and every unknown (n + 1 entries) at the start and
// after each accepted step from options.from on, for analyses that need
// more than the recorded signals (the device states at a waveform's peak).
using StepObserver = std::function<void(double time, const std::vector<double>& x)>;

// A run on a Newton solver of its own (tests and benchmarks).
// `landings`: times a step lands on exactly, as on a waveform's corner but
// without restarting the formula there (the start of a window an observer
// integrates over, so that no step straddles it).
TransientResult integrate(const mna::System& system, const SolverOptions& solver,
                          const TransientOptions& options, const StepObserver& observer = {},
                          const std::vector<double>& landings = {});

// A run on a prepared simulation's solver, whose factorisation's symbolic
// analysis it keeps. `bias_point` (n + 1 entries), when given, is the
// system's operating point: a bias start takes it instead of solving again.
TransientResult integrate(NewtonSolver& newton, const TransientOptions& options,
                          const StepObserver& observer = {},
                          const std::vector<double>* bias_point = nullptr,
                          const std::vector<double>& landings = {});

}  // namespace stage::analysis
