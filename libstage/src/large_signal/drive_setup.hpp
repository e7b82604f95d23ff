// Preparing a circuit for the stage analyses (headroom, characterize): the
// input source alone carries the small-signal drive, the impedance an
// element's terminals see, and the DC supplies whose power a swing draws.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "stage/circuit.hpp"
#include "stage/signal.hpp"
#include "stage/simulation.hpp"
#include "stage/solver.hpp"

namespace stage::analysis {

// A copy of `circuit` where `input` has a unit AC phasor and every other
// source none. Throws an invalid_request Error when `input` is not an
// independent voltage or current source.
Circuit with_only_ac_input(const Circuit& circuit, const std::string& input);

// |output / input| at one frequency, the input alone driving (small signal,
// around the bias point).
double small_signal_gain(const Circuit& circuit, const SolverOptions& solver,
                         const std::string& input, const SignalRef& output, double frequency);
// The same on a prepared simulation of a circuit where the input alone
// carries an AC phasor (with_only_ac_input): its bias point is reused.
double small_signal_gain(Simulation& simulation, const std::string& input, const SignalRef& output,
                         double frequency);

// The small-signal impedance |Z| between nodes a and b at `frequency` with
// `removed` taken out of the circuit and every source zeroed: what that
// element's terminals see of the rest. Nothing when a and b are the same
// node; throws NumericalError when taking the element out floats a node.
std::optional<double> impedance_without(const Circuit& circuit, const SolverOptions& solver,
                                        const std::string& removed, const std::string& a,
                                        const std::string& b, double frequency);

// A DC voltage source tied to ground: the rail it holds a node at.
struct Rail {
  std::string source;
  std::string node;
  double voltage = 0;         // of `node`, from ground
  double source_voltage = 0;  // v(p) - v(n) of the source: power = this x its current
};

// Every voltage source without a waveform that has one terminal on ground,
// except `input`.
std::vector<Rail> supply_rails(const Circuit& circuit, const std::string& input);

}  // namespace stage::analysis
