// What the analyses built on a prepared simulation (the headroom search and
// the stage report) use of it beyond the public interface: its system, its
// bias point as a vector of unknowns, and transients watched step by step.
#pragma once

#include <vector>

#include "analysis/transient.hpp"
#include "mna/system.hpp"
#include "stage/simulation.hpp"

namespace stage {

struct SimulationAccess {
  static const mna::System& system(const Simulation& simulation);
  // The operating point's unknowns (n + 1 entries), solved first if needed.
  static const std::vector<double>& bias_point(Simulation& simulation);
  // A transient on the simulation's solver; a bias start takes its
  // operating point as solved, unless `from` gives another state to start
  // at (a run continued). `landings` as in analysis::integrate.
  static TransientResult transient(Simulation& simulation, const TransientOptions& options,
                                   const analysis::StepObserver& observer,
                                   const std::vector<double>& landings = {},
                                   const std::vector<double>* from = nullptr);
};

}  // namespace stage
