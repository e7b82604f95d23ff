// Reference curves for the tests, built in code and computed by the
// simulator from a known model, with optional multiplicative noise.
#pragma once

#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "stage/curves.hpp"

namespace stage::testing {

inline Curve curve_of(CurveKind kind, CurveQuantity swept, std::vector<CurveQuantity> measured,
                      std::vector<std::pair<CurveQuantity, double>> held,
                      const std::vector<double>& values, std::string name) {
  Curve c;
  c.name = std::move(name);
  c.file = c.name + ".csv";
  c.kind = kind;
  c.swept = swept;
  c.measured = std::move(measured);
  c.held = std::move(held);
  for (double v : values) {
    c.points.push_back({0, 0, v, std::vector<double>(c.measured.size(), 1.0)});
  }
  return c;
}

inline std::vector<double> range(double from, double to, double step) {
  std::vector<double> v;
  for (double x = from; x <= to + step / 2; x += step) v.push_back(x);
  return v;
}

// The model's curve as a reference, each measured value multiplied by
// exp(sigma * N(0, 1)): log-normal noise of relative size sigma.
inline Curve reference(const Curve& shape, const DeviceModel& model, double sigma = 0,
                       unsigned seed = 0) {
  Curve c = compute_curve(shape, model);
  std::mt19937 random(seed);
  std::normal_distribution<double> normal;
  for (auto& p : c.points) {
    for (double& v : p.measured) v *= std::exp(sigma * normal(random));
  }
  return c;
}

inline BipolarModel round_trip_npn() {
  BipolarModel m;
  m.saturation_current = 2e-14;
  m.beta_forward = 150;
  m.knee_current_forward = 40e-3;
  m.be_leakage_current = 5e-14;
  m.be_leakage_emission = 1.6;
  m.early_voltage_forward = 70;
  return m;
}

// Forward Gummel plot at VCE = 3 V over VBE 0.35 ... 0.90 V, where leakage,
// ideal and high-injection regions all show.
inline Curve gummel_shape() {
  return curve_of(CurveKind::forward_gummel, CurveQuantity::base_emitter_voltage,
                  {CurveQuantity::collector_current, CurveQuantity::base_current},
                  {{CurveQuantity::collector_emitter_voltage, 3.0}}, range(0.35, 0.90, 0.025),
                  "gummel");
}

// Output family at IB = 10, 30, 100 uA over VCE 1 ... 10 V: the Early slope.
inline Curve output_shape() {
  Curve c = curve_of(CurveKind::output_family, CurveQuantity::collector_emitter_voltage,
                     {CurveQuantity::collector_current}, {}, {}, "output");
  c.stepped = CurveQuantity::base_current;
  for (double ib : {10e-6, 30e-6, 100e-6}) {
    for (double vce : range(1, 10, 1)) c.points.push_back({0, ib, vce, {1.0}});
  }
  return c;
}

}  // namespace stage::testing
