// Stages of our own values shared by the headroom tests, built in code with
// generic textbook-typical transistor parameters (not any real part).
#pragma once

#include "stage/circuit.hpp"

namespace stage::testing {

inline BipolarModel generic_npn() {
  BipolarModel m;
  m.saturation_current = 2e-14;
  m.beta_forward = 150;
  m.beta_reverse = 3;
  m.early_voltage_forward = 100;
  return m;
}

inline BipolarModel generic_pnp() { return generic_npn(); }

// An emitter follower on 12 V: 22k/22k base divider, RE = 1 k, driving a
// 100 ohm load through 100 uF. ICQ is about 5 mA, the AC load RE || RL about
// 91 ohm, so the load line allows only about ICQ R'ac = 0.45 V of negative
// swing even though the output sits near 5.3 V.
inline Circuit follower_into_low_load() {
  Circuit c;
  c.title = "Follower into a 100 ohm load";
  c.add_model("npn", generic_npn());
  c.add("vcc", VoltageSource{"vcc", "gnd", 12.0});
  c.add("vin", VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("cin", Capacitor{"in", "base", 10e-6});
  c.add("r_top", Resistor{"vcc", "base", 22e3});
  c.add("r_bottom", Resistor{"base", "gnd", 22e3});
  c.add("q1", Bipolar{Polarity::npn, "vcc", "base", "emitter", {}, "npn"});
  c.add("re", Resistor{"emitter", "gnd", 1e3});
  c.add("cout", Capacitor{"emitter", "out", 100e-6});
  c.add("rl", Resistor{"out", "gnd", 100.0});
  return c;
}

}  // namespace stage::testing
