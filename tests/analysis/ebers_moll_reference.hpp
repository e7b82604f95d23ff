// Independent references for transistor transients: the Ebers–Moll npn
// written out here, a dense Newton on KCL for a circuit's resistive part,
// and Boost.Odeint's Dormand–Prince integrating its capacitor voltages. The
// simulator shares none of this code, so agreement checks its models, its
// stamps and its integrator together.
#pragma once

#include <gtest/gtest.h>

#include <Eigen/Dense>
#include <algorithm>
#include <boost/numeric/odeint.hpp>
#include <cmath>
#include <vector>

namespace stage::testing {

// k T / q from the exact SI constants (CODATA 2018).
inline double thermal_voltage(double kelvin) { return 1.380649e-23 * kelvin / 1.602176634e-19; }

// Ebers–Moll model of an npn (Ebers and Moll, Proc. IRE 1954) in its
// transport form (Getreu, "Modeling the Bipolar Transistor", 1978):
//   IC = IS (e^(vbe/vt) - e^(vbc/vt)) - IS/BR (e^(vbc/vt) - 1),
//   IB = IS/BF (e^(vbe/vt) - 1) + IS/BR (e^(vbc/vt) - 1),
// with their derivatives for Newton.
struct EbersMoll {
  double saturation_current = 0, beta_forward = 0, beta_reverse = 0, vt = 0;

  struct Currents {
    double ic = 0, ib = 0;
    double dic_dvbe = 0, dic_dvbc = 0, dib_dvbe = 0, dib_dvbc = 0;
  };
  Currents operator()(double vbe, double vbc) const {
    const double is = saturation_current;
    const double ef = std::exp(vbe / vt), er = std::exp(vbc / vt);
    const double gf = is * ef / vt, gr = is * er / vt;
    return {is * (ef - er) - is / beta_reverse * (er - 1),
            is / beta_forward * (ef - 1) + is / beta_reverse * (er - 1),
            gf,
            -gr - gr / beta_reverse,
            gf / beta_forward,
            gr / beta_reverse};
  }
};

// Newton on KCL: residual(x, f, J) fills the node currents f and their
// Jacobian J at node voltages x. Each update is scaled so that no node
// moves more than four thermal voltages, so no junction more than eight
// and its exponential cannot overshoot (common practice in Newton on diode
// equations). Converged when every node settles to 1e-13 V, a few units in
// the last place of volt-sized values; returns false otherwise.
template <class Residual>
bool solve_kcl(Residual&& residual, Eigen::VectorXd& x, double vt) {
  const auto n = x.size();
  Eigen::VectorXd f(n);
  Eigen::MatrixXd j(n, n);
  for (int iteration = 0; iteration < 200; ++iteration) {
    f.setZero();
    j.setZero();
    residual(x, f, j);
    Eigen::VectorXd dx = j.partialPivLu().solve(-f);
    const double largest = dx.cwiseAbs().maxCoeff();
    if (largest > 4 * vt) dx *= 4 * vt / largest;
    x += dx;
    if (largest < 1e-13) return true;
  }
  return false;
}

// Integrates dstate/dt = rhs(state, t) by Boost.Odeint's Dormand–Prince
// (runge_kutta_dopri5) with dense output at absolute and relative
// tolerance 1e-10, calling observe(state, t) at each of `times`.
template <class State, class Rhs, class Observer>
void dormand_prince_at(Rhs&& rhs, State state, const std::vector<double>& times,
                       Observer&& observe) {
  namespace odeint = boost::numeric::odeint;
  odeint::integrate_times(
      odeint::make_dense_output(1e-10, 1e-10, odeint::runge_kutta_dopri5<State>()), rhs, state,
      times.begin(), times.end(), 1e-7, observe);
}

}  // namespace stage::testing
