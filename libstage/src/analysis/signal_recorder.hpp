// Reads the signals a transient keeps out of each accepted solution: node
// voltages, node-pair voltages and elements' reported currents.
#pragma once

#include <vector>

#include "mna/system.hpp"
#include "stage/signal.hpp"
#include "stage/transient.hpp"

namespace stage::analysis {

class SignalRecorder {
 public:
  // `wanted` empty: every circuit node voltage and every reported current.
  // Throws std::invalid_argument for a node or element that does not exist.
  SignalRecorder(const mna::System& system, const std::vector<SignalRef>& wanted,
                 TransientResult& result);

  // Appends time t and the value of every signal at solution x.
  void record(double t, const std::vector<double>& x);

 private:
  // A voltage x[p] - x[n], or a device's reported current.
  struct Probe {
    mna::Index p = mna::kGroundIndex, n = mna::kGroundIndex;
    const mna::Device* device = nullptr;
  };
  void add_current(const mna::Device& device, const std::string& name);
  void add_every_current(const mna::Device& device);

  const mna::System& system_;
  TransientResult& result_;
  std::vector<Probe> probes_;
  std::vector<double> zero_;
};

}  // namespace stage::analysis
