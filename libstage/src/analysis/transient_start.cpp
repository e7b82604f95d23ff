// Starting a transient.
//
// start = bias: the DC operating point with sources at their DC (t = 0)
// value; every charge is then constant, so q' = 0.
//
// start = zero: the wanted charges q0 are those of the zero state plus what
// each device holds at its initial condition (Device::initial_condition: a
// capacitor's initial voltage, an inductor's initial current). The other
// unknowns (resistive node voltages, source currents) must still satisfy the
// circuit at t = 0. Both come from one backward-Euler step of a very short
// length tau from the charges q0:  f(x, 0) + (q(x) - q0) / tau = 0.
// Its solution x1 satisfies every algebraic equation exactly and moves each
// charge only by tau q', except where the circuit forces a charge (a
// capacitor straight across a source, a junction capacitance from a supply
// to a node the supply pulls up): that step moves it to the forced value,
// which is the physical outcome at t = 0+.
//
// That first point x1 is no start, though, wherever a charge was forced:
// its resistive unknowns carry the jump's impulse (q(x1) - q0) / tau (the
// drop it makes across a base resistance, say), and the first step's
// predictor, q + h q' with that q', misses by (h / tau) times the jump, so
// every step was rejected down to the minimum. A second step of length tau
// from q(x1), with nothing left to force, ends at a point x2 whose
// resistive unknowns match the charges' derivative after the jump, and
// gives that derivative, (q(x2) - q(x1)) / tau, to O(tau). The transient
// starts at x2 (tau later than t = 0, as x1 already was).
#include "analysis/transient_start.hpp"

#include "analysis/operating_point.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

constexpr double kConsistencyFraction = 1e-9;  // tau over the run's length

// Adds the charge of one element held at its initial condition: the device
// evaluated alone at a point where only that condition's unknowns are set.
void add_initial_charge(const mna::System& system, mna::Device& device,
                        const mna::InitialCondition& held, std::vector<double>& q0) {
  std::vector<double> x(q0.size(), 0.0);
  if (held.plus != mna::kGroundIndex) {
    x[held.plus] = held.value;
  } else {
    x[held.minus] = -held.value;
  }
  mna::Workspace w = system.make_workspace();
  auto out = w.output();
  device.evaluate(system.request(x.data()), out);
  for (std::size_t i = 1; i < q0.size(); ++i) q0[i] += w.q[i];
}

std::vector<double> initial_charges(const mna::System& system) {
  std::vector<double> zero(static_cast<std::size_t>(system.size()) + 1, 0.0);
  mna::Workspace w = system.make_workspace();
  system.evaluate(system.request(zero.data()), w);
  std::vector<double> q0 = w.q;
  for (const auto& d : system.devices()) {
    if (const auto held = d->initial_condition()) add_initial_charge(system, *d, *held, q0);
  }
  return q0;
}

// One backward-Euler step of length tau from the charges `from`, solved in
// place from x. Throws NumericalError if Newton does not converge.
int consistency_step(NewtonSolver& newton, const std::vector<double>& from, double tau,
                     std::vector<double>& x) {
  const mna::System& system = newton.system();
  std::vector<double> history(from.size());
  for (std::size_t i = 0; i < from.size(); ++i) history[i] = -from[i] / tau;
  NewtonProblem p;
  p.request = system.request(nullptr);
  p.request.dc = false;
  p.reactive_scale = 1.0 / tau;
  p.reactive_history = history.data();
  p.max_iterations = newton.options().max_newton_iterations;
  const auto outcome = newton.solve(x, p);
  if (outcome.status != NewtonStatus::converged) {
    const auto worst = system.worst_unknowns(newton.last_update(), 3);
    throw NumericalError(ErrorKind::no_convergence,
                         "no consistent initial point for the transient (start = zero): "
                         "did not settle: " +
                             worst.front(),
                         worst);
  }
  return outcome.iterations;
}

StartPoint zero_start(NewtonSolver& newton, double duration) {
  const std::vector<double> q0 = initial_charges(newton.system());
  const double tau = kConsistencyFraction * duration;
  StartPoint start;
  start.x.assign(q0.size(), 0.0);
  start.newton_iterations = consistency_step(newton, q0, tau, start.x);
  const std::vector<double> forced = newton.workspace().q;
  start.newton_iterations += consistency_step(newton, forced, tau, start.x);
  start.q = newton.workspace().q;
  start.qdot.resize(q0.size());
  for (std::size_t i = 0; i < q0.size(); ++i) start.qdot[i] = (start.q[i] - forced[i]) / tau;
  return start;
}

StartPoint bias_start(NewtonSolver& newton, const std::vector<double>* bias_point) {
  const mna::System& system = newton.system();
  StartPoint start;
  if (bias_point != nullptr) {
    start.x = *bias_point;
  } else {
    start.x.assign(static_cast<std::size_t>(system.size()) + 1, 0.0);
    start.newton_iterations = solve_operating_point(newton, start.x).newton_iterations;
  }
  mna::Workspace w = system.make_workspace();
  system.evaluate(system.request(start.x.data()), w);
  start.q = w.q;
  start.qdot.assign(start.x.size(), 0.0);
  return start;
}

}  // namespace

StartPoint start_transient(NewtonSolver& newton, TransientStart start, double duration,
                           const std::vector<double>* bias_point) {
  for (const auto& d : newton.system().devices()) d->reset_limiting();
  return start == TransientStart::bias ? bias_start(newton, bias_point)
                                       : zero_start(newton, duration);
}

}  // namespace stage::analysis
