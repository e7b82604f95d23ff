// Running a read `.stage` file: every `analyze` statement in order, each on
// the circuit as written (parameter sweeps re-elaborate the text; a spectrum
// reads the transient before it).
#pragma once

#include <string>
#include <variant>
#include <vector>

#include "stage/bias.hpp"
#include "stage/characterize.hpp"
#include "stage/errors.hpp"
#include "stage/frequency.hpp"
#include "stage/headroom.hpp"
#include "stage/reader.hpp"
#include "stage/spectrum.hpp"
#include "stage/transient.hpp"

namespace stage {

// An analysis that could not finish: the NumericalError it ended with, kept
// in the run beside the results of the analyses that did finish. A spectrum
// not run because its transient failed takes that failure's error kind.
struct AnalysisFailure {
  std::string kind;  // the statement's analysis kind: "bias", "transient", ...
  ErrorKind error_kind;
  SourceLocation where;
  std::string message;
  std::vector<std::string> involved;  // nodes or elements at fault
};

using AnalysisResult =
    std::variant<BiasResult, SweepResult, FrequencyResult, TransientResult, SpectrumResult,
                 HeadroomResult, CharacterizeResult, AnalysisFailure>;

struct RunResult {
  std::string title;
  double temperature = kRoomTemperature;
  std::vector<AnalysisResult> analyses;  // one per statement, in order

  bool failed() const;  // some analysis is an AnalysisFailure
  // Some bias point or transient exceeded a device's maximum rating.
  bool exceeds_ratings() const;
};

struct RunOptions {
  // Told about long work (sweep points, headroom runs) as it happens.
  ProgressCallback progress;
};

// Throws InputError when the deck has no analysis, when its circuit or its
// solver settings fail validation, or at the first statement
// that cannot run as written (bad options for the circuit, a spectrum with no
// transient before it), and a NumericalError of kind topology when the
// circuit's graph has no unique DC solution (a floating node, a loop of
// voltage sources, a cut-set of current sources), so that nothing runs when
// something would fail.
void check_deck(const Deck& deck);

// Runs check_deck, then every analysis, each with the deck's solver
// settings. An analysis that fails numerically
// becomes an AnalysisFailure and the rest still run (a spectrum whose
// transient failed fails with it), so every figure that was found is kept.
RunResult run_deck(const Deck& deck, const RunOptions& options = {});

// Operating point at each value of a `let` parameter, with the deck's solver
// settings; the previous point is the starting guess of the next when the
// circuit's unknowns stay the same.
SweepResult run_parameter_sweep(const Deck& deck, const SweepOptions& options,
                                const ProgressCallback& progress = {});

}  // namespace stage
