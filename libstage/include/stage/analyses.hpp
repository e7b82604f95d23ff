// What each `analyze` statement asks for (spec section 6), as option structs
// with the spec's defaults. Each analysis has its own header with the function
// that runs it and its result type; this header only describes requests, so
// the reader can produce them without knowing how they run.
#pragma once

#include <optional>
#include <string>
#include <variant>
#include <vector>

#include "stage/errors.hpp"
#include "stage/signal.hpp"
#include "stage/units.hpp"

namespace stage {

struct BiasOptions {};

struct SweepOptions {
  enum class Target { source, parameter, temperature };
  Target target = Target::source;
  std::string name;            // source or parameter name; empty for temperature
  std::vector<double> values;  // from/to/step is expanded by the reader
  // What the values are, for the reports' unit: run_sweep sets it for a
  // source or the temperature, the reader for a parameter with a unit.
  Quantity quantity = Quantity::dimensionless;
};

struct FrequencyOptions {
  double from = 10;
  double to = 1e6;
  int per_decade = 20;
  std::string input;  // the AC source the gain is relative to
  SignalRef output;
  std::optional<std::string> load;  // removed when the output impedance is computed
  std::optional<double> at;         // report gain and phase at this frequency
};

enum class TransientStart { bias, zero };

struct TransientOptions {
  double stop = 0;
  double max_step = 0;  // 0: chosen from stop and the waveforms
  double from = 0;      // results are kept from this time on
  TransientStart start = TransientStart::bias;
  std::optional<double> resample_step;  // resample onto a uniform grid
  // Empty: every node voltage, reported current and element temperature.
  std::vector<SignalRef> signals;
};

struct SpectrumOptions {
  SignalRef signal;
  double fundamental = 1e3;
  int harmonics = 9;
  bool with_noise = false;  // also report THD+N
};

struct HeadroomOptions {
  std::string input;
  SignalRef output;
  double frequency = 1e3;
  double distortion_limit = 0.01;
  std::optional<std::string> load;
  // Input amplitude of the search's first run; by default the one the
  // small-signal gain predicts gives a 50 mV output peak.
  std::optional<double> first_input_amplitude;
  // Transient runs the search may take (each one settles the stage at one
  // drive level) before it gives up with a search_exhausted error.
  int max_runs = 100;
  // Each run simulates whole periods until the last two agree (doubling from
  // four); a stage with slow coupling capacitors may need more than this
  // many, in which case its figures are marked approximate.
  int settle_periods = 64;
};

struct CharacterizeOptions {
  std::string input;
  SignalRef output;
  double frequency = 1e3;
  std::optional<std::string> load;
  int settle_periods = 64;  // as HeadroomOptions::settle_periods
};

using AnalysisOptions = std::variant<BiasOptions, SweepOptions, FrequencyOptions, TransientOptions,
                                     SpectrumOptions, HeadroomOptions, CharacterizeOptions>;

// One `analyze` statement as read, with where it was written.
struct AnalysisStatement {
  AnalysisOptions options;
  SourceLocation where;
};

// The statement keyword of an analysis ("bias", "sweep", "frequency", ...).
std::string_view analysis_kind(const AnalysisOptions& options);

}  // namespace stage
