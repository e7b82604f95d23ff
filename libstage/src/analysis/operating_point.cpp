// DC operating point: plain Newton, then conductance stepping, then source
// stepping (the classic homotopies for circuits that will not start cold),
// and the report of the solution.
#include "analysis/operating_point.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <string_view>

#include "analysis/model_range.hpp"
#include "analysis/tolerances.hpp"
#include "common/si_format.hpp"
#include "mna/rating_log.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

// Tuning of the homotopies: our own choices, each for the reason beside it.
//
// Conductance stepping (S unless said otherwise):
// 100 ohm to ground at every node: the order of a stage's own resistors and
// of a junction at a milliampere, so the first solve is nearly linear yet
// close to the circuit's.
constexpr double kFirstConductance = 1e-2;
// 0.1 ohm at every node: a circuit that fails even so is not helped by more.
constexpr double kLargestConductance = 10;
// A decade per step at most, so each solve starts near the last solution.
constexpr double kMaxStepRatio = 10;
// Below a step ratio of 1 % the walk no longer gets anywhere: give up.
constexpr double kSmallestStepRatio = 1.01;
// The last conductance tried before it is removed when minimum_conductance
// is 0, so that the descent ends: 1 Pohm, three decades below the default.
constexpr double kSmallestConductance = 1e-15;
//
// Source stepping (fractions of every independent source's value):
// The first step: small enough that every junction starts near off.
constexpr double kFirstSourceStep = 0.1;
// At least four steps from zero to full, each starting near the last.
constexpr double kLargestSourceStep = 0.25;
// After a success the step grows gently, after a failure it shrinks
// sharply, so a hard stretch is not overshot again at once.
constexpr double kSourceStepGrowth = 1.5;
constexpr double kSourceStepShrink = 4;
// A step this small moves nothing: the sources have met a fold, past which
// the circuit has no solution.
constexpr double kSmallestSourceStep = 1e-7;
//
// Either homotopy's solves at most: bounds its work however its steps go.
constexpr int kMaxHomotopySteps = 400;

// A reciprocal condition below this is near double precision's rounding
// (1e-16): the bias point is barely determined and its result says so.
constexpr double kNearlySingular = 1e-14;

NewtonProblem dc_problem(const NewtonSolver& newton, double shunt, double source_scale) {
  NewtonProblem p;
  p.request = newton.system().request(nullptr);
  p.request.source_scale = source_scale;
  p.shunt = shunt;
  p.max_iterations = newton.options().max_newton_iterations;
  return p;
}

// What the row of an unknown of this kind says, for messages.
std::string_view row_equation(mna::UnknownKind kind) {
  switch (kind) {
    case mna::UnknownKind::voltage:
      return "KCL";
    case mna::UnknownKind::current:
      return "branch";
    case mna::UnknownKind::temperature:
      return "heat balance";
  }
  return "KCL";
}

// What to look for when an unknown of this kind runs away.
std::string_view runaway_hint(mna::UnknownKind kind) {
  return kind == mna::UnknownKind::temperature
             ? "does heat flow in faster than anything can carry it away?"
             : "does a source force a current or voltage that nothing in the circuit can carry?";
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
  const double floor = std::max(newton.options().minimum_conductance, kSmallestConductance);
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
    if (factor < kSmallestStepRatio) return false;
    shunt = std::max(*good_shunt / factor, floor);
  }
  return false;
}

// Raises every independent source from zero to its full value; `reached`
// is the largest fraction solved.
bool source_stepping(NewtonSolver& newton, std::vector<double>& x, int& iterations,
                     double& reached) {
  std::fill(x.begin(), x.end(), 0.0);
  reset_limiting(newton.system());
  std::vector<double> good = x;
  double scale = 0.0, step = kFirstSourceStep;
  for (int k = 0; k < kMaxHomotopySteps; ++k) {
    const double target = std::min(1.0, scale + step);
    const auto outcome = newton.solve(x, dc_problem(newton, 0.0, target));
    iterations += outcome.iterations;
    spdlog::debug("source stepping: {:.4g} {}", target,
                  outcome.status == NewtonStatus::converged ? "converged" : "failed");
    if (outcome.status == NewtonStatus::converged) {
      good = x;
      scale = reached = target;
      if (scale >= 1.0) return true;
      step = std::min(kLargestSourceStep, step * kSourceStepGrowth);
    } else {
      x = good;
      reset_limiting(newton.system());
      step /= kSourceStepShrink;
      if (step < kSmallestSourceStep) return false;
    }
  }
  return false;
}

// What the plain Newton attempt saw when it failed. Its last iterate tells
// where the circuit runs away; the homotopies end on tiny steps that say
// little.
struct FailedAttempt {
  NewtonOutcome outcome;
  std::vector<double> x, update;
};

// The unknown the attempt blames: the first non-finite one, else the one
// that moved most in the last iteration.
mna::Index runaway_unknown(const FailedAttempt& attempt) {
  if (attempt.outcome.status == NewtonStatus::diverged) return attempt.outcome.culprit;
  mna::Index worst = 1;
  for (std::size_t i = 1; i < attempt.update.size(); ++i) {
    if (std::abs(attempt.update[i]) > std::abs(attempt.update[worst])) {
      worst = static_cast<mna::Index>(i);
    }
  }
  return worst;
}

[[noreturn]] void fail(const mna::System& system, const FailedAttempt& attempt,
                       double source_fraction) {
  const auto& topology = system.topology();
  if (attempt.outcome.status == NewtonStatus::singular) {
    const std::string name = topology.name(attempt.outcome.culprit);
    throw NumericalError(ErrorKind::singular,
                         "the DC system is singular at '" + name +
                             "': no unique operating point (check for a node held by nothing "
                             "but junctions in cutoff or by controlled sources alone)",
                         {name});
  }
  const mna::Index i = runaway_unknown(attempt);
  const std::string name = topology.name(i);
  const std::string quantity = topology.description(i);
  const std::string how = std::isfinite(attempt.x[i]) && std::isfinite(attempt.update[i])
                              ? fmt::format("{} ran to {:.4g} (last change {:.3g})", quantity,
                                            attempt.x[i], attempt.update[i])
                              : quantity + " left the finite numbers";
  const auto elements = system.elements_at(i);
  std::string message = "no DC operating point: in plain Newton " + how +
                        "; conductance stepping and source stepping failed too";
  if (source_fraction > 0) {
    message +=
        fmt::format(" (the circuit solves with its sources at up to {:.3g} % of their values)",
                    100 * source_fraction);
  }
  message += ". Elements at '" + name + "': " + text::joined(elements) + " (" +
             std::string(runaway_hint(topology.kind(i))) + ")";
  std::vector<std::string> involved{name};
  involved.insert(involved.end(), elements.begin(), elements.end());
  throw NumericalError(ErrorKind::no_convergence, message, involved);
}

}  // namespace

std::vector<std::string> verify_operating_point(const mna::System& system,
                                                const SolverOptions& options,
                                                const std::vector<double>& x) {
  const auto& topology = system.topology();
  mna::Workspace w = system.make_workspace();
  system.evaluate(system.request(x.data()), w);
  // KCL at every node (the branch equation on a branch current, the heat
  // balance on a temperature) against the tolerance Newton converged to:
  // the absolute tolerance of the row's kind plus the relative tolerance
  // times the size of the terms meeting in that row.
  std::vector<double> scale(x.size(), 0.0);
  const auto& pattern = system.pattern();
  for (int col = 0; col < pattern.n; ++col) {
    for (int s = pattern.column_start[col]; s < pattern.column_start[col + 1]; ++s) {
      scale[pattern.row[s] + 1] += std::abs(w.g[s] * x[col + 1]);
    }
  }
  for (mna::Index i = 1; i <= system.size(); ++i) {
    const mna::UnknownKind kind = topology.kind(i);
    const double allowed =
        residual_tolerance(kind, options) + options.relative_tolerance * scale[i];
    if (!std::isfinite(x[i]) || !(std::abs(w.f[i]) <= allowed)) {
      const std::string name = topology.name(i);
      throw NumericalError(
          ErrorKind::no_convergence,
          fmt::format("the DC solution fails its check at '{}': value {:.4g}, {} residual {:.3g} "
                      "against an allowed {:.3g}",
                      name, x[i], row_equation(kind), w.f[i], allowed),
          {name});
    }
  }
  return check_model_ranges(system, system.request(x.data()),
                            "no DC operating point within the device models");
}

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
    how.warnings = verify_operating_point(newton.system(), newton.options(), x);
    if (how.reciprocal_condition < kNearlySingular) {
      how.warnings.push_back(
          fmt::format("the bias point is nearly singular (reciprocal condition {:.2g}): a node may "
                      "hang on nothing but junctions in cutoff",
                      how.reciprocal_condition));
    }
    return how;
  };
  if (outcome.status == NewtonStatus::converged) return finish(BiasMethod::newton);
  const FailedAttempt plain{outcome, x, newton.last_update()};
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
  double source_fraction = 0;
  if (source_stepping(newton, x, how.newton_iterations, source_fraction)) {
    return finish(BiasMethod::source_stepping);
  }
  fail(newton.system(), plain, source_fraction);
}

BiasResult describe_operating_point(const mna::System& system, const std::vector<double>& x,
                                    const OperatingPoint& how) {
  BiasResult result;
  result.converged = true;
  result.newton_iterations = how.newton_iterations;
  result.method = how.method;
  result.reciprocal_condition = how.reciprocal_condition;
  result.warnings = how.warnings;
  result.temperature = system.temperature();

  const auto& topology = system.topology();
  for (mna::Index i = 1; i <= system.size(); ++i) {
    if (topology.is_circuit_node(i)) result.node_voltages.emplace_back(topology.name(i), x[i]);
    if (topology.kind(i) == mna::UnknownKind::temperature) {
      result.element_temperatures.emplace_back(topology.name(i), x[i]);
    }
  }

  const mna::EvalRequest at = system.request(x.data());
  mna::RatingLog ratings;
  for (const auto& device : system.devices()) {
    device->report(at, result);
    device->check_ratings(at, std::numeric_limits<double>::quiet_NaN(), ratings);
    if (const auto current = device->reported_current(at)) {
      result.element_currents.emplace_back(device->name() + ".current", *current);
    }
    if (const mna::SourceAccess* source = device->source()) {
      result.supplies.push_back(
          {device->name(), source->delivered_current(at), source->delivered_power(at)});
    }
  }
  result.rating_violations = ratings.violations();
  mna::Workspace w = system.make_workspace();
  system.evaluate(at, w);
  for (mna::Index i = 1; i <= system.size(); ++i) {
    if (topology.kind(i) == mna::UnknownKind::voltage) {
      result.max_kcl_residual = std::max(result.max_kcl_residual, std::abs(w.f[i]));
    }
  }
  return result;
}

}  // namespace stage::analysis
