// validate(const SolverOptions&): the rules of stage/validate.hpp for the
// solver settings.
#include <cmath>
#include <string>

#include "stage/validate.hpp"

namespace stage {

std::optional<Problem> validate(const SolverOptions& s) {
  const auto bad = [](const std::string& why) {
    return std::optional<Problem>(Problem{"solver", "solver: " + why});
  };
  for (double tolerance : {s.relative_tolerance, s.voltage_tolerance, s.current_tolerance,
                           s.temperature_tolerance, s.heat_flow_tolerance}) {
    if (!(std::isfinite(tolerance) && tolerance > 0)) {
      return bad("every tolerance must be positive and finite");
    }
  }
  if (s.max_newton_iterations < 1) return bad("max_newton_iterations must be at least 1");
  if (!(std::isfinite(s.minimum_conductance) && s.minimum_conductance >= 0)) {
    return bad("minimum_conductance must be zero or positive, and finite");
  }
  return std::nullopt;
}

}  // namespace stage
