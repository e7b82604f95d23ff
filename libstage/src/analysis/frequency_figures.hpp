// The figures read off a frequency response: midband gain, the -3 dB
// corners and the unity-gain frequency. Crossings are bracketed on the sweep
// grid, then located by re-solving the circuit between the two grid points,
// so they are exact to rounding rather than to the grid spacing.
#pragma once

#include <functional>
#include <vector>

#include "stage/frequency.hpp"

namespace stage::analysis {

// gain_dB_at(f) solves the circuit at f and returns its gain in dB.
FrequencyFigures find_figures(const std::vector<double>& frequencies,
                              const std::vector<double>& gain_dB,
                              const std::function<double(double)>& gain_dB_at);

// arg(z) in degrees, moved by whole turns to lie within 180 degrees of
// `reference` (continuity along a sweep).
double unwrapped_phase_deg(std::complex<double> z, double reference_deg);

}  // namespace stage::analysis
