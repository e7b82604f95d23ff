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
  // Devices far outside the range their models describe (the result stands).
  std::vector<std::string> warnings;
};

// Solves f(x) = 0 from the guess in x (n + 1 entries): plain Newton, then
// conductance stepping, then source stepping, and checks the solution (every
// value finite, KCL met at every node, every junction where its model holds).
// Throws NumericalError when all three fail, naming the unknown that ran
// away and the elements at it, or when the solution fails its check, naming
// the node or device.
OperatingPoint solve_operating_point(NewtonSolver& newton, std::vector<double>& x);

// The check above on its own: throws NumericalError when x is not a DC
// solution of the models, returns warnings for devices far outside their
// models' characterised range.
std::vector<std::string> verify_operating_point(const mna::System& system,
                                                const SolverOptions& options,
                                                const std::vector<double>& x);

// The bias report of solution x: node voltages, currents, device figures,
// supply powers and the KCL residual.
BiasResult describe_operating_point(const mna::System& system, const std::vector<double>& x,
                                    const OperatingPoint& how);

}  // namespace stage::analysis
