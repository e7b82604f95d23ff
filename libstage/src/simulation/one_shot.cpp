// The one-shot analyses (run_bias, run_sweep, run_frequency, run_transient):
// each a prepared simulation built for one call.
#include "stage/bias.hpp"
#include "stage/frequency.hpp"
#include "stage/simulation.hpp"
#include "stage/transient.hpp"

namespace stage {

BiasResult run_bias(const Circuit& circuit, const SolverOptions& solver) {
  return Simulation(circuit, solver).bias();
}

SweepResult run_sweep(const Circuit& circuit, const SweepOptions& options,
                      const SolverOptions& solver, const ProgressCallback& progress) {
  return Simulation(circuit, solver).sweep(options, progress);
}

FrequencyResult run_frequency(const Circuit& circuit, const FrequencyOptions& options,
                              const SolverOptions& solver) {
  return Simulation(circuit, solver).frequency(options);
}

TransientResult run_transient(const Circuit& circuit, const TransientOptions& options,
                              const SolverOptions& solver) {
  return Simulation(circuit, solver).transient(options);
}

}  // namespace stage
