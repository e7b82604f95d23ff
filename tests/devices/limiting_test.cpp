// Newton support: with request.limit the devices evaluate at limited junction
// voltages and stamp the linearisation f(v') + G (v - v') (device.hpp), so
// the stamped residual and Jacobian must equal those of an unlimited
// evaluation at the limited point, carried linearly to the true point.
#include <gtest/gtest.h>

#include <cmath>

#include "device_fixtures.hpp"
#include "devices/junction.hpp"
#include "devices/physical_constants.hpp"

namespace {

using stage::Polarity;
using namespace stage::testing;

const double kVt = stage::devices::thermal_voltage(stage::kRoomTemperature);

// Compares a limited evaluation at x with the unlimited one at x_limited
// plus G (x - x_limited), C (x - x_limited): the same numbers computed in a
// different order, so to rounding (common practice).
void expect_linearised(DerivativeCheck& check, const std::vector<double>& x,
                       const std::vector<double>& x_limited) {
  const auto limited = check.evaluate(x, stage::kRoomTemperature, true);
  const auto at = check.evaluate(x_limited);
  Eigen::VectorXd dx(check.size());
  for (int i = 0; i < check.size(); ++i) dx[i] = x[i + 1] - x_limited[i + 1];
  const Eigen::VectorXd f = at.f + at.g * dx, q = at.q + at.c * dx;
  for (int i = 0; i < check.size(); ++i) {
    EXPECT_NEAR(limited.f[i], f[i], 1e-12 * std::abs(f[i]) + 1e-20) << i;
    EXPECT_NEAR(limited.q[i], q[i], 1e-12 * std::abs(q[i]) + 1e-28) << i;
  }
  EXPECT_TRUE(limited.g.isApprox(at.g, 1e-12)) << limited.g << "\n" << at.g;
  EXPECT_TRUE(limited.c.isApprox(at.c, 1e-12)) << limited.c << "\n" << at.c;
}

TEST(Limiting, DiodeStepIsLogarithmicAndConsistent) {
  stage::DiodeModel m;
  m.junction_capacitance = 2e-12;
  m.transit_time = 1e-9;
  auto check = diode_check(m);
  auto state = [&](double v) { return check.state({{"a", v}, {"k", 0.0}}); };
  check.evaluate(state(0.6));  // the last junction voltage is now 0.6 V
  // Above the critical voltage a step of 0.9 V becomes vt ln(1 + 0.9 / vt)
  // (the logarithmic limiting rule, junction.hpp).
  const double limited = 0.6 + kVt * std::log(1 + 0.9 / kVt);
  expect_linearised(check, state(1.5), state(limited));
  // The limited point is remembered: the next step starts from it.
  const double next = limited + kVt * std::log(1 + (1.5 - limited) / kVt);
  expect_linearised(check, state(1.5), state(next));
  // Forgetting the history starts again from 0 V: vt ln(v / vt).
  check.device().reset_limiting();
  expect_linearised(check, state(1.5), state(kVt * std::log(1.5 / kVt)));
  // Below the critical voltage nothing is limited.
  check.device().reset_limiting();
  expect_linearised(check, state(0.3), state(0.3));
}

TEST(Limiting, BipolarJunctionsAreLimitedSeparately) {
  stage::BipolarModel m;
  m.early_voltage_forward = 40;
  m.knee_current_forward = 0.1;
  m.be_capacitance = 1e-12;
  m.bc_capacitance = 0.5e-12;
  m.forward_transit_time = 1e-9;
  m.reverse_transit_time = 10e-9;
  for (Polarity p : {Polarity::npn, Polarity::pnp}) {
    auto check = bipolar_check(m, p);
    check.evaluate(bipolar_state(check, p, 0.6, -5));
    const double vbe = 0.6 + kVt * std::log(1 + 0.9 / kVt);  // from 0.6 V
    const double vbc = 0.9;                                  // from -5 V: v_old <= 0 rule
    const double vbc_limited = kVt * std::log(vbc / kVt);
    expect_linearised(check, bipolar_state(check, p, 1.5, vbc),
                      bipolar_state(check, p, vbe, vbc_limited));
  }
}

}  // namespace
