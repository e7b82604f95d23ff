// A four-resistor-biased common-emitter stage against the textbook hand
// analysis: Thevenin equivalent of the base divider, VBE taken as 0.7 V, the
// emitter current from the base-emitter loop, the collector voltage from the
// drop across RC, and the midband gain -RC / (re + RE1) with re = VT / IE and
// RE1 the unbypassed part of the emitter resistance. The stage and its model
// are our own, with generic textbook values; the simulated figures are printed
// beside the hand figures so the log shows how far apart they are.
#include <gtest/gtest.h>

#include <cmath>
#include <iostream>
#include <numbers>

#include "devices/physical_constants.hpp"
#include "stage/bias.hpp"
#include "stage/frequency.hpp"

namespace {

using stage::Circuit;

// The stage: VCC 12 V; divider R1 = 47k over R2 = 10k; RC = 3.9k; emitter
// resistance RE1 = 180 (unbypassed) in series with RE2 = 820 (bypassed by
// CE); input through CIN from a 1 V AC source. Capacitors are large enough
// that at 100 kHz they are shorts to well under 0.1 % of the resistances
// they meet (1/(2 pi 100 kHz 100 uF) = 16 milliohm).
constexpr double kVcc = 12, kR1 = 47e3, kR2 = 10e3, kRc = 3.9e3, kRe1 = 180, kRe2 = 820;
constexpr double kBeta = 100, kEarly = 100, kIs = 1e-14;
constexpr double kMidband = 100e3;  // Hz

// A generic small-signal npn with values of the size textbooks use in worked
// examples (IS = 1e-14 A, beta = 100, Early voltage 100 V; from memory). No
// junction capacitances, so the response is flat above the coupling corners.
Circuit common_emitter_stage() {
  Circuit c;
  stage::BipolarModel m;
  m.saturation_current = kIs;
  m.beta_forward = kBeta;
  m.early_voltage_forward = kEarly;
  c.add_model("npn", m);
  c.add("vcc", stage::VoltageSource{"vcc", "gnd", kVcc});
  stage::VoltageSource vin{"in", "gnd", 0.0};
  vin.ac_magnitude = 1.0;
  c.add("vin", vin);
  c.add("cin", stage::Capacitor{"in", "b", 100e-6});
  c.add("r1", stage::Resistor{"vcc", "b", kR1});
  c.add("r2", stage::Resistor{"b", "gnd", kR2});
  c.add("rc", stage::Resistor{"vcc", "c", kRc});
  c.add("re1", stage::Resistor{"e", "e2", kRe1});
  c.add("re2", stage::Resistor{"e2", "gnd", kRe2});
  c.add("ce", stage::Capacitor{"e2", "gnd", 100e-6});
  stage::Bipolar q;
  q.collector = "c";
  q.base = "b";
  q.emitter = "e";
  q.model = "npn";
  c.add("q1", q);
  return c;
}

// The hand analysis (Sedra and Smith, "Microelectronic Circuits", the BJT
// chapter's bias design with a single supply; Horowitz and Hill, "The Art of
// Electronics", ch. 2): VTH = VCC R2 / (R1 + R2), RTH = R1 || R2,
// IE = (VTH - VBE) / (RE + RTH / (beta + 1)), IC = alpha IE,
// VC = VCC - IC RC, re = VT / IE, gain = -RC / (re + RE1).
struct Hand {
  double vth, rth, ie, ic, vc, re_small, gain;
};
Hand hand_analysis(double vbe) {
  Hand h;
  h.vth = kVcc * kR2 / (kR1 + kR2);
  h.rth = kR1 * kR2 / (kR1 + kR2);
  h.ie = (h.vth - vbe) / (kRe1 + kRe2 + h.rth / (kBeta + 1));
  h.ic = kBeta / (kBeta + 1) * h.ie;
  h.vc = kVcc - h.ic * kRc;
  h.re_small = stage::devices::thermal_voltage(stage::kRoomTemperature) / h.ie;
  h.gain = -kRc / (h.re_small + kRe1);
  return h;
}

TEST(CommonEmitterHand, BiasPointAgainstThevenin) {
  const Circuit c = common_emitter_stage();
  const stage::BiasResult bias = stage::run_bias(c);
  const auto& q = bias.bipolar("q1");
  const Hand hand = hand_analysis(0.7);
  const double ie = -q.emitter_current;  // reported into the device
  std::cout.precision(6);
  std::cout << "hand (VBE = 0.7 V): VTH " << hand.vth << " V, RTH " << hand.rth << " ohm, IE "
            << hand.ie << " A, IC " << hand.ic << " A, VC " << hand.vc << " V\n"
            << "simulated: VBE " << q.vbe << " V, IE " << ie << " A, IC " << q.collector_current
            << " A, VC " << bias.voltage("c") << " V, VB " << bias.voltage("b") << " V, VE "
            << bias.voltage("e") << " V, region " << to_string(q.region) << ", method "
            << stage::to_string(bias.method) << ", " << bias.newton_iterations << " iterations\n";
  ASSERT_EQ(q.region, stage::Region::forward_active);

  // The hand analysis' one large error is VBE = 0.7 V against the model's
  // VT ln(IC / IS): at about 1.3 mA and IS = 1e-14 A that is 0.66 V, and the
  // 0.04 V difference is about 3 % of the 1.4 V the loop leaves across RE.
  // The Early effect (VCB about 4.8 V over 100 V) raises the effective beta by
  // about 5 %, which moves IE by about 0.4 % through RTH / (beta + 1). Hence
  // 4 % on IE; and since the real VBE is below 0.7 V, the stage carries more
  // current than the hand figure, not less.
  EXPECT_NEAR(ie, hand.ie, 0.04 * hand.ie);
  EXPECT_GT(ie, hand.ie);
  // The same 4 % on IC, plus up to 1 % because IC / IE = beta / (beta + 1)
  // moves with the effective beta: 5 % of the drop across RC (VC itself is
  // checked through that drop, about 5 V).
  EXPECT_NEAR(kVcc - bias.voltage("c"), kVcc - hand.vc, 0.05 * (kVcc - hand.vc));

  // With VBE taken from the model at the simulated current instead of 0.7 V,
  // the same formula leaves only the Early effect's 0.4 % (by the same
  // argument as above): the Thevenin loop itself is exact.
  const Hand refined = hand_analysis(q.vbe);
  std::cout << "hand (VBE = " << q.vbe << " V): IE " << refined.ie << " A\n";
  EXPECT_NEAR(ie, refined.ie, 0.006 * refined.ie);
}

TEST(CommonEmitterHand, MidbandGainAgainstDegeneratedFormula) {
  const Circuit c = common_emitter_stage();
  stage::FrequencyOptions o;
  o.from = 10;
  o.to = 1e6;
  o.input = "vin";
  o.output = stage::SignalRef::node("c");
  o.at = kMidband;
  const stage::FrequencyResult r = stage::run_frequency(c, o);
  ASSERT_TRUE(r.figures.gain_at_dB && r.figures.phase_at_deg);
  const double simulated = -std::pow(10.0, *r.figures.gain_at_dB / 20);
  const double ie = -r.bias.bipolar("q1").emitter_current;
  const Hand hand = hand_analysis(0.7);
  std::cout.precision(6);
  std::cout << "hand gain at 100 kHz: " << hand.gain << " (re " << hand.re_small
            << " ohm); simulated: " << simulated << " (" << *r.figures.gain_at_dB << " dB, phase "
            << *r.figures.phase_at_deg << " deg; re at simulated IE "
            << stage::devices::thermal_voltage(stage::kRoomTemperature) / ie << " ohm)\n";

  // An inverting stage: the output is half a turn from the input (the
  // unwrapped phase may be reported as +180 or -180 degrees). The coupling
  // and bypass capacitors add under 0.01 degree at 100 kHz.
  EXPECT_NEAR(std::abs(*r.figures.phase_at_deg), 180.0, 0.1);
  // -RC / (re + RE1) leaves out: alpha = beta / (beta + 1), about 1 % (the
  // exact small-signal gain is -alpha RC / (re + RE1)); the 3 % error in IE
  // above, which moves re (about 20 ohm) by 0.6 ohm out of 200, 0.3 %; and the
  // Early output resistance, which with RE1 in the emitter is above 1 Mohm
  // against RC = 3.9k, under 0.5 %. Hence 2.5 %.
  EXPECT_NEAR(simulated, hand.gain, 0.025 * std::abs(hand.gain));
}

}  // namespace
