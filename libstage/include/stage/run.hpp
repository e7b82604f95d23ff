// Running a read `.stage` file: every `analyze` statement in order, each on
// the circuit as written (parameter sweeps re-elaborate the text; a spectrum
// reads the transient before it).
#pragma once

#include <string>
#include <variant>
#include <vector>

#include "stage/bias.hpp"
#include "stage/characterize.hpp"
#include "stage/frequency.hpp"
#include "stage/headroom.hpp"
#include "stage/reader.hpp"
#include "stage/spectrum.hpp"
#include "stage/transient.hpp"

namespace stage {

using AnalysisResult = std::variant<BiasResult, SweepResult, FrequencyResult, TransientResult,
                                    SpectrumResult, HeadroomResult, CharacterizeResult>;

struct RunResult {
  std::string title;
  double temperature = kRoomTemperature;
  std::vector<AnalysisResult> analyses;
};

struct RunOptions {
  // Told about long work (sweep points, headroom runs) as it happens.
  ProgressCallback progress;
};

// Throws InputError at the first statement that cannot run as written (bad
// options for the circuit, a spectrum with no transient before it), so that
// nothing runs when something would fail or be skipped.
void check_deck(const Deck& deck);

// Runs check_deck, then every analysis. Throws NumericalError on failure.
RunResult run_deck(const Deck& deck, const RunOptions& options = {});

// Operating point at each value of a `let` parameter; the previous point is
// the starting guess of the next when the circuit's unknowns stay the same.
SweepResult run_parameter_sweep(const Deck& deck, const SweepOptions& options,
                                const ProgressCallback& progress = {});

}  // namespace stage
