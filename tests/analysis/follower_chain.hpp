// Chains of capacitor-coupled emitter followers, by default with a
// charge-storing Gummel–Poon transistor: the circuit of issue 10's ringing
// defect, built in code for the integrator tests and the benchmark.
#pragma once

#include <string>

#include "stage/circuit.hpp"

namespace stage::testing {

inline constexpr double kChainFrequency = 1e3;    // Hz
inline constexpr double kChainAmplitude = 10e-3;  // V, the input sine
// The chain's parts (see follower_chain below), for references that write
// the same circuit out themselves.
inline constexpr double kChainSupply = 12;              // V
inline constexpr double kChainSourceResistance = 1e3;   // ohm
inline constexpr double kChainDivider = 47e3;           // ohm, each half
inline constexpr double kChainEmitterResistance = 1e3;  // ohm
inline constexpr double kChainCoupling = 1e-6;          // F, into each base
inline constexpr double kChainOutputCoupling = 10e-6;   // F
inline constexpr double kChainLoad = 10e3;              // ohm

// Generic textbook-typical small-signal npn values, not any real part:
// IS 1e-15 A, BF 100, BR 1, Early voltage 100 V, junction capacitances of a
// few pF, forward transit time 0.4 ns, reverse 10 ns.
inline BipolarModel chain_transistor(double base_resistance) {
  BipolarModel m;
  m.saturation_current = 1e-15;
  m.beta_forward = 100;
  m.beta_reverse = 1;
  m.early_voltage_forward = 100;
  m.base_resistance = base_resistance;
  m.be_capacitance = 5e-12;
  m.bc_capacitance = 2e-12;
  m.forward_transit_time = 0.4e-9;
  m.reverse_transit_time = 10e-9;
  return m;
}

// `stages` followers on 12 V, each biased by 47k/47k with 1k in its emitter
// and coupled by 1 uF; the input is a 1 kHz sine of `amplitude` behind
// 1 kohm, the last emitter drives a 10 kohm load "out" through 10 uF.
inline Circuit follower_chain(int stages, const BipolarModel& model,
                              double amplitude = kChainAmplitude) {
  Circuit c;
  c.add_model("npn", model);
  c.add("vcc", VoltageSource{"vcc", "gnd", kChainSupply});
  c.add("vs", VoltageSource{"src", "gnd", 0.0, 0.0, 0.0, SineWave{amplitude, kChainFrequency}});
  c.add("rs", Resistor{"src", "e0", kChainSourceResistance});
  for (int k = 1; k <= stages; ++k) {
    const std::string s = std::to_string(k), before = "e" + std::to_string(k - 1);
    c.add("c" + s, Capacitor{before, "b" + s, kChainCoupling});
    c.add("ra" + s, Resistor{"vcc", "b" + s, kChainDivider});
    c.add("rb" + s, Resistor{"b" + s, "gnd", kChainDivider});
    c.add("q" + s, Bipolar{Polarity::npn, "vcc", "b" + s, "e" + s, {}, "npn"});
    c.add("re" + s, Resistor{"e" + s, "gnd", kChainEmitterResistance});
  }
  c.add("cout", Capacitor{"e" + std::to_string(stages), "out", kChainOutputCoupling});
  c.add("rl", Resistor{"out", "gnd", kChainLoad});
  return c;
}

// The chain with the charge-storing transistor above.
inline Circuit follower_chain(int stages, double base_resistance = 100) {
  return follower_chain(stages, chain_transistor(base_resistance));
}

}  // namespace stage::testing
