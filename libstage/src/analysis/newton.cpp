// Newton iteration with the sparse LU reused across iterations.
#include "analysis/newton.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace stage::analysis {

NewtonSolver::NewtonSolver(const mna::System& system, const SolverOptions& options)
    : system_(system),
      options_(options),
      tolerances_(absolute_tolerances(system.topology(), options)),
      work_(system.make_workspace()),
      jacobian_(work_.g.size()),
      factored_(work_.g.size()),
      residual_(work_.f.size()),
      update_(work_.f.size()),
      scale_(work_.f.size()),
      lu_(system.pattern()) {}

void NewtonSolver::assemble(const NewtonProblem& p, const std::vector<double>& x) {
  const std::size_t n1 = residual_.size();
  const double a = p.reactive_scale;
  const LinearKey key{work_.stamp_version, a, p.shunt};
  const bool jacobian_stands = key.stamp_version >= 0 && key == jacobian_key_;
  jacobian_key_ = key;
  // Without a reactive part the evaluation left q and C unwritten (see
  // EvalRequest::charges): they are not read.
  if (!jacobian_stands) {
    for (std::size_t s = 0; s < jacobian_.size(); ++s)
      jacobian_[s] = a == 0 ? work_.g[s] : work_.g[s] + a * work_.c[s];
  }
  for (std::size_t i = 0; i < n1; ++i)
    residual_[i] = a == 0 ? work_.f[i] : work_.f[i] + a * work_.q[i];
  if (p.reactive_history != nullptr) {
    for (std::size_t i = 0; i < n1; ++i) residual_[i] += p.reactive_history[i];
  }
  if (p.shunt > 0) {
    const auto& topology = system_.topology();
    for (mna::Index i = 1; i < static_cast<mna::Index>(n1); ++i) {
      if (topology.kind(i) != mna::UnknownKind::voltage) continue;
      if (!jacobian_stands) jacobian_[system_.diagonal(i)] += p.shunt;
      residual_[i] += p.shunt * x[i];
    }
  }
  scale_ready_ = false;
}

// Row scale: sum over the row of |J_ij x_j|, the size of the currents
// (voltages, heat flows) that meet in that equation, for the relative
// residual tests; a pass over the whole matrix, made only when a test needs
// it.
const std::vector<double>& NewtonSolver::row_scale(const std::vector<double>& x) {
  if (scale_ready_) return scale_;
  const auto& pattern = system_.pattern();
  std::fill(scale_.begin(), scale_.end(), 0.0);
  for (int col = 0; col < pattern.n; ++col) {
    const double xc = std::abs(x[col + 1]);
    if (xc == 0.0) continue;
    for (int s = pattern.column_start[col]; s < pattern.column_start[col + 1]; ++s) {
      scale_[pattern.row[s] + 1] += std::abs(jacobian_[s]) * xc;
    }
  }
  scale_ready_ = true;
  return scale_;
}

// Every row within its absolute tolerance plus the relative one of its
// scale; rows within the absolute part alone (a converged linear solve's
// rounding, most rows near convergence) need no scale.
bool NewtonSolver::residual_small(const std::vector<double>& x) {
  const std::vector<double>& absolute = tolerances_.residual;
  const auto within_absolute = [&] {
    for (std::size_t i = 1; i < residual_.size(); ++i) {
      if (!(std::abs(residual_[i]) <= absolute[i])) return false;
    }
    return true;
  };
  if (within_absolute()) return true;
  const std::vector<double>& scale = row_scale(x);
  for (std::size_t i = 1; i < residual_.size(); ++i) {
    if (!(std::abs(residual_[i]) <= absolute[i] + options_.relative_tolerance * scale[i])) {
      return false;  // a NaN fails too
    }
  }
  return true;
}

// The residual is as small as rounding in its own terms allows: every row
// within a few units in the last place of the size of the terms that meet
// there. The update is then rounding noise of the solve and need not be
// small: with a large a C (a short time step across a large capacitor) that
// noise in a branch current can exceed its absolute tolerance however long
// Newton runs.
bool NewtonSolver::residual_at_rounding(const std::vector<double>& x) {
  constexpr double kUlps = 64;  // units in the last place, from memory: a sum of a few terms
  const double rounding = kUlps * std::numeric_limits<double>::epsilon();
  const std::vector<double>& scale = row_scale(x);
  for (std::size_t i = 1; i < residual_.size(); ++i) {
    if (!(std::abs(residual_[i]) <= rounding * scale[i])) return false;
  }
  return true;
}

bool NewtonSolver::update_small(const std::vector<double>& x) const {
  const std::vector<double>& absolute = tolerances_.unknown;
  for (std::size_t i = 1; i < update_.size(); ++i) {
    if (!(std::abs(update_[i]) <= absolute[i] + options_.relative_tolerance * std::abs(x[i]))) {
      return false;
    }
  }
  return true;
}

mna::Index NewtonSolver::first_non_finite(const std::vector<double>& x) const {
  for (std::size_t i = 1; i < x.size(); ++i) {
    if (!std::isfinite(x[i]) || !std::isfinite(residual_[i])) return static_cast<mna::Index>(i);
  }
  return mna::kGroundIndex;
}

NewtonOutcome NewtonSolver::solve(std::vector<double>& x, const NewtonProblem& problem) {
  NewtonOutcome outcome;
  mna::EvalRequest request = problem.request;
  request.x = x.data();
  request.charges = problem.reactive_scale != 0 || problem.reactive_history != nullptr;
  bool last_update_small = false;
  // A linear system is solved by one step from any start; from zero its
  // first evaluation skips the products (only the excitations remain), so
  // each solve costs one product with G and C, the one that confirms it.
  if (!system_.nonlinear()) std::fill(x.begin(), x.end(), 0.0);
  for (int iteration = 0;; ++iteration) {
    request.limit = iteration > 0;
    system_.evaluate(request, work_);
    assemble(problem, x);
    if (const mna::Index bad = first_non_finite(x); bad != mna::kGroundIndex) {
      outcome.status = NewtonStatus::diverged;
      outcome.culprit = bad;
      return outcome;
    }
    if (iteration > 0 && !work_.limited && residual_small(x) &&
        (last_update_small || residual_at_rounding(x))) {
      outcome.status = NewtonStatus::converged;
      return outcome;
    }
    if (iteration >= problem.max_iterations) return outcome;
    const bool same_linear_jacobian =
        jacobian_key_.stamp_version >= 0 && factored_valid_ && jacobian_key_ == factored_key_;
    if (!same_linear_jacobian && (!factored_valid_ || jacobian_ != factored_)) {
      factored_valid_ = lu_.factor(jacobian_.data());
      if (!factored_valid_) {
        outcome.status = NewtonStatus::singular;
        outcome.culprit = lu_.singular_column() + 1;
        return outcome;
      }
      factored_ = jacobian_;
      factored_key_ = jacobian_key_;
    }
    for (std::size_t i = 0; i < update_.size(); ++i) update_[i] = -residual_[i];
    lu_.solve(update_.data() + 1);
    update_[0] = 0.0;
    for (std::size_t i = 1; i < x.size(); ++i) x[i] += update_[i];
    ++outcome.iterations;
    last_update_small = update_small(x);
    // A linear system is solved exactly by one step: confirm the residual
    // at the new point without a second factorisation.
    if (!system_.nonlinear()) last_update_small = true;
  }
}

}  // namespace stage::analysis
