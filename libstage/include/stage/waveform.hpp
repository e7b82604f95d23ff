// Time-dependent source waveforms (spec section 3): their value at a time and
// the corners a transient must land on.
#pragma once

#include <string>
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

// A repeating pulse as a designer specifies it (spec section 3). Its rising
// edge starts at `delay`; edges are linear, and `rise`/`fall` are their
// 10 %–90 % times, so an edge takes 1.25 times as long from level to level.
struct PulseWave {
  double low = 0.0;
  double high = 5.0;
  double period = 2e-6;
  double high_time = 1e-6;  // per period, at or above half amplitude
  double rise = 1e-9;       // 10 %–90 %
  double fall = 1e-9;       // 90 %–10 %
  double delay = 0.0;
  bool operator==(const PulseWave&) const = default;
};

// One period of a pulse from the start of its rising edge: level to level in
// `rise`, flat at `high` for `top`, level to level in `fall`, then low.
struct PulseShape {
  double rise;
  double top;
  double fall;
};
PulseShape pulse_shape(const PulseWave& w);

// Why a pulse cannot be drawn (non-finite or negative times, a high time too
// short for its edges, a period too short for the pulse), or empty.
std::string pulse_problem(const PulseWave& w);

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

// How many corners waveform_corners() would find in (0, to], counted without
// listing them (at most one more than there are), so that a request can be
// refused before a transient collects more than it can hold.
double waveform_corner_count(const Waveform& wave, double to);

}  // namespace stage
