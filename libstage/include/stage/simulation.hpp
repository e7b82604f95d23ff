// A prepared simulation: a circuit turned once into its devices, its sparse
// pattern and the symbolic factorisation of its Jacobian, then run as often
// as needed with values changed in between, never the structure.
//
//   stage::Simulation sim(circuit);   // or sim(circuit, solver_options)
//   stage::BiasResult op = sim.bias();
//   stage::FrequencyResult h = sim.frequency(frequency_options);
//   sim.set_value("rl", 16.0);          // a resistor, capacitor, inductor or source DC value
//   stage::BiasResult op16 = sim.bias();  // starts from the last bias point
//
// Each one-shot function (run_bias, run_sweep, run_frequency, run_transient)
// is a Simulation built for one call, with the SolverOptions it is given. A design tool that calls
// the library in a loop keeps one Simulation and pays the setup once.
#pragma once

#include <memory>
#include <optional>
#include <string>

#include "stage/bias.hpp"
#include "stage/circuit.hpp"
#include "stage/frequency.hpp"
#include "stage/progress.hpp"
#include "stage/solver.hpp"
#include "stage/transient.hpp"

namespace stage {

// What a simulation has done so far: the setup it avoided shows here.
struct SimulationCounters {
  int systems_built = 0;     // MNA systems assembled (one per Simulation)
  int cold_bias_solves = 0;  // bias points solved from zero, without a previous one
  int warm_bias_solves = 0;  // bias points solved from the previous one
  int bias_reused = 0;       // bias points returned unchanged (nothing changed since)
};

class Simulation {
 public:
  // Builds the devices and the pattern and checks the circuit's graph;
  // throws NumericalError for a graph with no unique DC solution and
  // an invalid_request Error for a circuit or solver settings that fail
  // validation (stage/validate.hpp). Every analysis run on it is solved with
  // `solver`.
  explicit Simulation(const Circuit& circuit, const SolverOptions& solver = {});
  ~Simulation();
  Simulation(Simulation&&) noexcept;
  Simulation& operator=(Simulation&&) noexcept;

  // The circuit as it stands now, with every set_value applied.
  const Circuit& circuit() const;
  const SolverOptions& solver() const;

  // The DC operating point. Solved from the previous bias point when there
  // is one (the same solution to Newton's tolerances, found in fewer
  // iterations); returned unchanged when nothing has changed since.
  BiasResult bias();
  SweepResult sweep(const SweepOptions& options, const ProgressCallback& progress = {});
  FrequencyResult frequency(const FrequencyOptions& options);
  TransientResult transient(const TransientOptions& options);

  // Changes the value of a resistor, capacitor or inductor, or the DC value
  // of an independent source. Throws an invalid_request Error for an unknown
  // element, an element with no such value, or a value it cannot take (not
  // finite; not positive for R, C and L).
  void set_value(const std::string& element, double value);
  // Replaces an independent source's waveform (nothing: DC only). Its DC
  // value, and so the bias point, stay as they are.
  void set_waveform(const std::string& source, const std::optional<Waveform>& wave);
  void set_temperature(double kelvin);
  // Takes every element value of `other` when it is this circuit with only
  // such values changed (the same elements, nodes, models and waveforms, as
  // a `let` parameter of element values gives) and returns true; otherwise
  // changes nothing and returns false (build a new Simulation). The solver
  // settings stay this simulation's: a circuit carries none.
  bool take_values_from(const Circuit& other);

  SimulationCounters counters() const;

 private:
  friend struct SimulationAccess;  // the analyses built on a simulation (internal)
  struct State;
  std::unique_ptr<State> state_;
};

}  // namespace stage
