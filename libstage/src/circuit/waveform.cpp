// Source waveforms of spec section 3: values and corners.
#include "stage/waveform.hpp"

#include <algorithm>
#include <cmath>

#include "common/constants.hpp"

namespace stage {
namespace {

double sine_value(const SineWave& w, double t) {
  const double phase = radians_from_degrees(w.phase_deg);
  if (t < w.delay) return w.offset + w.amplitude * std::sin(phase);
  const double s = t - w.delay;
  return w.offset +
         w.amplitude * std::exp(-w.damping * s) * std::sin(kTwoPi * w.frequency * s + phase);
}

// Within each period: rise, high for width, fall, low for the rest.
double pulse_value(const PulseWave& w, double t) {
  if (t < w.delay) return w.low;
  double s = t - w.delay;
  if (w.period > 0) s = std::fmod(s, w.period);
  if (s < w.rise) return w.low + (w.high - w.low) * (w.rise > 0 ? s / w.rise : 1.0);
  s -= w.rise;
  if (s < w.width) return w.high;
  s -= w.width;
  if (s < w.fall) return w.high + (w.low - w.high) * (w.fall > 0 ? s / w.fall : 1.0);
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
  const double offsets[] = {0.0, w.rise, w.rise + w.width, w.rise + w.width + w.fall};
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

}  // namespace stage
