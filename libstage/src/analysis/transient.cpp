// The transient step loop: predictor, Newton corrector, error estimate from
// the charges, step control and breakpoints (see integration.hpp for the
// formulas and transient_start.cpp for the first point).
//
// Ringing. The trapezoidal rule's amplification factor tends to -1 for
// h lambda -> -infinity, so on a charge that is nearly algebraic (a junction
// capacitance behind a small resistance) any error flips sign every step
// without decaying, and the error estimate, comparing with a smooth
// predictor, may accept it or shrink the step without end. A trapezoidal
// step whose charge change is opposite to the last one, not smaller than
// kRingingDecay of it, and larger than the row's error tolerance is redone
// as one TR-BDF2 step of the same length: L-stable, it removes the
// oscillating part in one step while staying second order, where backward
// Euler would drop to first order and rejecting would only shrink the step
// (the ringing grows no weaker with h as long as h lambda is large).
//
// The same ringing hides in the charge derivative alone on a row whose
// charge is set by the nodes around it (a supply node's junction
// capacitances: the source's current takes up whatever q' says). There the
// trapezoidal rule's q'_{n+1} = 2 (q_{n+1} - q_n) / h - q'_n carries any
// error of q'_n on with factor -1 for ever while q stays smooth, and the
// error estimate, whose predictor starts from q'_n, sees h times it every
// step: the step can neither grow nor be rejected and stays where that
// error is a fixed fraction of the tolerance (a settled power-up held at
// 0.7 us steps where 0.4 ms would do). A trapezoidal step whose q' change is
// opposite to the last one for the second step running, not smaller than
// kRingingDecay of it, and moves the predictor (h times the change) by
// more than the row's tolerance, is damped the same way; TR-BDF2's q'_{n+1}
// depends on the charges alone, so one step removes it. Two alternations
// in a row, not one: a resolved oscillation's q' turns once at each
// extreme.
#include "analysis/transient.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <stdexcept>

#include "analysis/integration.hpp"
#include "analysis/model_range.hpp"
#include "analysis/signal_recorder.hpp"
#include "analysis/transient_start.hpp"
#include "mna/rating_log.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

// Step control constants, common practice in variable-step integrators:
constexpr double kSafety = 0.9;         // aim below the tolerance
constexpr double kMaxGrowth = 2.0;      // per accepted step
constexpr double kMinShrink = 0.1;      // per rejected step
constexpr double kGrowThreshold = 1.5;  // keep the step unless it can grow this much
                                        // (SUNDIALS CVODE's rule): a linear circuit
                                        // then keeps its factorisation
constexpr double kNewtonFailureShrink = 0.125;
constexpr int kStepIterations = 20;          // Newton iterations before the step is shrunk
constexpr double kDefaultStepsPerRun = 50;   // max_step = stop / 50 when not given
constexpr double kFirstStepFraction = 1e-2;  // of max_step, and of the gap after a corner
constexpr double kMinStepFraction = 1e-12;   // of stop: below this the run fails
constexpr double kSameStep = 1e-9;           // relative: a step this close counts as equal
// A charge change at least this fraction of the previous one, and opposite
// to it, does not decay the way a resolved oscillation's differences
// would: ringing (see above). The trapezoidal rule's factor is
// (1 + h lambda/2) / (1 - h lambda/2), below -1/2 in size once h lambda < -6.
constexpr double kRingingDecay = 0.5;

struct Point {
  double t = 0;
  double step = 0;  // the h that reached it: t differences would carry rounding into
                    // BDF2's step ratio and so into the Jacobian
  std::vector<double> x, q, qdot;
};

class Stepper {
 public:
  Stepper(NewtonSolver& newton, const TransientOptions& options, TransientResult& result,
          const StepObserver& observer, const std::vector<double>* bias_point,
          const std::vector<double>& landings)
      : system_(newton.system()),
        observer_(observer),
        landings_(landings),
        solver_(newton.options()),
        options_(options),
        result_(result),
        recorder_(system_, options.signals, options.from, result),
        newton_(newton),
        bias_point_(bias_point),
        factorizations_before_(newton.factorizations()) {
    for (const auto& d : system_.devices()) {
      if (d->rated()) rated_.push_back(d.get());
    }
  }

  void run();
  // The maximum ratings the run exceeded, over the recorded span.
  const std::vector<RatingViolation>& rating_violations() const { return ratings_.violations(); }

 private:
  enum class Outcome { accepted, error_too_large, newton_failed };
  Outcome attempt(double t_new, double h, double& error_ratio);
  // One solve of f(x) + a q(x) + history_ = 0 at time t from the predictor
  // through the points since the last corner (and `extra`, an inner stage).
  bool solve(double t, double a, const double* extra_time = nullptr,
             const std::vector<double>* extra_x = nullptr);
  Outcome attempt_single(Formula formula, double t_new, double h, double& ratio);
  Outcome attempt_tr_bdf2(double t_new, double h, double& ratio);
  bool rings(double h) const;
  void accept(double t_new, double h, bool at_corner);
  double row_tolerance(mna::Index i) const;
  double error_ratio(const StepFormula& formula, double h, double h_prev) const;
  [[noreturn]] void fail(double t, double h) const;

  // A time a step lands on exactly: a waveform's corner, where the formula
  // restarts, or a time a caller asked for, where it carries on.
  struct Landing {
    double t = 0;
    bool corner = false;
  };
  std::vector<Landing> landing_points(double stop, double min_step) const;

  const mna::System& system_;
  const StepObserver& observer_;
  const std::vector<double>& landings_;
  SolverOptions solver_;
  TransientOptions options_;
  TransientResult& result_;
  SignalRecorder recorder_;
  NewtonSolver& newton_;
  const std::vector<double>* bias_point_;  // the operating point, when already solved
  int factorizations_before_;              // the solver's count when this run began
  std::array<Point, 3> past_;              // newest first
  int since_breakpoint_ = 1;  // accepted points since the last corner, that one included
  std::vector<double> x_, history_, peak_, weights_;
  StepFormula formula_;
  // The accepted formula's shape (for the recorder) and TR-BDF2's inner
  // stage: its time, solution, charges and charge derivatives.
  StepShape shape_ = StepShape::line;
  bool damping_ = false;  // the step being tried replaces a ringing trapezoidal one
  double t_stage_ = 0;
  std::vector<double> x_stage_, q_stage_, qdot_stage_;
  std::vector<const mna::Device*> rated_;  // devices with maximum ratings, checked at each point
  mna::RatingLog ratings_;
};

// The corners of every device's waveform and the requested landings in
// (0, stop), in time order, then stop. Points closer than the minimum step
// are one point, a corner if either is.
std::vector<Stepper::Landing> Stepper::landing_points(double stop, double min_step) const {
  std::vector<double> corners;
  for (const auto& d : system_.devices()) d->corners(0.0, stop, corners);
  std::vector<Landing> points;
  for (double t : corners) points.push_back({t, true});
  for (double t : landings_) points.push_back({t, false});
  std::sort(points.begin(), points.end(), [](const Landing& a, const Landing& b) {
    return a.t < b.t || (a.t == b.t && a.corner > b.corner);
  });
  std::vector<Landing> merged;
  for (const Landing& p : points) {
    if (!(p.t > 0) || stop - p.t < min_step) continue;
    if (!merged.empty() && p.t - merged.back().t < min_step) {
      merged.back().corner = merged.back().corner || p.corner;
    } else {
      merged.push_back(p);
    }
  }
  merged.push_back({stop, true});
  return merged;
}

void Stepper::run() {
  const double stop = options_.stop;
  const double max_step = options_.max_step > 0 ? options_.max_step : stop / kDefaultStepsPerRun;
  const double min_step = kMinStepFraction * stop;
  const std::vector<Landing> breakpoints = landing_points(stop, min_step);

  StartPoint start = start_transient(newton_, options_.start, stop, bias_point_);
  result_.newton_iterations += start.newton_iterations;
  for (Point& p : past_) p = {0.0, 0.0, start.x, start.q, start.qdot};
  x_ = start.x;
  history_.assign(x_.size(), 0.0);
  peak_.resize(x_.size());
  for (std::size_t i = 0; i < x_.size(); ++i) peak_[i] = std::abs(start.q[i]);
  weights_.assign(3, 0.0);
  x_stage_ = q_stage_ = qdot_stage_ = x_;
  recorder_.start(0.0, start.x);
  if (observer_ && options_.from <= 0.0) observer_(0.0, start.x);

  std::size_t next = 0;  // next breakpoint
  double h = std::min(max_step, breakpoints.front().t) * kFirstStepFraction;
  while (next < breakpoints.size()) {
    const double t = past_[0].t;
    const double gap = breakpoints[next].t - t;
    h = std::min(h, max_step);
    // Land on the corner exactly; split the approach rather than leave a sliver.
    double step = h;
    bool lands = false;
    if (gap <= h * (1.0 + kSameStep)) {
      step = gap;
      lands = true;
    } else if (gap < 2.0 * h) {
      step = 0.5 * gap;
    }
    const double t_new = lands ? breakpoints[next].t : t + step;
    // A step equal to h up to rounding keeps h in the formula, and so the
    // Jacobian and its factorisation.
    if (std::abs(step - h) > kSameStep * h) h = step;

    double ratio = 0;
    const Outcome outcome = attempt(t_new, h, ratio);
    if (outcome != Outcome::accepted) {
      ++result_.rejected_steps;
      const double factor =
          outcome == Outcome::newton_failed
              ? kNewtonFailureShrink
              : std::max(kMinShrink, kSafety * std::pow(ratio, -1.0 / (formula_.order + 1)));
      if (outcome == Outcome::newton_failed) {
        for (const auto& d : system_.devices()) d->reset_limiting();
      }
      h *= factor;
      if (h < min_step) fail(t_new, h);
      continue;
    }
    const bool at_corner = lands && breakpoints[next].corner;
    accept(t_new, h, at_corner);
    const double grow =
        ratio > 0 ? std::min(kMaxGrowth, kSafety * std::pow(ratio, -1.0 / (formula_.order + 1)))
                  : kMaxGrowth;
    if (grow >= kGrowThreshold) h *= grow;
    if (lands) ++next;
    if (at_corner && next < breakpoints.size()) {
      h = std::min(h, kFirstStepFraction * 10.0 * (breakpoints[next].t - t_new));
    }
  }
  result_.factorizations = newton_.factorizations() - factorizations_before_;
}

Stepper::Outcome Stepper::attempt(double t_new, double h, double& ratio) {
  damping_ = false;
  if (since_breakpoint_ == 1) return attempt_single(Formula::backward_euler, t_new, h, ratio);
  switch (solver_.integration) {
    case Integration::tr_bdf2:
      return attempt_tr_bdf2(t_new, h, ratio);
    case Integration::bdf2:
      return attempt_single(Formula::bdf2, t_new, h, ratio);
    case Integration::trapezoidal: {
      const Outcome outcome = attempt_single(Formula::trapezoidal, t_new, h, ratio);
      if (outcome == Outcome::newton_failed || !rings(h)) return outcome;
      damping_ = true;
      return attempt_tr_bdf2(t_new, h, ratio);
    }
  }
  return Outcome::newton_failed;  // not reached: every method is handled above
}

bool Stepper::solve(double t, double a, const double* extra_time,
                    const std::vector<double>* extra_x) {
  // Predictor: the polynomial through the points since the last corner, and
  // the inner stage when there is one (then at most three points in all).
  const std::size_t extra = extra_time != nullptr ? 1 : 0;
  const std::size_t used = std::min<std::size_t>(since_breakpoint_, 3 - extra);
  std::array<double, 3> times{};
  for (std::size_t k = 0; k < used; ++k) times[k] = past_[k].t;
  if (extra) times[used] = *extra_time;
  const std::size_t points = used + extra;
  extrapolation_weights(std::span(times.data(), points), t, std::span(weights_.data(), points));
  for (std::size_t i = 0; i < x_.size(); ++i) {
    double v = extra ? weights_[used] * (*extra_x)[i] : 0.0;
    for (std::size_t k = 0; k < used; ++k) v += weights_[k] * past_[k].x[i];
    x_[i] = v;
  }

  NewtonProblem problem;
  problem.request = system_.request(nullptr);
  problem.request.dc = false;
  problem.request.time = t;
  problem.reactive_scale = a;
  problem.reactive_history = history_.data();
  problem.max_iterations = std::min(kStepIterations, solver_.max_newton_iterations);
  const auto outcome = newton_.solve(x_, problem);
  result_.newton_iterations += outcome.iterations;
  return outcome.status == NewtonStatus::converged;
}

Stepper::Outcome Stepper::attempt_single(Formula formula, double t_new, double h, double& ratio) {
  const Point& now = past_[0];
  const double h_prev = now.step;
  formula_ = step_formula(formula, h, h_prev);
  shape_ = formula == Formula::backward_euler ? StepShape::line : StepShape::through_previous_point;
  for (std::size_t i = 0; i < x_.size(); ++i) {
    history_[i] =
        formula_.c_n * now.q[i] + formula_.c_prev * past_[1].q[i] + formula_.c_dot * now.qdot[i];
  }
  if (!solve(t_new, formula_.a)) return Outcome::newton_failed;
  ratio = error_ratio(formula_, h, h_prev);
  return ratio <= 1.0 ? Outcome::accepted : Outcome::error_too_large;
}

// TR-BDF2's two stages (integration.hpp), both with a = 1 / (d h): the
// trapezoidal rule to t_n + gamma h, then BDF2 to t_n + h.
Stepper::Outcome Stepper::attempt_tr_bdf2(double t_new, double h, double& ratio) {
  const Point& now = past_[0];
  const double a = 1.0 / (TrBdf2::d * h);
  formula_ = {};
  formula_.a = a;
  formula_.order = 2;
  shape_ = StepShape::through_inner_stage;

  t_stage_ = now.t + TrBdf2::gamma * h;
  for (std::size_t i = 0; i < x_.size(); ++i) history_[i] = -a * now.q[i] - now.qdot[i];
  if (!solve(t_stage_, a)) return Outcome::newton_failed;
  x_stage_ = x_;
  q_stage_ = newton_.workspace().q;
  for (std::size_t i = 0; i < x_.size(); ++i) qdot_stage_[i] = a * q_stage_[i] + history_[i];

  for (std::size_t i = 0; i < x_.size(); ++i) {
    history_[i] = -a * (now.q[i] + h * TrBdf2::w * (now.qdot[i] + qdot_stage_[i]));
  }
  if (!solve(t_new, a, &t_stage_, &x_stage_)) return Outcome::newton_failed;

  const auto& q = newton_.workspace().q;
  double worst = 0;
  for (mna::Index i = 1; i <= system_.size(); ++i) {
    const double tolerance = row_tolerance(i);
    if (tolerance <= 0) continue;
    const double qdot_new = a * q[i] + history_[i];
    const double estimate =
        h * (TrBdf2::error_n * now.qdot[i] + TrBdf2::error_stage * qdot_stage_[i] +
             TrBdf2::error_new * qdot_new);
    worst = std::max(worst, std::abs(estimate) / tolerance);
  }
  ratio = worst;
  return ratio <= 1.0 ? Outcome::accepted : Outcome::error_too_large;
}

// The trapezoidal candidate of step h in the workspace against the last
// accepted steps (see the file comment): its charge changes, and its charge
// derivative's changes once three points since the last corner give two.
bool Stepper::rings(double h) const {
  const auto& q = newton_.workspace().q;
  const Point &now = past_[0], &before = past_[1], &earlier = past_[2];
  const bool derivative_history = since_breakpoint_ >= 3;
  const auto alternates = [](double change, double last_change) {
    return change * last_change < 0 && std::abs(change) >= kRingingDecay * std::abs(last_change);
  };
  for (mna::Index i = 1; i <= system_.size(); ++i) {
    const double tolerance = row_tolerance(i);
    const double change = q[i] - now.q[i], last_change = now.q[i] - before.q[i];
    if (alternates(change, last_change) && std::abs(change) > tolerance) return true;
    if (!derivative_history) continue;
    const double qdot = formula_.a * q[i] + history_[i];
    const double slope_change = qdot - now.qdot[i],
                 last_slope_change = now.qdot[i] - before.qdot[i];
    if (alternates(slope_change, last_slope_change) &&
        alternates(last_slope_change, before.qdot[i] - earlier.qdot[i]) &&
        h * std::abs(slope_change) > tolerance) {
      return true;
    }
  }
  return false;
}

// A row's error tolerance: relative to the largest the charge has been (so
// a charge passing through zero is not held to an absolute floor) plus the
// absolute tolerance of the row's unknown (a voltage, current or
// temperature) times the row's capacitance (inductance, heat capacity).
double Stepper::row_tolerance(mna::Index i) const {
  const auto& w = newton_.workspace();
  return solver_.relative_tolerance * std::max(std::abs(w.q[i]), peak_[i]) +
         newton_.tolerances().unknown[i] * std::abs(w.c[system_.diagonal(i)]);
}

// Largest local truncation error over the rows that hold charge, each over
// its tolerance.
double Stepper::error_ratio(const StepFormula& formula, double h, double h_prev) const {
  const Point& now = past_[0];
  const auto& w = newton_.workspace();
  double worst = 0;
  for (mna::Index i = 1; i <= system_.size(); ++i) {
    const double tolerance = row_tolerance(i);
    if (tolerance <= 0) continue;
    const double predicted =
        predict_charge(formula.order, h, h_prev, now.q[i], now.qdot[i], past_[1].q[i]);
    worst = std::max(worst, formula.error_fraction * std::abs(w.q[i] - predicted) / tolerance);
  }
  return worst;
}

void Stepper::accept(double t_new, double h, bool at_corner) {
  std::rotate(past_.begin(), past_.end() - 1, past_.end());
  Point& p = past_[0];
  const auto& q = newton_.workspace().q;
  p.t = t_new;
  p.step = h;
  p.x = x_;
  p.q = q;
  for (std::size_t i = 0; i < q.size(); ++i) {
    p.qdot[i] = formula_.a * q[i] + history_[i];
    peak_[i] = std::max(peak_[i], std::abs(q[i]));
  }
  if (newton_.workspace().beyond_model_range) {
    mna::EvalRequest at = system_.request(x_.data());
    at.dc = false;
    at.time = t_new;
    check_model_ranges(
        system_, at, fmt::format("the transient leaves the device models at t = {:.9g} s", t_new));
  }
  since_breakpoint_ = at_corner ? 1 : std::min(since_breakpoint_ + 1, 3);
  ++result_.accepted_steps;
  if (damping_) ++result_.damped_steps;
  recorder_.advance(t_new, x_, shape_, t_stage_, &x_stage_);
  if (!rated_.empty() && t_new >= options_.from) {
    mna::EvalRequest at = system_.request(x_.data());
    at.dc = false;
    at.time = t_new;
    for (const mna::Device* d : rated_) d->check_ratings(at, t_new, ratings_);
  }
  if (observer_ && t_new >= options_.from) observer_(t_new, x_);
}

void Stepper::fail(double t, double h) const {
  const auto worst = system_.worst_unknowns(newton_.last_update(), 3);
  std::string message = fmt::format(
      "the transient step fell below its minimum ({:.3g} s) at t = {:.9g} s; not settling:", h, t);
  for (const auto& name : worst) message += " " + name;
  throw NumericalError(ErrorKind::step_too_small, message, worst);
}

}  // namespace

TransientResult integrate(const mna::System& system, const SolverOptions& solver,
                          const TransientOptions& options, const StepObserver& observer,
                          const std::vector<double>& landings) {
  NewtonSolver newton(system, solver);
  return integrate(newton, options, observer, nullptr, landings);
}

TransientResult integrate(NewtonSolver& newton, const TransientOptions& options,
                          const StepObserver& observer, const std::vector<double>* bias_point,
                          const std::vector<double>& landings) {
  if (!(options.stop > 0) || options.from >= options.stop || options.from < 0) {
    throw Error(ErrorKind::invalid_request, "a transient needs 0 <= from < stop", {"from", "stop"});
  }
  TransientResult result;
  result.integration = newton.options().integration;
  Stepper stepper(newton, options, result, observer, bias_point, landings);
  stepper.run();
  result.rating_violations = stepper.rating_violations();
  spdlog::debug("transient: {} steps accepted, {} rejected, {} Newton iterations",
                result.accepted_steps, result.rejected_steps, result.newton_iterations);
  return result;
}

}  // namespace stage::analysis
