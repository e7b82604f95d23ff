// Time response (`analyze transient(...)`): the result, the function that
// runs it, and resampling onto a uniform grid.
//
//   stage::TransientOptions options;
//   options.stop = 5e-3;
//   const auto result = stage::run_transient(circuit, options);
//   const auto& out = result.signal("out");  // one value per result.time
//
// Charges are integrated by the trapezoidal rule or BDF2
// (circuit.solver.integration), with backward Euler on the first step and
// after every waveform corner; the step follows the local truncation error.
#pragma once

#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/circuit.hpp"

namespace stage {

struct TransientSignal {
  std::string name;            // "out", "(p, n)" or "r1.current", as in the language
  std::vector<double> values;  // one per entry of TransientResult::time
};

struct TransientResult {
  std::vector<double> time;  // s, ascending, from options.from to options.stop
  std::vector<TransientSignal> signals;
  Integration integration = Integration::trapezoidal;
  int accepted_steps = 0;
  int rejected_steps = 0;  // redone smaller: error too large or Newton failed
  int newton_iterations = 0;
  int factorizations = 0;  // numeric LU factorisations, the operating point included

  // Values of a signal by name; throws std::out_of_range.
  const std::vector<double>& signal(const std::string& name) const;
};

// Throws NumericalError (naming the time and the nodes) when the step falls
// below its minimum, and std::invalid_argument for a bad request (stop not
// after from, an unknown signal).
TransientResult run_transient(const Circuit& circuit, const TransientOptions& options);

// The same signals on a uniform grid from result.time.front() in steps of
// `step` (the last point at or before result.time.back()), interpolated by
// the quadratic through the three nearest samples: second order, like the
// integration formulas.
TransientResult resample(const TransientResult& result, double step);

// One value of a sampled signal at time t, by the same interpolation.
double interpolate(const std::vector<double>& time, const std::vector<double>& values, double t);

}  // namespace stage
