// Finding a DC operating point, with the fallbacks that make cold starts of
// transistor stages converge, and turning a solution into a BiasResult.
#pragma once

#include <vector>

#include "analysis/newton.hpp"
#include "stage/bias.hpp"

namespace stage::analysis {

struct OperatingPoint {
  int newton_iterations = 0;
  BiasMethod method = BiasMethod::newton;
  double reciprocal_condition = 0;  // of the last Jacobian factored
};

// Solves f(x) = 0 from the guess in x (n + 1 entries): plain Newton, then
// conductance stepping, then source stepping. Throws NumericalError naming
// the unknowns that did not settle when all three fail.
OperatingPoint solve_operating_point(NewtonSolver& newton, std::vector<double>& x);

// The bias report of solution x: node voltages, currents, device figures,
// supply powers and the KCL residual.
BiasResult describe_operating_point(const mna::System& system, const std::vector<double>& x,
                                    const OperatingPoint& how);

}  // namespace stage::analysis
