// One large-signal measurement of a stage: the input source driven by a sine
// of a given amplitude around its DC value, a transient run until the
// waveform repeats, and the output's last period read for its peaks each way,
// its THD, and the circuit's full state at the two extremes (for telling what
// limits each side) and, when asked, the mean power each element took over
// that period. Shared by the headroom search and the stage report.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "stage/circuit.hpp"
#include "stage/headroom.hpp"
#include "stage/signal.hpp"
#include "stage/simulation.hpp"
#include "stage/solver.hpp"
#include "stage/spectrum.hpp"
#include "stage/transient.hpp"

namespace stage::mna {
class Device;
}  // namespace stage::mna

namespace stage::analysis {

struct Extreme {
  double time = 0;
  double value = 0;           // output there
  std::vector<double> state;  // every unknown (n + 1 entries) there
};

struct DriveMeasurement {
  double amplitude = 0;  // input sine amplitude
  // Peaks are taken from the output's average over the last period, its DC
  // level while driven: coupling capacitors drift slowly (their time
  // constants span many periods), and that drift is not clipping.
  double average = 0;
  // max(output) - average over the last period, the output read by its
  // interpolant between samples (interpolate() in stage/transient.hpp)
  double positive_peak = 0;
  double negative_peak = 0;  // average - min(output)
  double thd = 0;
  double fundamental = 0;  // output's fundamental amplitude
  Extreme maximum, minimum;
  int periods = 0;  // periods simulated
  // False when the last two periods still differ after the longest run
  // allowed (a slow coupling capacitor): the figures are then approximate,
  // and `unsettled` says by how much.
  bool settled = true;
  std::string unsettled;
  TransientResult transient;  // the recorded signals
  // The main path of the circuit's only transistor at every step of the last
  // period (its |conduction| voltage and current); empty when the circuit has
  // none or several.
  std::vector<LoadLinePoint> transistor_path;
  // Mean power each element took over the last period (positive absorbed),
  // by element name; empty unless the drive keeps an energy ledger.
  std::vector<std::pair<std::string, double>> element_power;
};

class SineDrive {
 public:
  // The request has been validated (stage/validate.hpp): `input` is an
  // independent source, `output` a node or a node pair. `record` lists extra
  // signals kept in each measurement's transient (load current and voltage,
  // for power); `energy_ledger` fills each measurement's element_power.
  // Every run is solved with `solver`.
  // A measurement simulates whole periods from the bias point, first as
  // many as the last one needed (four at first), until the last two agree
  // or `settle_periods` have run: a run that has not settled is continued
  // from where it stopped to twice its length.
  SineDrive(const Circuit& circuit, const SolverOptions& solver, std::string input,
            SignalRef output, double frequency, int settle_periods,
            std::vector<SignalRef> record = {}, bool energy_ledger = false);

  DriveMeasurement measure(double amplitude) const;
  // Measurements made: each settles the stage at one drive.
  int runs() const { return runs_; }
  // The prepared simulation every measurement runs on: its bias point is
  // solved once and starts every run; the analyses built on the drive ask
  // it for that bias point and the small-signal figures too.
  Simulation& simulation() const { return simulation_; }

 private:
  // `periods` from `start` (empty: the bias point); leaves the state at
  // the end in `end`.
  TransientResult run(double amplitude, int periods, const std::vector<double>& start,
                      DriveMeasurement& m, std::vector<double>& end) const;

  // Mutable as runs_ is: each measurement changes the input's waveform and
  // keeps what it solved, not what the drive is.
  mutable Simulation simulation_;
  std::string input_;
  SignalRef output_;
  double frequency_;
  double input_dc_ = 0;
  int settle_periods_;
  std::vector<SignalRef> record_;
  bool energy_ledger_ = false;
  const mna::Device* transistor_ = nullptr;  // the circuit's only one, if it has one
  mutable int runs_ = 0;
  mutable int periods_;  // periods the last measurement needed to settle
};

}  // namespace stage::analysis
