// Every rule a circuit and an analysis request must meet that can be known
// without solving anything, in one place. The reader calls these after
// reading (adding the place in the text), `stage check` calls them, and every
// run calls them before it starts, so a circuit built in C++ is held to the
// same rules as one read from a file, and whatever passes `stage check` does
// not fail later for a reason these could have known.
#pragma once

#include <optional>
#include <string>

#include "stage/analyses.hpp"
#include "stage/circuit.hpp"
#include "stage/solver.hpp"

namespace stage {

// What is wrong, and with what: `subject` is an element name, "model <name>"
// for a model parameter, "temperature" for the circuit's temperature,
// "solver" for the solver settings, or the analysis option's name.
struct Problem {
  std::string subject;
  std::string message;  // a sentence that names the subject
};

// Element values (finite; resistance, capacitance, inductance and area
// positive), waveforms, models (each referenced model exists and each
// parameter is finite and within its range), sensed sources and temperature.
// The first problem found, or nothing.
std::optional<Problem> validate(const Circuit& circuit);

// Solver settings: every tolerance positive and finite, at least one Newton
// iteration, a minimum conductance of zero or more.
std::optional<Problem> validate(const SolverOptions& solver);

// An analysis request against the circuit it will run on: numbers finite and
// in range, inputs, outputs and loads that exist and suit the analysis.
std::optional<Problem> validate(const Circuit& circuit, const AnalysisOptions& options);

}  // namespace stage
