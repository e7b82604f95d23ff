// The parameters a fit moves, and the scale each is moved on: the logarithm
// for positive quantities that span decades (saturation and knee currents,
// capacitances, times, resistances, Early voltages, current gains), a tanh
// map onto an open interval where physics bounds the value (emission
// coefficients, grading exponents, built-in potentials, fractions).
// Levenberg–Marquardt works on the unbounded scaled values u.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <utility>
#include <vector>

#include "stage/curves.hpp"

namespace stage::curves {

class FitParameter {
 public:
  // Throws InputError for a name not in the model's table, or a starting
  // value the scale cannot take (not positive and finite on a log scale).
  FitParameter(const DeviceModel& model, const std::string& name);

  const std::string& name() const { return name_; }
  Quantity quantity() const { return quantity_; }
  bool log_scale() const { return !bounds_; }
  const std::optional<std::pair<double, double>>& bounds() const { return bounds_; }

  double get(const DeviceModel& model) const;
  void set(DeviceModel& model, double value) const;
  double to_scaled(double value) const;
  double from_scaled(double u) const;
  double derivative(double u) const;  // d value / d u

 private:
  std::string name_;
  Quantity quantity_ = Quantity::dimensionless;
  std::optional<std::pair<double, double>> bounds_;
  // Log-scaled values are measured from the start, u = ln(value / start), so
  // that Levenberg–Marquardt's first step, bounded relative to |u|, is a
  // factor of a few and not tens of decades.
  double log_origin_ = 0;
};

}  // namespace stage::curves
