// Small-signal frequency analysis (`analyze frequency(...)`, spec section 6):
// gain and phase of a stage, its input and output impedance, and the figures
// a designer reads off them (midband gain, -3 dB corners, unity-gain
// frequency).
//
//   stage::FrequencyOptions o;
//   o.input = "vin";
//   o.output = stage::SignalRef::node("out");
//   o.load = "rl";
//   if (auto why = stage::frequency_options_error(circuit, o)) throw ...;
//   stage::FrequencyResult r = stage::run_frequency(circuit, o);
//   std::cout << r.brief_report();
//
// The circuit is linearised once at its DC operating point; every frequency
// reuses that linearisation and the symbolic factorisation of G + jwC.
#pragma once

#include <complex>
#include <optional>
#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/bias.hpp"
#include "stage/circuit.hpp"
#include "stage/solver.hpp"

namespace stage {

// Figures read off the response. "Gain" is |output / input phasor| in dB;
// it is a voltage gain for a voltage input and a voltage output, and carries
// ohm or siemens otherwise.
struct FrequencyFigures {
  // The largest gain on the sweep grid, and where it was found.
  double peak_gain_dB = 0;
  double peak_frequency = 0;  // Hz
  // The band is the stretch of the grid around the peak where the gain stays
  // within 3.0103 dB of it; midband is the grid point nearest the band's
  // centre on a log scale (the geometric mean of its ends).
  double midband_gain_dB = 0;
  double midband_frequency = 0;  // Hz
  // Where the gain has fallen 3.0103 dB (a factor 1/sqrt(2)) below the peak,
  // below and above it; located to rounding by re-solving between grid
  // points. Absent when the sweep does not reach them.
  std::optional<double> lower_cutoff;  // Hz
  std::optional<double> upper_cutoff;  // Hz
  // Where the gain falls through 0 dB above the peak.
  std::optional<double> unity_gain_frequency;  // Hz
  // At FrequencyOptions::at, solved there (not interpolated).
  std::optional<double> gain_at_dB;
  std::optional<double> phase_at_deg;
};

struct FrequencyResult {
  FrequencyOptions options;
  std::string output;  // as written: "out", "(p, n)" or "r1.current"
  BiasResult bias;     // the operating point the circuit was linearised at

  std::vector<double> frequencies;  // Hz, logarithmically spaced, from .. to
  // Output phasor over the input source's AC phasor. Every source with a
  // nonzero AC value drives the circuit at once; with more than one, the
  // response is their superposition, still divided by the input's phasor.
  std::vector<std::complex<double>> response;
  std::vector<double> gain_dB;    // 20 log10 |response|
  std::vector<double> phase_deg;  // arg(response), unwrapped along the sweep
  // Seen by the input source at its terminals, the input alone driving: its
  // phasor over the current it delivers (voltage source), or the voltage
  // that builds across it over its current (current source). Infinite when
  // the source delivers no current.
  std::vector<std::complex<double>> input_impedance;  // ohm
  // Looking back into the output with every independent source zeroed and
  // the load (if named) removed. Empty when the output is a current.
  std::vector<std::complex<double>> output_impedance;  // ohm
  FrequencyFigures figures;
  std::vector<std::string> notes;  // what was left out and why

  // One line: midband gain, corners, impedances at midband.
  std::string brief_report() const;
  // The table of every point and the figures.
  std::string full_report() const;
};

// Why `options` cannot run on `circuit`, or nothing when they can: from and
// to positive with from < to, per_decade > 0, `input` an independent source
// with a nonzero AC value, `output` an existing node, node pair or element
// current, and `load` a two-terminal element (not a voltage source) that
// connects the output's two nodes (the output node and ground for a node).
std::optional<std::string> frequency_options_error(const Circuit& circuit,
                                                   const FrequencyOptions& options);

// Throws an invalid_request Error with the message above for invalid options,
// NumericalError when there is no operating point or G + jwC is singular.
FrequencyResult run_frequency(const Circuit& circuit, const FrequencyOptions& options,
                              const SolverOptions& solver = {});

}  // namespace stage
