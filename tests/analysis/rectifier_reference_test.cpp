// A nonlinear circuit against an independent integration: a half-wave
// rectifier with a smoothing capacitor, written as an ODE with the plain
// Shockley diode and integrated by Boost.Odeint's Dormand–Prince stepper at
// a tight tolerance.
#include <gtest/gtest.h>

#include <boost/numeric/odeint.hpp>
#include <cmath>
#include <numbers>

#include "stage/transient.hpp"

namespace {

constexpr double kAmplitude = 10, kF = 1e3, kR = 1e3, kC = 10e-6, kIs = 1e-14;

// C dv/dt = Is (exp((vin - v) / Vt) - 1) - v / R, vin = A sin(2 pi f t), with
// Vt = k T / q from the exact SI constants (CODATA 2018) at the circuit's
// temperature: the same diode equation the model uses with no charges, no
// series resistance and no breakdown.
TEST(RectifierReference, AgreesWithDormandPrince) {
  stage::Circuit c;
  c.add_model("plain", stage::DiodeModel{});  // Is = 1e-14 A, n = 1, no charges
  c.add("vin", stage::VoltageSource{"in", "gnd", 0.0, 0.0, 0.0, stage::SineWave{kAmplitude, kF}});
  c.add("d1", stage::Diode{"in", "out", "plain"});
  c.add("rl", stage::Resistor{"out", "gnd", kR});
  c.add("cs", stage::Capacitor{"out", "gnd", kC});
  stage::TransientOptions o;
  o.stop = 5 / kF;
  const auto r = stage::run_transient(c, o);

  const double vt = 1.380649e-23 * c.temperature / 1.602176634e-19;
  const auto rhs = [&](const double& v, double& dv, double t) {
    const double vin = kAmplitude * std::sin(2 * std::numbers::pi * kF * t);
    dv = (kIs * std::expm1((vin - v) / vt) - v / kR) / kC;
  };
  namespace odeint = boost::numeric::odeint;
  double v = 0;
  std::vector<double> reference;
  odeint::integrate_times(
      odeint::make_dense_output(1e-12, 1e-10, odeint::runge_kutta_dopri5<double>()), rhs, v,
      r.time.begin(), r.time.end(), 1e-7, [&](const double& x, double) { reference.push_back(x); });
  ASSERT_EQ(reference.size(), r.time.size());
  const auto& out = r.signal("out");
  double worst = 0;
  for (std::size_t k = 0; k < out.size(); ++k)
    worst = std::max(worst, std::abs(out[k] - reference[k]));
  EXPECT_LT(worst, 1e-3 * kAmplitude);      // 0.1 % of full scale
  EXPECT_GT(out.back(), 0.8 * kAmplitude);  // it did rectify: charged near the peak
}

}  // namespace
