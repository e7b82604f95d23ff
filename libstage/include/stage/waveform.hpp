// Time-dependent source waveforms (spec section 3): their value at a time and
// the corners a transient must land on.
#pragma once

#include <utility>
#include <variant>
#include <vector>

namespace stage {

struct SineWave {
  double amplitude = 1.0;
  double frequency = 1e3;
  double offset = 0.0;
  double delay = 0.0;
  double phase_deg = 0.0;
  double damping = 0.0;  // 1/s
  bool operator==(const SineWave&) const = default;
};

struct PulseWave {
  double low = 0.0;
  double high = 5.0;
  double delay = 0.0;
  double rise = 1e-9;
  double fall = 1e-9;
  double width = 1e-6;
  double period = 2e-6;
  bool operator==(const PulseWave&) const = default;
};

struct PiecewiseWave {
  std::vector<std::pair<double, double>> points;  // (time, value), time ascending
  bool repeat = false;
  bool operator==(const PiecewiseWave&) const = default;
};

using Waveform = std::variant<SineWave, PulseWave, PiecewiseWave>;

// Value of the waveform at time t (seconds).
double waveform_value(const Waveform& wave, double t);

// Appends to `corners` every time in (from, to] where the waveform's value or
// slope changes abruptly (pulse edges, piecewise points, a sine's start).
void waveform_corners(const Waveform& wave, double from, double to, std::vector<double>& corners);

}  // namespace stage
