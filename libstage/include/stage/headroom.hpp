// Output headroom (`analyze headroom(...)`): how far the output swings each
// way before the stage stops following the small-signal prediction, and why.
//
//   stage::HeadroomOptions o;
//   o.input = "vin";
//   o.output = stage::SignalRef::node("out");
//   o.frequency = 1e3;
//   o.distortion_limit = 0.01;
//   stage::HeadroomResult h = stage::run_headroom(circuit, o);
//   // h.positive.peak, h.negative.peak, h.negative.cause.mechanism ...
//
// The input source is driven with a sine at `frequency` around its DC value.
// For each amplitude a transient runs until the waveform repeats, and each
// polarity is judged on its own: its peak excursion from the bias point is
// compared with the small-signal prediction |gain| x amplitude. A side is
// within the limit while its peak falls short of the prediction by at most
// `distortion_limit` (relative); the THD of the whole waveform is held to the
// same limit. The
// largest amplitude within each limit is bracketed by doubling, then found by
// regula falsi to 1 %, every transient run informing all three searches.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/bias.hpp"
#include "stage/circuit.hpp"
#include "stage/progress.hpp"

namespace stage {

// What stops one side: a transistor entering saturation, a transistor
// reaching cutoff, the output reaching a supply rail, or smooth distortion
// with no device changing region (spec section 7's mechanisms).
struct LimitCause {
  std::string mechanism;  // saturation, cutoff, rail, current_limit, distortion
  std::string device;     // the transistor or supply involved
  // For smooth distortion: the transistor whose collector current moved
  // furthest from its bias value at the peak, and both currents, so the
  // designer sees which way the side is heading.
  std::string detail;
};

struct SideLimit {
  double peak = 0;             // V (or A): largest excursion from the bias point within the limit
  double input_amplitude = 0;  // input sine amplitude where that side reaches the limit
  double shortfall = 0;        // 1 - peak / prediction there
  LimitCause cause;
  // What the same side shows at the largest drive the search tried (past the
  // limit): where a smooth limit is heading, cutoff or saturation.
  std::optional<LimitCause> at_largest_drive;
  double largest_drive = 0;  // that input amplitude
  bool found = false;        // false: the limit was not reached below the largest amplitude tried
};

// The textbook AC load line of a single-transistor stage (Malvino and Bates,
// "Electronic Principles", ch. on AC load lines): quiescent point, AC load
// resistance seen between collector and emitter, the AC saturation current
// ICQ + VCEQ/R'ac, the AC cutoff voltage VCEQ + ICQ R'ac and the peak-to-peak
// compliance 2 min(VCEQ, ICQ R'ac). Magnitudes, so a pnp reads the same.
struct LoadLineEstimate {
  std::string device;
  double quiescent_current = 0;
  double quiescent_vce = 0;
  double ac_load = 0;  // ohm
  double saturation_current = 0;
  double cutoff_vce = 0;
  double compliance_peak_to_peak = 0;
};

struct HeadroomResult {
  HeadroomOptions options;
  std::string output;            // as written
  double bias_output = 0;        // output at the bias point
  double small_signal_gain = 0;  // |output / input| at the frequency
  SideLimit positive, negative;
  // Input amplitude where the THD reaches the limit, and the output's
  // fundamental amplitude there.
  std::optional<double> thd_limit_input_amplitude;
  std::optional<double> thd_limit_output_amplitude;
  // Twice the smallest of the two peaks and the THD-limited amplitude: the
  // largest symmetric swing that stays within every limit.
  double symmetric_peak_to_peak = 0;
  int transient_runs = 0;
  std::optional<LoadLineEstimate> load_line;  // single-transistor stages only
  BiasResult bias;
  std::vector<std::string> notes;
};

// Throws std::invalid_argument for bad options (input not an independent
// source, unknown output, frequency not positive, limit not in (0, 1)),
// NumericalError when a transient fails.
HeadroomResult run_headroom(const Circuit& circuit, const HeadroomOptions& options,
                            const ProgressCallback& progress = {});

// The load-line estimate of a circuit with exactly one bipolar transistor,
// at `frequency`; nothing for other circuits.
std::optional<LoadLineEstimate> estimate_load_line(const Circuit& circuit, const BiasResult& bias,
                                                   double frequency);

}  // namespace stage
