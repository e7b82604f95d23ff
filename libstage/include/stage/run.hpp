// Running a read `.stage` file: every `analyze` statement in order, each on
// the circuit as written (parameter sweeps re-elaborate the text).
#pragma once

#include <functional>
#include <string>
#include <variant>
#include <vector>

#include "stage/bias.hpp"
#include "stage/reader.hpp"

namespace stage {

using AnalysisResult = std::variant<BiasResult, SweepResult>;

struct RunResult {
  std::string title;
  double temperature = kRoomTemperature;
  std::vector<AnalysisResult> analyses;
};

// Throws InputError at the statement of any analysis this version cannot
// run, so that nothing runs when something would be skipped.
void check_deck(const Deck& deck);

// Runs check_deck, then every analysis. Throws NumericalError on failure.
RunResult run_deck(const Deck& deck);

// Operating point at each value of a `let` parameter; the previous point is
// the starting guess of the next when the circuit's unknowns stay the same.
SweepResult run_parameter_sweep(const Deck& deck, const SweepOptions& options);

}  // namespace stage
