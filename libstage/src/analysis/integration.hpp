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
//
// TR-BDF2 is two such solves per step with the same coefficient a (so the
// same Jacobian form), and its error estimate comes from an embedded
// third-order companion instead (TrBdf2 below).
#pragma once

#include <numbers>
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

// TR-BDF2 (Bank, Coughran, Fichtner, Grosse, Rose & Smith, IEEE Trans. CAD
// 4(4), 1985) written as the three-stage singly diagonally implicit
// Runge–Kutta method of Hosea & Shampine ("Analysis and implementation of
// TR-BDF2", Appl. Numer. Math. 20, 1996), on charges:
//   stage 1 (trapezoidal rule to t_n + gamma h):
//     q_g     = q_n + h d (q'_n + q'_g)
//   stage 2 (BDF2 through t_n, t_n + gamma h, t_n + h):
//     q_{n+1} = q_n + h (w q'_n + w q'_g + d q'_{n+1})
// with gamma = 2 - sqrt 2, d = gamma / 2, w = (1 - d) / 2. Both stages are
// the solve above with the same a = 1 / (d h), so the same Jacobian. The local error estimate is
// the difference from the embedded third-order solution with weights
// ((1 - w)/3, (3w + 1)/3, d/3) (Hosea & Shampine, section 3):
//   est = h ((1 - 4w)/3 q'_n + 1/3 q'_g - 2d/3 q'_{n+1}).
// L-stable: the amplification factor tends to 0 as h lambda -> -infinity,
// so a nearly algebraic charge cannot ring.
struct TrBdf2 {
  static constexpr double gamma = 2.0 - std::numbers::sqrt2;
  static constexpr double d = gamma / 2.0;
  static constexpr double w = (1.0 - d) / 2.0;
  // Weights of q'_n, q'_g and q'_{n+1} in the error estimate (times h).
  static constexpr double error_n = (1.0 - 4.0 * w) / 3.0;
  static constexpr double error_stage = 1.0 / 3.0;
  static constexpr double error_new = -2.0 * d / 3.0;
};

// The charge predictor whose error the formula's is compared with: explicit
// Euler for order 1; for order 2 the quadratic through q_n with slope q'_n
// and through q_{n-1} (Hermite), which needs only one step of history.
double predict_charge(int order, double h, double h_prev, double q_n, double qdot_n, double q_prev);

// Lagrange weights that extrapolate samples taken at `times` (1 to 3 of
// them) to time t: the Newton predictor of a step.
void extrapolation_weights(std::span<const double> times, double t, std::span<double> weights);

// Weights that give the time derivative at t of the polynomial through
// samples at `times` (2 or 3 of them): the slope of a step's own polynomial
// at its ends, for interpolating the recorded signals.
void derivative_weights(std::span<const double> times, double t, std::span<double> weights);

}  // namespace stage::analysis
