// The absolute tolerances of every unknown and of its row, chosen by the
// unknown's kind (mna::UnknownKind) from the solver settings. Computed once
// per solver, so that Newton's convergence tests and the transient's error
// norm only index them in their loops.
#pragma once

#include <vector>

#include "mna/topology.hpp"
#include "stage/solver.hpp"

namespace stage::analysis {

// How far an unknown of this kind may still move when Newton stops (V, A or
// K); times a row's capacitance, inductance or heat capacity, the floor of a
// transient step's charge error there.
double unknown_tolerance(mna::UnknownKind kind, const SolverOptions& options);
// What may remain of the residual of the row of an unknown of this kind:
// currents at a node (A), a branch equation's voltage (V), heat flows (W).
double residual_tolerance(mna::UnknownKind kind, const SolverOptions& options);

struct AbsoluteTolerances {
  std::vector<double> unknown;   // n + 1 (entry 0, ground, unused)
  std::vector<double> residual;  // n + 1
};

AbsoluteTolerances absolute_tolerances(const mna::Topology& topology, const SolverOptions& options);

}  // namespace stage::analysis
