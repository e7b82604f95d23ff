// Output headroom (`analyze headroom(...)`): how far the output swings each
// way before the stage stops following the small-signal prediction, and why.
//
//   stage::HeadroomOptions o;
//   o.input = "vin";
//   o.output = stage::SignalRef::node("out");
//   o.frequency = 1e3;
//   o.distortion_limit = 0.01;
//   stage::HeadroomResult h = stage::run_headroom(circuit, o);
//   // h.positive.peak, h.negative.peak, h.negative.cause.mechanism (stage::Mechanism) ...
//
// The input source is driven with a sine at `frequency` around its DC value.
// For each amplitude a transient runs until the waveform repeats, and each
// polarity is judged on its own. Its clip level is the peak it reaches and
// cannot pass: where its incremental gain (peak against drive) falls below a
// fifth of its largest, or the peak at the largest drive the rails allow.
// Below that, its peak excursion from the bias point is compared with the
// small-signal prediction |gain| x amplitude: a side is within the limit
// while its peak falls short of the prediction by at most `distortion_limit`
// (relative), and 1 dB compressed where it falls short by a factor
// 10^(-1/20). The THD of the whole waveform is held to `distortion_limit`.
// Each figure's drive is bracketed by stepping up to where the runs so far
// predict it, then narrowed by interpolation until a run within it and a
// run past it are 1 % apart (the clip level's 5 %), every transient run
// informing every search.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/bias.hpp"
#include "stage/circuit.hpp"
#include "stage/progress.hpp"
#include "stage/simulation.hpp"
#include "stage/solver.hpp"

namespace stage {

// What stops a side (spec section 7's mechanisms; to_string gives the name
// the JSON and the tables use).
enum class Mechanism {
  saturation,     // a transistor newly saturated
  cutoff,         // a transistor turned off, none taking over
  rail,           // the output at a supply rail
  current_limit,  // the network biasing the drive has run out of current
  crossover,      // a push-pull pair handing the output from one half to the other
  drive_limit,    // still growing at the largest drive the rails allow
  distortion,     // smooth distortion, no device changing region
};
std::string_view to_string(Mechanism mechanism);

struct LimitCause {
  Mechanism mechanism = Mechanism::distortion;
  std::string device;  // the transistor or supply involved
  // For smooth distortion: the transistor whose collector current moved
  // furthest from its bias value at the peak, and both currents, so the
  // designer sees which way the side is heading.
  std::string detail;
};

// The peak a side reaches and cannot pass however hard it is driven, within
// the drive the rails allow.
struct ClipLevel {
  double peak = 0;             // V (or A) from the bias point
  double input_amplitude = 0;  // the drive where the side stopped growing (or the largest allowed)
  LimitCause cause;            // read at that drive
  // True: the side's incremental gain fell below a fifth of its largest (it
  // clipped). False: it was still growing at the largest drive allowed, and
  // `cause` is drive_limit.
  bool plateau = false;
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
  ClipLevel clip;
  // The largest peak within 1 dB of the prediction, and its drive; nothing
  // when the side never compressed by 1 dB within the drive allowed.
  std::optional<double> compression_1dB_peak, compression_1dB_input_amplitude;
};

// A transistor's main path at one instant: |VCE| and |IC| for a bipolar.
struct LoadLinePoint {
  double vce = 0;      // V
  double current = 0;  // A
};

// The transistor's path over the last period of the drive at one input
// amplitude, at every accepted step of the transient.
struct LoadLinePath {
  double input_amplitude = 0;
  std::vector<LoadLinePoint> points;
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
  // The DC load line's resistance: what the transistor's main path sees
  // with every capacitor open (0 when taking the transistor out floats a
  // node at DC).
  double dc_load = 0;
  // The path at the largest drive within every limit (both sides and the
  // THD) and at the symmetric clip level's drive.
  std::optional<LoadLinePath> clean_path, clip_path;
};

// One transient run of the headroom search.
struct DrivePoint {
  double input_amplitude = 0;
  double positive_peak = 0;  // V (or A) from the output's average
  double negative_peak = 0;
  double thd = 0;
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
  // What makes the THD pass the limit, read at the first run past it (or the
  // smallest drive, when the THD is past the limit from the start):
  // crossover for a class-B pair.
  std::optional<LimitCause> thd_limit_cause;
  // Twice the smallest of the two peaks and the THD-limited amplitude: the
  // largest symmetric swing that stays within every limit.
  double symmetric_peak_to_peak = 0;
  // The smaller of the two sides' clip levels (a peak), and the drive where
  // that side reaches it: the designer's "full swing".
  double symmetric_clip_peak = 0;
  double symmetric_clip_input_amplitude = 0;
  // The largest input amplitude the search may use: half the span between
  // the lowest and highest rail for a voltage input (what a driver on those
  // rails can deliver), and never a prediction beyond 1.5 x the largest rail.
  double largest_drive_allowed = 0;
  // Transient runs, one for each drive tried (a run continued until it
  // settles is one run).
  int transient_runs = 0;
  std::vector<DrivePoint> runs;  // every run, by ascending input amplitude
  // What the search's prepared simulation built and solved: one system and
  // one cold bias point for the whole search (the load-line estimate solves
  // a separate small-signal circuit of its own).
  SimulationCounters counters;
  std::optional<LoadLineEstimate> load_line;  // single-transistor stages only
  BiasResult bias;
  std::vector<std::string> notes;
};

// Throws an invalid_request Error for bad options (input not an independent
// source, unknown output, frequency not positive, limit not in (0, 1)),
// NumericalError when a transient fails.
HeadroomResult run_headroom(const Circuit& circuit, const HeadroomOptions& options,
                            const SolverOptions& solver = {},
                            const ProgressCallback& progress = {});

}  // namespace stage
