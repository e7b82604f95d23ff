// The first point of a transient: the operating point (start = bias) or the
// zero state with the elements' initial values (start = zero), made
// consistent with the circuit's algebraic equations.
#pragma once

#include <vector>

#include "analysis/newton.hpp"
#include "stage/analyses.hpp"

namespace stage::analysis {

struct StartPoint {
  std::vector<double> x, q, qdot;  // n + 1 entries each, at t = 0
  int newton_iterations = 0;
};

// `duration` is the transient's length: the consistency step of a zero
// start is a tiny fraction of it. `bias_point`, when given, is the operating
// point already solved, which a bias start takes as it is. Throws
// NumericalError if no point is found.
StartPoint start_transient(NewtonSolver& newton, TransientStart start, double duration,
                           const std::vector<double>* bias_point = nullptr);

}  // namespace stage::analysis
