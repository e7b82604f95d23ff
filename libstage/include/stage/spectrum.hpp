// Harmonics and distortion (`analyze spectrum(...)`) of a signal of a
// finished transient, taken over the last whole periods of the fundamental.
//
//   const auto tr = stage::run_transient(circuit, transient_options);
//   const auto s = stage::run_spectrum(tr, {stage::SignalRef::node("out"), 1e3, 9});
//   if (!s.settled) std::cerr << s.message;
//
// Harmonic n is reported as amplitude A_n and phase phi_n of
// A_n sin(2 pi n f t + phi_n), t being the transient's own time. The Fourier
// integrals are taken of the transient's interpolant, step by step.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/transient.hpp"

namespace stage {

struct Harmonic {
  int n = 1;
  double amplitude = 0;  // peak, in the signal's unit
  double phase_deg = 0;
};

struct SpectrumResult {
  std::string signal;
  double fundamental = 0;  // Hz
  double dc = 0;
  std::vector<Harmonic> harmonics;       // n = 1 .. options.harmonics
  double thd = 0;                        // ratio: rms of harmonics 2.. over the fundamental's
  std::optional<double> thd_plus_noise;  // ratio: rms of all but DC and fundamental, when asked
  int periods = 0;                       // whole periods analysed
  // False when the transient is shorter than the periods asked for plus one
  // to compare with, or its last two periods still differ; `message` says why.
  bool settled = true;
  // RMS of x(t) - x(t - T) over the last period, over the fundamental's RMS
  // A_1 / sqrt 2.
  double period_change = 0;
  std::string message;
};

// Throws an invalid_request Error when the signal is unknown or the transient
// holds less than one period of the fundamental.
SpectrumResult run_spectrum(const TransientResult& transient, const SpectrumOptions& options,
                            int periods = 1);

}  // namespace stage
