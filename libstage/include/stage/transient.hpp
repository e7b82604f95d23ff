// Time response (`analyze transient(...)`): the result, the function that
// runs it, and resampling onto a uniform grid.
//
//   stage::TransientOptions options;
//   options.stop = 5e-3;
//   const auto result = stage::run_transient(circuit, options);
//   const auto& out = result.signal("out");  // one value per result.time
//
// Charges are integrated by TR-BDF2 (the default), the trapezoidal rule or
// BDF2 (SolverOptions::integration), with backward Euler on the first step
// and after every waveform corner; the step follows the local truncation
// error. A trapezoidal step that rings (see damped_steps) is redone as a
// TR-BDF2 step.
#pragma once

#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/circuit.hpp"
#include "stage/ratings.hpp"
#include "stage/solver.hpp"

namespace stage {

struct TransientSignal {
  std::string name;            // "out", "(p, n)" or "r1.current", as in the language
  std::vector<double> values;  // one per entry of TransientResult::time
  // Time derivatives at each sample from the polynomial of the step that
  // arrives there (slope_in) and of the step that leaves it (slope_out):
  // they differ at a waveform's corners. Empty in a result built by hand,
  // which is then interpolated linearly.
  std::vector<double> slope_in, slope_out;
};

struct TransientResult {
  std::vector<double> time;  // s, ascending, from options.from to options.stop
  std::vector<TransientSignal> signals;
  Integration integration = Integration::tr_bdf2;
  int accepted_steps = 0;
  int rejected_steps = 0;  // redone smaller: error too large or Newton failed
  // Trapezoidal steps found ringing (successive changes of a charge, or
  // of its rate of change, alternating in sign without decaying, above the
  // error tolerance) and redone as TR-BDF2 steps of the same length.
  int damped_steps = 0;
  int newton_iterations = 0;
  int factorizations = 0;  // numeric LU factorisations, the operating point included
  // Maximum ratings exceeded (devices whose models carry ratings).
  std::vector<RatingViolation> rating_violations;

  // Values of a signal by name; throws std::out_of_range.
  const std::vector<double>& signal(const std::string& name) const;
};

// Throws NumericalError (naming the time and the nodes) when the step falls
// below its minimum, and an invalid_request Error for a bad request (stop not
// after from, an unknown signal).
TransientResult run_transient(const Circuit& circuit, const TransientOptions& options,
                              const SolverOptions& solver = {});

// The same signals on a uniform grid from result.time.front() in steps of
// `step` (the last point at or before result.time.back()), by interpolate().
TransientResult resample(const TransientResult& result, double step);

// The value of a signal of `result` at time t: the cubic Hermite on the step
// that holds t, through the values and slopes at its two ends. Each step's
// slopes come from that step's own polynomial (the quadratic through TR-BDF2's
// inner stage, or through the point before for the multistep formulas, the
// line after a corner), so the interpolant never reaches across a corner and
// is as accurate as the integration. Outside the samples, the end value.
double interpolate(const TransientResult& result, const TransientSignal& signal, double t);

}  // namespace stage
