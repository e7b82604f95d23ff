// The transient integrator on an MNA system, for run_transient and for tests
// and benchmarks that build a system with their own devices.
#pragma once

#include "mna/system.hpp"
#include "stage/transient.hpp"

namespace stage::analysis {

TransientResult integrate(const mna::System& system, const SolverOptions& solver,
                          const TransientOptions& options);

}  // namespace stage::analysis
