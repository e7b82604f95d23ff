// Fitting model parameters to curves with the Levenberg–Marquardt solver of
// Eigen's unsupported module. The residuals are every measured value of
// every curve weighted by its tolerance (residuals.hpp), so a curve with a
// tight tolerance pulls harder; the parameters are scaled (fit_parameters.hpp).
// The Jacobian is by central differences in the scaled parameters, since
// each residual is a converged Newton solution with no derivative of its own.
// Parameter uncertainty is the usual linearised estimate at the optimum:
// covariance = s² (JᵀJ)⁻¹ with s² = |r|² / (m - n), mapped back through the
// scale's derivative.
#include <Eigen/Dense>
#include <cmath>
#include <unsupported/Eigen/LevenbergMarquardt>

#include "curves/fit_parameters.hpp"
#include "curves/fixtures.hpp"
#include "curves/residuals.hpp"
#include "stage/errors.hpp"

namespace stage {
namespace {

using curves::FitParameter;

// A residual where the simulator found no solution: far out of tolerance, so
// Levenberg–Marquardt rejects the step and shortens it.
constexpr double kFailedResidual = 1e3;

struct CurveResiduals : Eigen::DenseFunctor<double> {
  CurveResiduals(const DeviceModel& start, std::span<const Curve> curves,
                 const std::vector<FitParameter>& parameters, int values, double step)
      : DenseFunctor(static_cast<int>(parameters.size()), values),
        start_(start),
        curves_(curves),
        parameters_(parameters),
        step_(step) {}

  DeviceModel model_at(const InputType& u) const {
    DeviceModel model = start_;
    for (std::size_t j = 0; j < parameters_.size(); ++j) {
      parameters_[j].set(model, parameters_[j].from_scaled(u[static_cast<Eigen::Index>(j)]));
    }
    return model;
  }

  int operator()(const InputType& u, ValueType& r) const {
    ++evaluations;
    const DeviceModel model = model_at(u);
    Eigen::Index i = 0;
    for (const Curve& curve : curves_) {
      std::vector<std::vector<double>> values;
      try {
        values = curves::simulate(curve, model);
      } catch (const NumericalError&) {
        const auto n = static_cast<Eigen::Index>(curve.points.size() * curve.measured.size());
        r.segment(i, n).setConstant(kFailedResidual);
        i += n;
        continue;
      }
      for (std::size_t k = 0; k < curve.measured.size(); ++k) {
        const bool by_ratio = compared_by_ratio(curve.measured[k]);
        const bool log_scale = curves::spans_decades(curve, k);
        const double tolerance = curve.tolerance(curve.measured[k]);
        for (std::size_t p = 0; p < curve.points.size(); ++p) {
          r[i++] = curves::weighted_residual(curve.points[p].measured[k], values[p][k], tolerance,
                                             by_ratio, log_scale);
        }
      }
    }
    return 0;
  }

  int df(const InputType& u, JacobianType& jacobian) const {
    ValueType plus(values()), minus(values());
    for (Eigen::Index j = 0; j < u.size(); ++j) {
      InputType shifted = u;
      shifted[j] = u[j] + step_;
      (*this)(shifted, plus);
      shifted[j] = u[j] - step_;
      (*this)(shifted, minus);
      jacobian.col(j) = (plus - minus) / (2 * step_);
    }
    return 0;
  }

  mutable int evaluations = 0;

 private:
  const DeviceModel& start_;
  std::span<const Curve> curves_;
  const std::vector<FitParameter>& parameters_;
  double step_;
};

std::string stop_reason(Eigen::LevenbergMarquardtSpace::Status status) {
  using S = Eigen::LevenbergMarquardtSpace::Status;
  switch (status) {
    case S::RelativeReductionTooSmall:
      return "the cost stopped decreasing";
    case S::RelativeErrorTooSmall:
      return "the parameters stopped changing";
    case S::RelativeErrorAndReductionTooSmall:
      return "cost and parameters stopped changing";
    case S::CosinusTooSmall:
      return "the residuals are orthogonal to the Jacobian";
    case S::TooManyFunctionEvaluation:
      return "too many evaluations";
    case S::FtolTooSmall:
    case S::XtolTooSmall:
    case S::GtolTooSmall:
      return "at the limit of numerical precision";
    case S::ImproperInputParameters:
      return "improper input (fewer residuals than parameters?)";
    default:
      return "stopped";
  }
}

bool converged(Eigen::LevenbergMarquardtSpace::Status status) {
  using S = Eigen::LevenbergMarquardtSpace::Status;
  return status != S::TooManyFunctionEvaluation && status != S::ImproperInputParameters &&
         status != S::UserAsked && status > 0;
}

}  // namespace

FitResult fit_model(const DeviceModel& start, std::span<const Curve> curves,
                    std::span<const std::string> parameter_names, const FitOptions& options) {
  std::vector<FitParameter> parameters;
  for (const auto& name : parameter_names) parameters.emplace_back(start, name);
  int values = 0;
  for (const Curve& c : curves) values += static_cast<int>(c.points.size() * c.measured.size());
  const auto n = static_cast<Eigen::Index>(parameters.size());
  if (n == 0 || values <= n) {
    throw InputError({"--params", 0, 0},
                     "a fit needs at least one parameter and more measured values (" +
                         std::to_string(values) + ") than parameters (" + std::to_string(n) + ")");
  }

  CurveResiduals residuals(start, curves, parameters, values, options.relative_step);
  Eigen::VectorXd u(n);
  for (Eigen::Index j = 0; j < n; ++j) u[j] = parameters[j].to_scaled(parameters[j].get(start));
  Eigen::VectorXd r(values);
  residuals(u, r);

  FitResult result;
  result.start_cost = r.squaredNorm();
  Eigen::LevenbergMarquardt<CurveResiduals> lm(residuals);
  lm.setMaxfev(options.max_evaluations);
  // The first step is bounded by the size of the scaled start (Moré's
  // "factor"); 1 rather than the default 100 keeps log-scaled parameters
  // from jumping tens of decades into a region where the model has no
  // solution.
  lm.setFactor(1);  // with u = 0 at the start (fit_parameters.hpp): a first step of order 1
  const auto status = lm.minimize(u);
  result.stop_reason = stop_reason(status);
  result.converged = converged(status);

  Eigen::MatrixXd jacobian(values, n);
  residuals(u, r);
  residuals.df(u, jacobian);
  result.final_cost = r.squaredNorm();
  result.residual_count = values;
  result.evaluations = residuals.evaluations;
  result.model = residuals.model_at(u);

  const double s2 = result.final_cost / static_cast<double>(values - n);
  const Eigen::MatrixXd normal = jacobian.transpose() * jacobian;
  const Eigen::FullPivLU<Eigen::MatrixXd> lu(normal);
  const Eigen::MatrixXd covariance = lu.isInvertible() ? Eigen::MatrixXd(s2 * lu.inverse())
                                                       : Eigen::MatrixXd::Constant(n, n, INFINITY);
  for (Eigen::Index j = 0; j < n; ++j) {
    const FitParameter& p = parameters[static_cast<std::size_t>(j)];
    result.parameters.push_back({p.name(), p.quantity(), p.get(start), p.from_scaled(u[j]),
                                 p.derivative(u[j]) * std::sqrt(covariance(j, j)), p.log_scale(),
                                 p.bounds()});
  }
  for (const Curve& c : curves) result.residuals.push_back(check_curve(c, result.model));
  return result;
}

}  // namespace stage
