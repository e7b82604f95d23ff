// The energy each element takes over a window of a transient, read from its
// own terminal voltages and currents: sum over its terminals of v·i, the
// current being its resistive current plus the rate of change of its charge.
// By Tellegen's theorem these sum to zero over the whole circuit at every
// instant, so the stage report can check its power figures (supply, load,
// dissipation) against each other instead of taking one as the difference.
#pragma once

#include <string>
#include <vector>

#include "mna/system.hpp"
#include "stage/circuit.hpp"

namespace stage::analysis {

class EnergyLedger {
 public:
  // `system` must outlive the ledger and be built from `circuit`.
  EnergyLedger(const Circuit& circuit, const mna::System& system);

  // Forget what was taken; integrate from `from` (seconds) on. The
  // transient must land a step on `from` (integrate()'s landings), so that
  // the window is a whole number of steps and nothing is interpolated.
  void start(double from);
  // Every accepted transient step, in time order; steps before `from` are
  // ignored. Throws std::logic_error when a step straddles `from`.
  void step(double time, const std::vector<double>& x);

  // Mean power each device took over [from, last step], in the order of
  // system.devices(); positive is absorbed.
  std::vector<double> mean_power() const;

 private:
  // Resistive power of every device and the charges at its terminals, at x.
  void evaluate(double time, const double* x, std::vector<double>& power,
                std::vector<double>& charge);

  const mna::System& system_;
  // Terminal unknowns of device d: terminals_[offsets_[d] .. offsets_[d + 1]).
  std::vector<mna::Index> terminals_;
  std::vector<std::size_t> offsets_;
  mna::Workspace scratch_;
  double from_ = 0;
  double last_time_ = 0;
  bool has_last_ = false;  // a step at or after `from` has been taken
  std::vector<double> last_x_, last_power_, last_charge_;
  std::vector<double> power_, charge_;
  std::vector<double> energy_;  // per device, J since `from`
};

}  // namespace stage::analysis
