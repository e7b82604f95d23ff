// Stages of our own values shared by the headroom and stage-report tests,
// built in code with generic textbook-typical transistor parameters (not any
// real part).
#pragma once

#include <string>

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

// A medium-power device for output stages (a pnp uses the same numbers).
inline BipolarModel generic_power() {
  BipolarModel m;
  m.saturation_current = 5e-13;
  m.beta_forward = 100;
  m.beta_reverse = 3;
  m.early_voltage_forward = 80;
  return m;
}

inline DiodeModel generic_diode() {
  DiodeModel d;
  d.saturation_current = 3e-9;
  d.emission_coefficient = 1.8;
  return d;
}

// What the small-signal stages share: an npn model, the supply `vcc`, and
// the input source (AC 1) coupled to `base` through 10 uF.
inline Circuit small_signal_frame(std::string title, double supply) {
  Circuit c;
  c.title = std::move(title);
  c.add_model("npn", generic_npn());
  c.add("vcc", VoltageSource{"vcc", "gnd", supply});
  c.add("vin", VoltageSource{"in", "gnd", 0.0, 1.0});
  c.add("cin", Capacitor{"in", "base", 10e-6});
  return c;
}

// The common-emitter front both 15 V stages share: the 39k/8.2k divider,
// q1 and its 4.7 k collector resistor.
inline Circuit common_emitter_front(std::string title) {
  Circuit c = small_signal_frame(std::move(title), 15.0);
  c.add("r1", Resistor{"vcc", "base", 39e3});
  c.add("r2", Resistor{"base", "gnd", 8.2e3});
  c.add("q1", Bipolar{Polarity::npn, "collector", "base", "emitter", {}, "npn"});
  c.add("rc", Resistor{"vcc", "collector", 4.7e3});
  return c;
}

// An emitter follower on 12 V: 22k/22k base divider, RE = 1 k, driving a
// 100 ohm load through 100 uF. ICQ is about 5 mA, the AC load RE || RL about
// 91 ohm, so the load line allows only about ICQ R'ac = 0.45 V of negative
// swing even though the output sits near 5.3 V.
inline Circuit follower_into_low_load() {
  Circuit c = small_signal_frame("Follower into a 100 ohm load", 12.0);
  c.add("r_top", Resistor{"vcc", "base", 22e3});
  c.add("r_bottom", Resistor{"base", "gnd", 22e3});
  c.add("q1", Bipolar{Polarity::npn, "vcc", "base", "emitter", {}, "npn"});
  c.add("re", Resistor{"emitter", "gnd", 1e3});
  c.add("cout", Capacitor{"emitter", "out", 100e-6});
  c.add("rl", Resistor{"out", "gnd", 100.0});
  return c;
}

// A common-emitter stage on 15 V: 39k/8.2k divider, 270 ohm of emitter
// resistance left unbypassed for linearity and 1 k bypassed, RC = 4.7 k,
// a 4.7 k load through 10 uF. ICQ about 1.5 mA, VCEQ about 6 V, R'ac =
// RC || RL + 270 ohm. The collector swings up until the transistor cuts off
// and down until it saturates.
inline Circuit common_emitter() {
  Circuit c = common_emitter_front("Common-emitter stage");
  c.add("re1", Resistor{"emitter", "bypass", 270.0});
  c.add("re2", Resistor{"bypass", "gnd", 1e3});
  c.add("ce", Capacitor{"bypass", "gnd", 470e-6});
  c.add("cout", Capacitor{"collector", "out", 10e-6});
  c.add("rl", Resistor{"out", "gnd", 4.7e3});
  return c;
}

// The common-emitter stage's transistor, emitter fully bypassed, driving an
// emitter follower straight from its collector; the follower feeds 100 ohm
// through 100 uF. ICQ about 1.9 mA in q1, 5 mA in q2. The follower's current
// swings far more than q1's, but its gain hardly changes with it: the
// distortion is q1's.
inline Circuit common_emitter_into_follower() {
  Circuit c = common_emitter_front("Common-emitter stage into a follower");
  c.add("re", Resistor{"emitter", "gnd", 1e3});
  c.add("ce", Capacitor{"emitter", "gnd", 470e-6});
  c.add("q2", Bipolar{Polarity::npn, "vcc", "collector", "follower", {}, "npn"});
  c.add("re2", Resistor{"follower", "gnd", 1e3});
  c.add("cout", Capacitor{"follower", "out", 100e-6});
  c.add("rl", Resistor{"out", "gnd", 100.0});
  return c;
}

// A bare complementary pair: both bases tied to an ideal source, emitters
// to the output, on +/-15 V into 8 ohm. Driven beyond the rails, the ideal
// source forces the base-collector junctions into them.
inline Circuit bare_pair_8ohm() {
  Circuit c;
  c.title = "Bare complementary pair, 8 ohm";
  c.add_model("npn", generic_power());
  c.add_model("pnp", generic_power());
  c.add("vpos", VoltageSource{"vpos", "gnd", 15.0});
  c.add("vneg", VoltageSource{"vneg", "gnd", -15.0});
  VoltageSource vin{"in", "gnd", 0.0, 1.0};
  vin.wave = SineWave{12.0, 1e3};
  c.add("vin", vin);
  c.add("qn", Bipolar{Polarity::npn, "vpos", "in", "out", {}, "npn"});
  c.add("qp", Bipolar{Polarity::pnp, "vneg", "in", "out", {}, "pnp"});
  c.add("rl", Resistor{"out", "gnd", 8.0});
  return c;
}

// What both push-pull stages share: +/-12 V rails, the pair's models, a
// 32 ohm load from `out`, and the input source (a sine of the given peak
// when drive_amplitude > 0, for transients).
inline Circuit push_pull_frame(std::string title, double drive_amplitude) {
  Circuit c;
  c.title = std::move(title);
  c.add_model("npn", generic_power());
  c.add_model("pnp", generic_power());
  c.add("vpos", VoltageSource{"vpos", "gnd", 12.0});
  c.add("vneg", VoltageSource{"vneg", "gnd", -12.0});
  VoltageSource vin{"in", "gnd", 0.0, 1.0};
  if (drive_amplitude > 0) vin.wave = SineWave{drive_amplitude, 1e3};
  c.add("vin", vin);
  c.add("rl", Resistor{"out", "gnd", 32.0});
  return c;
}

// A complementary pair driven through 100 ohm into both bases: class B.
// (The source resistance keeps the base current finite when the drive goes
// past a rail, as a real driver's would.)
inline Circuit class_b_pair(double drive_amplitude = 0) {
  Circuit c = push_pull_frame("Class-B pair", drive_amplitude);
  c.add("rs", Resistor{"in", "base", 100.0});
  c.add("qn", Bipolar{Polarity::npn, "vpos", "base", "out", {}, "npn"});
  c.add("qp", Bipolar{Polarity::pnp, "vneg", "base", "out", {}, "pnp"});
  return c;
}

// The same pair biased into class AB by two diodes between the bases, fed
// by 2.2 k from each rail, with 1 ohm emitter resistors (or others).
inline Circuit class_ab_pair(double drive_amplitude = 0, double emitter_resistance = 1.0) {
  Circuit c = push_pull_frame("Class-AB pair", drive_amplitude);
  c.add_model("diode", generic_diode());
  c.add("r_top", Resistor{"vpos", "bn", 2.2e3});
  c.add("d1", Diode{"bn", "mid", "diode"});
  c.add("d2", Diode{"mid", "bp", "diode"});
  c.add("r_bottom", Resistor{"bp", "vneg", 2.2e3});
  c.add("cin", Capacitor{"in", "mid", 100e-6});
  c.add("rmid", Resistor{"mid", "gnd", 100e3});
  c.add("qn", Bipolar{Polarity::npn, "vpos", "bn", "en", {}, "npn"});
  c.add("qp", Bipolar{Polarity::pnp, "vneg", "bp", "ep", {}, "pnp"});
  c.add("ren", Resistor{"en", "out", emitter_resistance});
  c.add("rep", Resistor{"ep", "out", emitter_resistance});
  return c;
}

// Class A with the load as the emitter resistor: a follower on 12 V whose
// 100 ohm load carries the bias current, base held near mid-rail.
inline Circuit class_a_emitter_load() {
  Circuit c;
  c.title = "Class-A follower, resistive emitter load";
  c.add_model("npn", generic_power());
  c.add("vcc", VoltageSource{"vcc", "gnd", 12.0});
  c.add("vin", VoltageSource{"in", "gnd", 6.6, 1.0});
  c.add("q1", Bipolar{Polarity::npn, "vcc", "in", "out", {}, "npn"});
  c.add("rl", Resistor{"out", "gnd", 100.0});
  return c;
}

}  // namespace stage::testing
