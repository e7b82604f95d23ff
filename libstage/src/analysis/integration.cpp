// Coefficients and error constants of backward Euler, the trapezoidal rule
// and variable-step BDF2.
//
// References: the variable-step BDF2 coefficients and its error constant
// follow from differentiating the quadratic through (t_{n-1}, t_n, t_{n+1})
// (Hairer, Nørsett & Wanner, "Solving ODEs I", section III.5); the
// trapezoidal error -h^3/12 q''' and backward Euler's -h^2/2 q'' are the
// classical ones (same book, section II.7 and III.2).
#include "analysis/integration.hpp"

namespace stage::analysis {

StepFormula step_formula(Formula formula, double h, double h_prev) {
  StepFormula s;
  switch (formula) {
    case Formula::backward_euler:
      s.a = 1.0 / h;
      s.c_n = -1.0 / h;
      s.order = 1;
      // Predictor (explicit Euler) error h^2/2 q'', formula error h^2/2 q''.
      s.error_fraction = 0.5;
      break;
    case Formula::trapezoidal: {
      s.a = 2.0 / h;
      s.c_n = -2.0 / h;
      s.c_dot = -1.0;
      s.order = 2;
      const double predictor = h * h * (h + h_prev) / 6.0;
      const double formula_error = h * h * h / 12.0;
      s.error_fraction = formula_error / (predictor + formula_error);
      break;
    }
    case Formula::bdf2: {
      const double w = h / h_prev;
      s.a = (1.0 + 2.0 * w) / ((1.0 + w) * h);
      s.c_n = -(1.0 + w) / h;
      s.c_prev = w * w / ((1.0 + w) * h);
      s.order = 2;
      // The interpolant's slope error h (h + h_prev) q'''/6, divided by a:
      // 2 h^3 / 9 at a constant step, the textbook BDF2 constant.
      const double predictor = h * h * (h + h_prev) / 6.0;
      const double formula_error = h * h * (h + h_prev) * (h + h_prev) / (6.0 * (2.0 * h + h_prev));
      s.error_fraction = formula_error / (predictor + formula_error);
      break;
    }
  }
  return s;
}

double predict_charge(int order, double h, double h_prev, double q_n, double qdot_n,
                      double q_prev) {
  if (order == 1) return q_n + h * qdot_n;
  const double curvature = (q_prev - q_n + qdot_n * h_prev) / (h_prev * h_prev);
  return q_n + h * qdot_n + curvature * h * h;
}

void extrapolation_weights(std::span<const double> times, double t, std::span<double> weights) {
  for (std::size_t i = 0; i < times.size(); ++i) {
    double w = 1.0;
    for (std::size_t j = 0; j < times.size(); ++j) {
      if (j != i) w *= (t - times[j]) / (times[i] - times[j]);
    }
    weights[i] = w;
  }
}

void derivative_weights(std::span<const double> times, double t, std::span<double> weights) {
  // d/dt of the Lagrange basis polynomial l_i = prod_{j != i} (t - t_j) / (t_i - t_j).
  for (std::size_t i = 0; i < times.size(); ++i) {
    double denominator = 1.0, sum = 0.0;
    for (std::size_t j = 0; j < times.size(); ++j) {
      if (j == i) continue;
      denominator *= times[i] - times[j];
      double product = 1.0;
      for (std::size_t k = 0; k < times.size(); ++k) {
        if (k != i && k != j) product *= t - times[k];
      }
      sum += product;
    }
    weights[i] = sum / denominator;
  }
}

}  // namespace stage::analysis
