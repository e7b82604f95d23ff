// Integration formulas of a transient step, written on charges (and
// inductor fluxes) rather than on C dv/dt, so that charge is conserved when
// capacitance depends on voltage.
//
// Each formula gives the charge derivative at the new point as
//   q'_{n+1} = a q_{n+1} + c_n q_n + c_prev q_{n-1} + c_dot q'_n,
// so a step solves f(x) + a q(x) + h = 0 with the history
//   h = c_n q_n + c_prev q_{n-1} + c_dot q'_n,
// which is NewtonProblem's reactive_scale and reactive_history.
//
// The local truncation error comes from the difference between the solved
// charge and a predictor of the same order (Milne's device): if the
// predictor's error is P q^(p+1) and the formula's is -E q^(p+1), then
// q_solved - q_predicted = (P + E) q^(p+1) and the step's error is
// E / (P + E) of that difference.
#pragma once

#include <span>

namespace stage::analysis {

enum class Formula { backward_euler, trapezoidal, bdf2 };

struct StepFormula {
  double a = 0, c_n = 0, c_prev = 0, c_dot = 0;
  int order = 1;
  double error_fraction = 0;  // E / (P + E) above
};

// Step h from t_n to t_{n+1}; h_prev = t_n - t_{n-1} (unused by backward Euler).
StepFormula step_formula(Formula formula, double h, double h_prev);

// The charge predictor whose error the formula's is compared with: explicit
// Euler for order 1; for order 2 the quadratic through q_n with slope q'_n
// and through q_{n-1} (Hermite), which needs only one step of history.
double predict_charge(int order, double h, double h_prev, double q_n, double qdot_n, double q_prev);

// Lagrange weights that extrapolate samples taken at `times` (1 to 3 of
// them) to time t: the Newton predictor of a step.
void extrapolation_weights(std::span<const double> times, double t, std::span<double> weights);

}  // namespace stage::analysis
