// A transient never carries a point where a junction left its model: a source
// that ramps straight across a base-emitter junction from 0.6 V to 5 V fails
// at the time the junction passes the model's range, naming the transistor,
// while the same ramp to 0.75 V runs to the end.
#include <gtest/gtest.h>

#include <algorithm>
#include <string>

#include "devices/junction.hpp"
#include "devices/physical_constants.hpp"
#include "stage/errors.hpp"
#include "stage/transient.hpp"

namespace {

using stage::Circuit;

// The transistor's base driven by a piecewise-linear source from 0.6 V at
// t = 0 to `top` at 1 ms, its collector on 5 V.
Circuit ramp_across_junction(double top) {
  Circuit c;
  stage::BipolarModel m;
  m.saturation_current = 1e-15;
  c.add_model("n", m);
  c.add("vcc", stage::VoltageSource{"c", "gnd", 5.0});
  stage::VoltageSource vb{"b", "gnd", 0.6};
  vb.wave = stage::PiecewiseWave{{{0.0, 0.6}, {1e-3, top}}, false};
  c.add("vb", vb);
  c.add("q1", stage::Bipolar{stage::Polarity::npn, "c", "b", "gnd", {}, "n"});
  return c;
}

stage::TransientOptions one_millisecond() {
  stage::TransientOptions o;
  o.stop = 1e-3;
  o.max_step = 1e-5;
  return o;
}

TEST(TransientModelRange, RampAcrossBaseEmitterFailsWhereTheModelEnds) {
  try {
    stage::run_transient(ramp_across_junction(5.0), one_millisecond());
    ADD_FAILURE() << "the transient reported a junction beyond its model's range";
  } catch (const stage::NumericalError& e) {
    const auto& involved = e.involved();
    EXPECT_NE(std::find(involved.begin(), involved.end(), "q1"), involved.end()) << e.what();
    EXPECT_NE(std::string(e.what()).find("base–emitter"), std::string::npos) << e.what();
    // The ramp reaches the edge of the exponential, 80 VT (junction.hpp),
    // at t = (80 VT - 0.6 V) / (4.4 V / 1 ms); the failing step lands at
    // most one maximum step (10 us) after it.
    const double vt = stage::devices::thermal_voltage(stage::kRoomTemperature);
    const double edge_time = (stage::devices::kMaxExponent * vt - 0.6) / 4.4 * 1e-3;
    const std::string message = e.what();
    const auto at = message.find("t = ");
    ASSERT_NE(at, std::string::npos) << message;
    const double t = std::stod(message.substr(at + 4));
    EXPECT_GE(t, edge_time);
    EXPECT_LE(t, edge_time + 1e-5);
  }
}

TEST(TransientModelRange, RampWithinTheModelRunsToTheEnd) {
  const stage::TransientResult r =
      stage::run_transient(ramp_across_junction(0.75), one_millisecond());
  EXPECT_DOUBLE_EQ(r.time.back(), 1e-3);
}

}  // namespace
