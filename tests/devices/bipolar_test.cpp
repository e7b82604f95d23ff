// The bipolar transistor at device level against closed forms: Ebers–Moll
// transport currents, Gummel–Poon Early and high-injection behaviour, the
// Gummel–Poon path with default extras against the Ebers–Moll path, pnp as
// the mirror of npn, and the physical constants.
#include <gtest/gtest.h>

#include <cmath>
#include <limits>

#include "device_fixtures.hpp"
#include "devices/physical_constants.hpp"

namespace {

using stage::BipolarModel;
using stage::Polarity;
using namespace stage::testing;

const double kVt = stage::devices::thermal_voltage(stage::kRoomTemperature);

// Terminal currents into the device (f at c, b, e) for a model with no
// internal nodes, at VBE and VBC.
struct Terminal {
  double ic, ib, ie;
};
Terminal terminal_currents(const BipolarModel& model, double vbe, double vbc,
                           Polarity polarity = Polarity::npn) {
  auto check = bipolar_check(model, polarity);
  const auto e = check.evaluate(bipolar_state(check, polarity, vbe, vbc));
  auto at = [&](const char* node) { return e.f[*check.topology().find_node(node) - 1]; };
  return {at("c"), at("b"), at("e")};
}

stage::BipolarOperatingPoint report(const BipolarModel& model, double vbe, double vbc,
                                    Polarity polarity = Polarity::npn) {
  auto check = bipolar_check(model, polarity);
  const auto x = bipolar_state(check, polarity, vbe, vbc);
  stage::mna::EvalRequest request;
  request.x = x.data();
  stage::BiasResult out;
  check.device().report(request, out);
  return out.bipolars.at(0);
}

// kT/q from the exact SI constants; k/q = 8.617333262e-5 V/K is the CODATA
// 2018 value of the Boltzmann constant in eV/K, truncated to those digits
// (so agreement to 300 K * 1e-14 V/K = 3e-12 V).
TEST(PhysicalConstants, ThermalVoltage) {
  EXPECT_NEAR(stage::devices::thermal_voltage(300.0), 300.0 * 8.617333262e-5, 3e-12);
}

// Ebers–Moll transport model (Ebers and Moll 1954; transport form as in
// Gray, Hurst, Lewis and Meyer, "Analysis and Design of Analog Integrated
// Circuits", ch. 1): IC = IS (e^(VBE/VT) - e^(VBC/VT)) - IS/BR (e^(VBC/VT) - 1),
// IB = IS/BF (e^(VBE/VT) - 1) + IS/BR (e^(VBC/VT) - 1).
void expect_ebers_moll(const BipolarModel& m, double vbe, double vbc) {
  const double ef = std::exp(vbe / kVt), er = std::exp(vbc / kVt);
  const double is = m.saturation_current, bf = m.beta_forward, br = m.beta_reverse;
  const double ic = is * (ef - er) - is / br * (er - 1);
  const double ib = is / bf * (ef - 1) + is / br * (er - 1);
  const Terminal t = terminal_currents(m, vbe, vbc);
  // Same formula, different order of operations: rounding only.
  EXPECT_NEAR(t.ic, ic, 1e-13 * std::abs(ic) + 1e-30);
  EXPECT_NEAR(t.ib, ib, 1e-13 * std::abs(ib) + 1e-30);
  EXPECT_NEAR(t.ie, -(ic + ib), 1e-13 * std::abs(ic + ib) + 1e-30);
}

TEST(BipolarClosedForm, ForwardActiveIsEbersMoll) {
  BipolarModel m;
  m.beta_reverse = 2;
  expect_ebers_moll(m, 0.65, -5);
  expect_ebers_moll(m, 0.75, -0.3);
}

TEST(BipolarClosedForm, ReverseActiveIsEbersMoll) {
  BipolarModel m;
  m.beta_reverse = 2;
  expect_ebers_moll(m, -5, 0.65);
  expect_ebers_moll(m, 0.7, 0.6);  // saturation
}

// Forward Early effect: with q1 = 1/(1 - VBC/V_A), IC = IS e^(VBE/VT) (1 -
// VBC/V_A) so dIC/dVCE = IC / (V_A + VCB) ~ IC / V_A (Getreu 1978; Gray et
// al. ch. 1 for r_out = VA / IC).
TEST(BipolarClosedForm, OutputConductanceIsCollectorCurrentOverEarlyVoltage) {
  BipolarModel m;
  m.early_voltage_forward = 50;
  const double vbe = 0.65, vbc = -5;
  const auto op = report(m, vbe, vbc);
  const double ic = op.collector_current;
  EXPECT_NEAR(1 / op.r_out, ic / (50 - vbc), 1e-9 * ic / 50);
  EXPECT_NEAR(op.r_out * ic / 50, 1.0, 0.11);  // ~ IC / V_A within VCB / V_A
  // Without Early effect only the reverse-biased B-C diffusion term is left,
  // IS e^(VBC/VT) / VT ~ 1e-99 S here: no output conductance in the model,
  // so r_out is infinite (spec section 7: printed "∞", JSON null), not 1e99.
  EXPECT_EQ(report(BipolarModel{}, vbe, vbc).r_out, std::numeric_limits<double>::infinity());
  // In saturation both junctions conduct and the B-C diode sets a finite
  // r_out even without Early effect.
  EXPECT_TRUE(std::isfinite(report(BipolarModel{}, vbe, 0.6).r_out));
}

// High injection: far above the forward knee qb ~ sqrt(IS e^(VBE/VT) / I_knee),
// so IC ~ sqrt(I_knee IS) e^(VBE/2VT) while IB = IS/BF e^(VBE/VT): beta ~ BF
// I_knee / IC (Gummel and Poon 1970; Massobrio and Antognetti sec. 2.4).
TEST(BipolarClosedForm, BetaFallsAsOneOverCurrentAboveTheKnee) {
  BipolarModel m;
  m.knee_current_forward = 1e-3;
  const double vbe = kVt * std::log(1e4 * 1e-3 / m.saturation_current);  // q2 = 1e4
  const Terminal t = terminal_currents(m, vbe, -5);
  const double beta = t.ic / t.ib;
  // qb = (1 + sqrt(1 + 4e4)) / 2 vs sqrt(1e4): 0.5 % apart at this current.
  EXPECT_NEAR(beta * t.ic / (m.beta_forward * 1e-3), 1.0, 0.01);
  const Terminal higher = terminal_currents(m, vbe + 2 * kVt * std::log(2.0), -5);
  EXPECT_NEAR((higher.ic / higher.ib) / beta, 0.5, 0.01);  // doubling IC halves beta
}

// Low current: the B-E leakage I_leak (e^(VBE/n_leak VT) - 1) dominates the base
// current, so beta = IC / (IS/BF (e^(VBE/VT) - 1) + I_leak (e^(VBE/n_leak VT) - 1))
// falls at low VBE (Gummel–Poon base current; Gray et al. ch. 1).
TEST(BipolarClosedForm, BetaFallsAtLowCurrentFromLeakage) {
  BipolarModel m;
  m.be_leakage_current = 1e-13;
  m.be_leakage_emission = 2;
  for (double vbe : {0.3, 0.45, 0.6, 0.75}) {
    const Terminal t = terminal_currents(m, vbe, -5);
    const double ef = std::exp(vbe / kVt);
    const double ib = m.saturation_current / m.beta_forward * (ef - 1) +
                      1e-13 * (std::exp(vbe / (2 * kVt)) - 1) +
                      m.saturation_current / m.beta_reverse * (std::exp(-5 / kVt) - 1);
    EXPECT_NEAR(t.ib, ib, 1e-12 * ib);
  }
  const Terminal low = terminal_currents(m, 0.35, -5), high = terminal_currents(m, 0.8, -5);
  EXPECT_LT(low.ic / low.ib, 0.1 * m.beta_forward);
  EXPECT_GT(high.ic / high.ib, 0.9 * m.beta_forward);
}

// With every extra at its default the Gummel–Poon equations are the
// Ebers–Moll ones (spec section 4): qb = 1 exactly, so the two paths agree
// to the last bit, charges and resistances included.
TEST(BipolarClosedForm, GummelPoonDefaultsEqualEbersMoll) {
  BipolarModel gp;
  gp.base_resistance = 50;
  gp.emitter_resistance = 1;
  gp.be_capacitance = 1e-12;
  gp.forward_transit_time = 1e-9;
  BipolarModel em = gp;
  em.form = stage::BipolarForm::ebers_moll;
  auto a = bipolar_check(gp, Polarity::npn), b = bipolar_check(em, Polarity::npn);
  for (double vbe : {-1.0, 0.3, 0.7, 0.9}) {
    for (double vbc : {-5.0, 0.0, 0.6}) {
      const auto x = bipolar_state(a, Polarity::npn, vbe, vbc);
      const auto ea = a.evaluate(x), eb = b.evaluate(x);
      EXPECT_EQ(ea.f, eb.f);
      EXPECT_EQ(ea.q, eb.q);
      EXPECT_EQ(ea.g, eb.g);
      EXPECT_EQ(ea.c, eb.c);
    }
  }
}

// A pnp is an npn with every voltage and current reversed: same G and C,
// opposite f and q, bit for bit (by construction of the model).
TEST(BipolarClosedForm, PnpMirrorsNpnExactly) {
  auto npn = bipolar_check(full_bipolar_model(), Polarity::npn);
  auto pnp = bipolar_check(full_bipolar_model(), Polarity::pnp);
  for (double vbe : {-1.0, 0.3, 0.7, 0.9}) {
    for (double vbc : {-5.0, 0.2, 0.6}) {
      const auto xn = bipolar_state(npn, Polarity::npn, vbe, vbc);
      const auto xp = bipolar_state(pnp, Polarity::pnp, vbe, vbc);
      for (std::size_t i = 0; i < xn.size(); ++i) ASSERT_EQ(xn[i], -xp[i]);
      const auto en = npn.evaluate(xn), ep = pnp.evaluate(xp);
      EXPECT_EQ(en.f, (-ep.f).eval());
      EXPECT_EQ(en.q, (-ep.q).eval());
      EXPECT_EQ(en.g, ep.g);
      EXPECT_EQ(en.c, ep.c);
    }
  }
  // An active pnp reports a negative collector current (spec section 7).
  const auto op = report(BipolarModel{}, 0.65, -5, Polarity::pnp);
  EXPECT_LT(op.collector_current, 0);
  EXPECT_LT(op.vbe, 0);
  EXPECT_GT(op.gm, 0);
  EXPECT_EQ(op.region, stage::Region::forward_active);
}

// Small-signal figures of the Ebers–Moll model in forward activity:
// gm = IC / VT, r_pi = BF / gm (Gray et al. ch. 1), and the regions.
TEST(BipolarClosedForm, ReportInForwardActivity) {
  const auto op = report(BipolarModel{}, 0.65, -5);
  EXPECT_NEAR(op.gm, op.collector_current / kVt, 1e-9 * op.gm);
  EXPECT_NEAR(op.r_pi, 100 / op.gm, 1e-9 * op.r_pi);
  EXPECT_NEAR(op.power, op.collector_current * 5.65 + op.base_current * 0.65, 1e-12 * op.power);
  EXPECT_EQ(op.region, stage::Region::forward_active);
  EXPECT_EQ(report(BipolarModel{}, 0.7, 0.6).region, stage::Region::saturation);
  EXPECT_EQ(report(BipolarModel{}, 0.1, -5).region, stage::Region::cutoff);
  EXPECT_EQ(report(BipolarModel{}, -5, 0.65).region, stage::Region::reverse_active);
}

// The names every report writes for the regions are those of spec section 7.
TEST(BipolarRegion, NamesOfTheSpec) {
  EXPECT_EQ(to_string(stage::Region::forward_active), "forward_active");
  EXPECT_EQ(to_string(stage::Region::saturation), "saturation");
  EXPECT_EQ(to_string(stage::Region::cutoff), "cutoff");
  EXPECT_EQ(to_string(stage::Region::reverse_active), "reverse_active");
}

}  // namespace
