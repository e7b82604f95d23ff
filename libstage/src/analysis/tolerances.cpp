// Absolute tolerances by kind of unknown; see tolerances.hpp.
#include "analysis/tolerances.hpp"

namespace stage::analysis {

double unknown_tolerance(mna::UnknownKind kind, const SolverOptions& options) {
  switch (kind) {
    case mna::UnknownKind::voltage:
      return options.voltage_tolerance;
    case mna::UnknownKind::current:
      return options.current_tolerance;
    case mna::UnknownKind::temperature:
      return options.temperature_tolerance;
  }
  return options.voltage_tolerance;
}

double residual_tolerance(mna::UnknownKind kind, const SolverOptions& options) {
  switch (kind) {
    case mna::UnknownKind::voltage:
      return options.current_tolerance;  // KCL
    case mna::UnknownKind::current:
      return options.voltage_tolerance;  // a branch equation
    case mna::UnknownKind::temperature:
      return options.heat_flow_tolerance;  // a heat balance
  }
  return options.current_tolerance;
}

AbsoluteTolerances absolute_tolerances(const mna::Topology& topology,
                                       const SolverOptions& options) {
  const auto n1 = static_cast<std::size_t>(topology.size()) + 1;
  AbsoluteTolerances t{std::vector<double>(n1, 0.0), std::vector<double>(n1, 0.0)};
  for (mna::Index i = 1; i <= topology.size(); ++i) {
    t.unknown[i] = unknown_tolerance(topology.kind(i), options);
    t.residual[i] = residual_tolerance(topology.kind(i), options);
  }
  return t;
}

}  // namespace stage::analysis
