// DC operating point: plain Newton, then conductance stepping, then source
// stepping (the classic homotopies for circuits that will not start cold),
// and the report of the solution.
#include "analysis/operating_point.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cmath>
#include <optional>

#include "devices/sources.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

constexpr double kFirstConductance = 1e-2;  // S; start of conductance stepping
constexpr double kLargestConductance = 10;  // S; where a failing start gives up
constexpr double kMaxStepRatio = 10;        // a decade per conductance step at most
constexpr int kMaxHomotopySteps = 400;
constexpr double kNearlySingular = 1e-14;  // reciprocal condition: a warning below

NewtonProblem dc_problem(const NewtonSolver& newton, double shunt, double source_scale) {
  NewtonProblem p;
  p.request = newton.system().request(nullptr);
  p.request.source_scale = source_scale;
  p.shunt = shunt;
  p.max_iterations = newton.options().max_newton_iterations;
  return p;
}

void reset_limiting(const mna::System& system) {
  for (const auto& d : system.devices()) d->reset_limiting();
}

// Lowers the node-to-ground conductance from kFirstConductance to the
// minimum, then removes it. The ratio between steps shrinks (square root)
// after a failed step, which is retried closer to the last good value, and
// grows back (squared, up to a decade) after a success. A failure before any
// success starts again from a larger conductance, which makes the circuit
// more nearly linear.
bool conductance_stepping(NewtonSolver& newton, std::vector<double>& x, int& iterations) {
  const double floor = std::max(newton.options().minimum_conductance, 1e-15);
  std::vector<double> good = x;
  std::optional<double> good_shunt;
  double shunt = kFirstConductance, factor = kMaxStepRatio;
  for (int step = 0; step < kMaxHomotopySteps; ++step) {
    const auto outcome = newton.solve(x, dc_problem(newton, shunt, 1.0));
    iterations += outcome.iterations;
    spdlog::debug("conductance stepping: {:.3g} S {}", shunt,
                  outcome.status == NewtonStatus::converged ? "converged" : "failed");
    if (outcome.status == NewtonStatus::converged) {
      if (shunt == 0.0) return true;
      good = x;
      good_shunt = shunt;
      factor = std::min(kMaxStepRatio, factor * factor);
      shunt = shunt / factor < floor ? 0.0 : shunt / factor;
      continue;
    }
    x = good;
    reset_limiting(newton.system());
    if (!good_shunt) {
      shunt *= kMaxStepRatio;
      if (shunt > kLargestConductance) return false;
      continue;
    }
    factor = std::sqrt(factor);
    if (factor < 1.01) return false;
    shunt = std::max(*good_shunt / factor, floor);
  }
  return false;
}

// Raises every independent source from zero to its full value.
bool source_stepping(NewtonSolver& newton, std::vector<double>& x, int& iterations) {
  std::fill(x.begin(), x.end(), 0.0);
  reset_limiting(newton.system());
  std::vector<double> good = x;
  double scale = 0.0, step = 0.1;
  for (int k = 0; k < kMaxHomotopySteps; ++k) {
    const double target = std::min(1.0, scale + step);
    const auto outcome = newton.solve(x, dc_problem(newton, 0.0, target));
    iterations += outcome.iterations;
    spdlog::debug("source stepping: {:.4g} {}", target,
                  outcome.status == NewtonStatus::converged ? "converged" : "failed");
    if (outcome.status == NewtonStatus::converged) {
      good = x;
      scale = target;
      if (scale >= 1.0) return true;
      step = std::min(0.25, step * 1.5);
    } else {
      x = good;
      reset_limiting(newton.system());
      step /= 4.0;
      if (step < 1e-7) return false;
    }
  }
  return false;
}

[[noreturn]] void fail(const NewtonSolver& newton, const NewtonOutcome& last) {
  const mna::System& system = newton.system();
  if (last.status == NewtonStatus::singular) {
    const std::string name = system.topology().name(last.singular_unknown);
    throw NumericalError("the DC system is singular at '" + name +
                             "': no unique operating point (check for a node held by nothing "
                             "but junctions in cutoff or by controlled sources alone)",
                         {name});
  }
  const auto worst = system.worst_unknowns(newton.last_update(), 3);
  std::string message =
      "no DC operating point found (Newton, conductance stepping and source "
      "stepping all failed); in the last attempt these did not settle:";
  for (const auto& name : worst) {
    const auto index = system.topology().find_unknown(name);
    message += " " + name;
    if (index) {
      message += fmt::format(" (last change {:.3g}, residual {:.3g})", newton.last_update()[*index],
                             newton.residual()[*index]);
    }
  }
  throw NumericalError(message, worst);
}

}  // namespace

OperatingPoint solve_operating_point(NewtonSolver& newton, std::vector<double>& x) {
  OperatingPoint how;
  reset_limiting(newton.system());
  const std::vector<double> guess = x;
  auto outcome = newton.solve(x, dc_problem(newton, 0.0, 1.0));
  how.newton_iterations = outcome.iterations;
  spdlog::debug("plain Newton: {} after {} iterations",
                outcome.status == NewtonStatus::converged ? "converged" : "failed",
                outcome.iterations);
  // KLU's estimate of the last Jacobian's reciprocal condition, kept with the
  // result: near machine precision the bias point is barely determined.
  const auto finish = [&](BiasMethod method) {
    how.method = method;
    how.reciprocal_condition = newton.lu().rcond();
    spdlog::debug("bias point found by {}; reciprocal condition estimate {:.3g}", to_string(method),
                  how.reciprocal_condition);
    if (how.reciprocal_condition < kNearlySingular) {
      spdlog::warn(
          "the bias point is nearly singular (reciprocal condition {:.2g}): a node may "
          "hang on nothing but junctions in cutoff",
          how.reciprocal_condition);
    }
    return how;
  };
  if (outcome.status == NewtonStatus::converged) return finish(BiasMethod::newton);
  // A Jacobian can be singular only at the cold start, where every junction
  // is off and a node driven by current sources alone hangs on picoamp
  // conductances; conductance stepping gives every node a path to ground.
  // A circuit that is singular in itself fails there too and is reported
  // with this first diagnosis.

  x = guess;
  reset_limiting(newton.system());
  if (conductance_stepping(newton, x, how.newton_iterations)) {
    return finish(BiasMethod::conductance_stepping);
  }
  if (source_stepping(newton, x, how.newton_iterations)) {
    return finish(BiasMethod::source_stepping);
  }
  fail(newton, outcome);
}

BiasResult describe_operating_point(const mna::System& system, const std::vector<double>& x,
                                    const OperatingPoint& how) {
  BiasResult result;
  result.converged = true;
  result.newton_iterations = how.newton_iterations;
  result.method = how.method;
  result.reciprocal_condition = how.reciprocal_condition;
  result.temperature = system.temperature();

  const auto& topology = system.topology();
  for (mna::Index i = 1; i <= system.size(); ++i) {
    if (topology.kind(i) == mna::Topology::Kind::node) {
      result.node_voltages.emplace_back(topology.name(i), x[i]);
    }
  }

  const mna::EvalRequest at = system.request(x.data());
  mna::OperatingPointReport report;
  for (const auto& device : system.devices()) {
    device->report(at, report);
    if (const auto current = device->reported_current(at)) {
      result.element_currents.emplace_back(device->name() + ".current", *current);
    }
    if (const auto* v = dynamic_cast<const devices::VoltageSourceDevice*>(device.get())) {
      const double i = x[v->branch()];
      result.supplies.push_back({v->name(), i, i * (x[v->p()] - x[v->n()])});
    } else if (const auto* c = dynamic_cast<const devices::CurrentSourceDevice*>(device.get())) {
      const double i = c->value().at(at);
      result.supplies.push_back({c->name(), i, i * (x[c->b()] - x[c->a()])});
    }
  }
  result.bipolars = std::move(report.bipolars);
  result.diodes = std::move(report.diodes);

  mna::Workspace w = system.make_workspace();
  system.evaluate(at, w);
  for (mna::Index i = 1; i <= system.size(); ++i) {
    if (topology.is_voltage(i)) {
      result.max_kcl_residual = std::max(result.max_kcl_residual, std::abs(w.f[i]));
    }
  }
  return result;
}

}  // namespace stage::analysis
