// Fit parameters: looked up by their long names in the model's parameter
// table (models.hpp), and scaled as fit_parameters.hpp explains.
#include "curves/fit_parameters.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include "stage/errors.hpp"

namespace stage::curves {
namespace {

struct Bound {
  std::string_view suffix;
  double lo, hi;
};

// Physical bounds, matched on the end of the parameter name. Ideality
// factors lie between 1 and 2 for real junctions (0.5 and 5 leave room);
// grading exponents between 0 and 1 (1/3 linearly graded, 1/2 abrupt); a
// silicon built-in potential below the band gap; fractions in (0, 1).
// Common practice, from memory.
constexpr std::array kBounds{
    Bound{"emission_forward", 0.5, 5},
    Bound{"emission_reverse", 0.5, 5},
    Bound{"leakage_emission", 0.5, 5},
    Bound{"emission_coefficient", 0.5, 5},
    Bound{"grading", 0, 1},
    Bound{"potential", 0.1, 1.5},
    Bound{"internal_fraction", 0, 1},
    Bound{"depletion_fill_coefficient", 0, 1},
};

std::optional<std::pair<double, double>> bounds_of(const std::string& name) {
  for (const auto& b : kBounds) {
    if (name.size() >= b.suffix.size() &&
        name.compare(name.size() - b.suffix.size(), b.suffix.size(), b.suffix) == 0) {
      return std::pair{b.lo, b.hi};
    }
  }
  return std::nullopt;
}

// The field of `model` named `name`, through the model's parameter table.
template <class Model>
double* find_field(Model& model, std::span<const ModelParameter<Model>> table,
                   const std::string& name, Quantity* quantity) {
  for (const auto& row : table) {
    if (row.name == name) {
      if (quantity) *quantity = row.quantity;
      return &(model.*(row.field));
    }
  }
  return nullptr;
}

double* field(DeviceModel& model, const std::string& name, Quantity* quantity = nullptr) {
  if (auto* b = std::get_if<BipolarModel>(&model.parameters)) {
    return find_field(*b, bipolar_parameters(), name, quantity);
  }
  return find_field(std::get<DiodeModel>(model.parameters), diode_parameters(), name, quantity);
}

}  // namespace

FitParameter::FitParameter(const DeviceModel& model, const std::string& name)
    : name_(name), bounds_(bounds_of(name)) {
  DeviceModel copy = model;
  const double* value = field(copy, name, &quantity_);
  if (!value) {
    throw InputError({"--params", 0, 0}, "model '" + model.name + "' has no parameter '" + name +
                                             "' (use the long names of the model's table)");
  }
  if (log_scale() && std::isfinite(*value) && *value > 0) log_origin_ = std::log(*value);
  if (log_scale() && !(std::isfinite(*value) && *value > 0)) {
    throw InputError({"--params", 0, 0},
                     "'" + name +
                         "' is fitted on a log scale and needs a finite positive "
                         "starting value in model '" +
                         model.name + "'; it is " + std::to_string(*value));
  }
}

double FitParameter::get(const DeviceModel& model) const {
  return *field(const_cast<DeviceModel&>(model), name_);
}

void FitParameter::set(DeviceModel& model, double value) const { *field(model, name_) = value; }

// Inside the bounds, value = lo + (hi - lo) (1 + tanh u) / 2. A start on a
// bound is moved a millionth of the interval inside.
double FitParameter::to_scaled(double value) const {
  if (log_scale()) return std::log(value) - log_origin_;
  const auto [lo, hi] = *bounds_;
  const double t = std::clamp(2 * (value - lo) / (hi - lo) - 1, -1 + 1e-6, 1 - 1e-6);
  return std::atanh(t);
}

double FitParameter::from_scaled(double u) const {
  if (log_scale()) return std::exp(u + log_origin_);
  const auto [lo, hi] = *bounds_;
  return lo + (hi - lo) * (1 + std::tanh(u)) / 2;
}

double FitParameter::derivative(double u) const {
  if (log_scale()) return std::exp(u + log_origin_);
  const auto [lo, hi] = *bounds_;
  const double t = std::tanh(u);
  return (hi - lo) * (1 - t * t) / 2;
}

}  // namespace stage::curves
