// Newton–Raphson on the MNA residual, shared by every analysis.
//
// Solves  F(x) = f(x) + a q(x) + h + shunt x_v = 0  with Jacobian
//         J    = G    + a C    + shunt I_v
// where a and h are the integration formula's coefficient and history (zero
// at DC) and shunt is a homotopy conductance from each voltage unknown to
// ground. Convergence needs both a small update (relative plus absolute
// tolerance of the unknown's kind: V, A or K) and a small residual (KCL at
// nodes, the branch equation on a branch current, the heat balance on a
// temperature, each against the absolute tolerance of what it sums plus the
// relative one of the terms that meet there); a residual down at rounding
// level in its own terms stands for the update. The absolute tolerances
// are laid out per row once (analysis/tolerances.hpp).
// Failure is recoverable (status), never an exception: the caller decides
// whether to step a homotopy, shrink a time step, or give up.
#pragma once

#include <vector>

#include "analysis/tolerances.hpp"
#include "mna/sparse_lu.hpp"
#include "mna/system.hpp"
#include "stage/solver.hpp"

namespace stage::analysis {

struct NewtonProblem {
  mna::EvalRequest request;                  // x is filled in by the solver
  double reactive_scale = 0;                 // a
  const double* reactive_history = nullptr;  // h, n + 1 entries (or null)
  double shunt = 0;
  int max_iterations = SolverOptions{}.max_newton_iterations;
};

// not_converged and diverged are recoverable (a homotopy step or a shorter
// time step may still succeed); diverged means an unknown or a residual left
// the finite numbers, so the iteration stopped there.
enum class NewtonStatus { converged, not_converged, singular, diverged };

struct NewtonOutcome {
  NewtonStatus status = NewtonStatus::not_converged;
  int iterations = 0;  // linear solves done
  // The unknown behind a singular pivot or the first non-finite value.
  mna::Index culprit = mna::kGroundIndex;
};

class NewtonSolver {
 public:
  NewtonSolver(const mna::System& system, const SolverOptions& options);

  // Iterates from x (n + 1 entries, x[0] = 0) in place.
  NewtonOutcome solve(std::vector<double>& x, const NewtonProblem& problem);

  // The evaluation at the last point visited (the solution after success).
  const mna::Workspace& workspace() const { return work_; }
  // Residual F and last update of the last iteration, for failure messages.
  const std::vector<double>& residual() const { return residual_; }
  const std::vector<double>& last_update() const { return update_; }
  const mna::System& system() const { return system_; }
  const SolverOptions& options() const { return options_; }
  // The absolute tolerance of each unknown and of its row, by its kind.
  const AbsoluteTolerances& tolerances() const { return tolerances_; }
  // Numeric factorisations done (full and refactorisations); an iteration
  // whose Jacobian equals the last factored one reuses it (a linear circuit
  // at a constant time step never refactors).
  int factorizations() const { return lu_.full_factorizations() + lu_.refactorizations(); }
  mna::SparseLu<double>& lu() { return lu_; }

 private:
  void assemble(const NewtonProblem& problem, const std::vector<double>& x);
  const std::vector<double>& row_scale(const std::vector<double>& x);
  bool residual_small(const std::vector<double>& x);
  bool residual_at_rounding(const std::vector<double>& x);
  bool update_small(const std::vector<double>& x) const;
  mna::Index first_non_finite(const std::vector<double>& x) const;

  const mna::System& system_;
  SolverOptions options_;
  AbsoluteTolerances tolerances_;
  mna::Workspace work_;
  std::vector<double> jacobian_;  // nnz + 1
  std::vector<double> factored_;  // the Jacobian behind lu_'s current factors
  bool factored_valid_ = false;
  // What a linear system's Jacobian was made of: the constant stamp's
  // version (Workspace::stamp_version), a and the shunt. While they hold,
  // jacobian_ and the factors stand and are neither rebuilt nor compared.
  struct LinearKey {
    int stamp_version = -1;
    double reactive_scale = 0, shunt = 0;
    bool operator==(const LinearKey&) const = default;
  };
  LinearKey jacobian_key_, factored_key_;
  std::vector<double> residual_;  // n + 1
  std::vector<double> update_;    // n + 1
  std::vector<double> scale_;     // n + 1: size of the terms meeting in each row
  bool scale_ready_ = false;      // scale_ belongs to the last assembly
  mna::SparseLu<double> lu_;
};

}  // namespace stage::analysis
