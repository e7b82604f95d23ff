// Source waveforms of spec section 3: values and corners.
#include "stage/waveform.hpp"

#include <algorithm>
#include <cmath>

#include "common/constants.hpp"
#include "common/si_format.hpp"

namespace stage {
namespace {

double sine_value(const SineWave& w, double t) {
  const double phase = radians_from_degrees(w.phase_deg);
  if (t < w.delay) return w.offset + w.amplitude * std::sin(phase);
  const double s = t - w.delay;
  return w.offset +
         w.amplitude * std::exp(-w.damping * s) * std::sin(kTwoPi * w.frequency * s + phase);
}

// Within each period: rise, high for the flat top, fall, low for the rest.
double pulse_value(const PulseWave& w, double t) {
  if (t < w.delay) return w.low;
  const PulseShape shape = pulse_shape(w);
  double s = t - w.delay;
  if (w.period > 0) s = std::fmod(s, w.period);
  if (s < shape.rise) return w.low + (w.high - w.low) * s / shape.rise;
  s -= shape.rise;
  if (s < shape.top) return w.high;
  s -= shape.top;
  if (s < shape.fall) return w.high + (w.low - w.high) * s / shape.fall;
  return w.low;
}

double piecewise_value(const PiecewiseWave& w, double t) {
  const auto& p = w.points;
  if (p.empty()) return 0.0;
  const double first = p.front().first, last = p.back().first;
  if (w.repeat && last > first && t > last) t = first + std::fmod(t - first, last - first);
  if (t <= first) return p.front().second;
  if (t >= last) return p.back().second;
  auto hi = std::upper_bound(p.begin(), p.end(), t,
                             [](double v, const auto& point) { return v < point.first; });
  auto lo = hi - 1;
  const double span = hi->first - lo->first;
  if (span <= 0) return hi->second;
  return lo->second + (hi->second - lo->second) * (t - lo->first) / span;
}

void add_if_inside(double t, double from, double to, std::vector<double>& out) {
  if (t > from && t <= to) out.push_back(t);
}

void pulse_corners(const PulseWave& w, double from, double to, std::vector<double>& out) {
  const PulseShape shape = pulse_shape(w);
  const double offsets[] = {0.0, shape.rise, shape.rise + shape.top,
                            shape.rise + shape.top + shape.fall};
  if (w.period <= 0) {
    for (double o : offsets) add_if_inside(w.delay + o, from, to, out);
    return;
  }
  const double first_period = std::max(0.0, std::floor((from - w.delay) / w.period));
  for (double k = first_period; w.delay + k * w.period <= to; k += 1.0) {
    for (double o : offsets) add_if_inside(w.delay + k * w.period + o, from, to, out);
  }
}

void piecewise_corners(const PiecewiseWave& w, double from, double to, std::vector<double>& out) {
  const auto& p = w.points;
  if (p.empty()) return;
  const double first = p.front().first, span = p.back().first - first;
  if (!w.repeat || span <= 0) {
    for (const auto& point : p) add_if_inside(point.first, from, to, out);
    return;
  }
  const double first_cycle = std::max(0.0, std::floor((from - first) / span));
  for (double k = first_cycle; first + k * span <= to; k += 1.0) {
    for (const auto& point : p) add_if_inside(point.first + k * span, from, to, out);
  }
}

}  // namespace

// A linear edge covers 80 % of its swing in its 10 %–90 % time, so it takes
// 1.25 times that from level to level; half of each edge lies at or above
// half amplitude, so the flat top is the high time less half of both edges.
PulseShape pulse_shape(const PulseWave& w) {
  constexpr double kFullEdgePer1090 = 1.25;  // 1 / 0.8
  const double rise = kFullEdgePer1090 * w.rise, fall = kFullEdgePer1090 * w.fall;
  return {rise, w.high_time - 0.5 * (rise + fall), fall};
}

std::string pulse_problem(const PulseWave& w) {
  for (double v : {w.low, w.high, w.period, w.high_time, w.rise, w.fall, w.delay}) {
    if (!std::isfinite(v)) return "needs finite values";
  }
  if (w.delay < 0 || w.rise < 0 || w.fall < 0) return "needs a delay, rise and fall of 0 or more";
  if (!(w.period > 0)) return "needs a positive period";
  const PulseShape shape = pulse_shape(w);
  if (shape.top < 0) {
    return "has a high_time of " + text::si(w.high_time, "s") +
           ", shorter than its edges allow: half of each edge lies above half amplitude, "
           "so high_time must be at least 0.625 × (rise + fall) = " +
           text::si(0.5 * (shape.rise + shape.fall), "s");
  }
  if (w.period < shape.rise + shape.top + shape.fall) {
    return "has a period of " + text::si(w.period, "s") +
           ", shorter than the pulse: it needs at least high_time + 0.625 × (rise + fall) = " +
           text::si(shape.rise + shape.top + shape.fall, "s");
  }
  return {};
}

double waveform_value(const Waveform& wave, double t) {
  struct Visitor {
    double t;
    double operator()(const SineWave& w) const { return sine_value(w, t); }
    double operator()(const PulseWave& w) const { return pulse_value(w, t); }
    double operator()(const PiecewiseWave& w) const { return piecewise_value(w, t); }
  };
  return std::visit(Visitor{t}, wave);
}

void waveform_corners(const Waveform& wave, double from, double to, std::vector<double>& out) {
  struct Visitor {
    double from, to;
    std::vector<double>& out;
    void operator()(const SineWave& w) const { add_if_inside(w.delay, from, to, out); }
    void operator()(const PulseWave& w) const { pulse_corners(w, from, to, out); }
    void operator()(const PiecewiseWave& w) const { piecewise_corners(w, from, to, out); }
  };
  std::visit(Visitor{from, to, out}, wave);
}

double waveform_corner_count(const Waveform& wave, double to) {
  struct Visitor {
    double to;
    double operator()(const SineWave&) const { return 1; }
    double operator()(const PulseWave& w) const {
      if (w.period <= 0) return 4;
      return 4 * (std::max(0.0, to - w.delay) / w.period + 1);
    }
    double operator()(const PiecewiseWave& w) const {
      const double points = static_cast<double>(w.points.size());
      if (!w.repeat || w.points.size() < 2) return points;
      const double span = w.points.back().first - w.points.front().first;
      if (span <= 0) return points;
      return points * (std::max(0.0, to - w.points.front().first) / span + 1);
    }
  };
  return std::visit(Visitor{to}, wave);
}

}  // namespace stage
