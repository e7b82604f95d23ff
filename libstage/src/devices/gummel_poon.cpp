// Gummel–Poon currents, base resistance and charges with their derivatives.
#include "devices/gummel_poon.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

#include "devices/junction.hpp"
#include "devices/physical_constants.hpp"

namespace stage::devices {
namespace {

double inverse(double x) { return std::isinf(x) ? 0 : 1 / x; }

// f(z) = 3 (tan z - z) / (z tan^2 z) and h(z) = f'(z) / z, by their Taylor
// series near z = 0 where the closed form cancels.
struct TanForm {
  double f, h;
};
TanForm tan_form(double z) {
  const double z2 = z * z;
  if (z < 1e-2) {
    return {1 - z2 * (4.0 / 15 + z2 * (4.0 / 105 + z2 * 8.0 / 1575)),
            -8.0 / 15 - z2 * (16.0 / 105 + z2 * (16.0 / 525 + z2 * 32.0 / 6237))};
  }
  const double t = std::tan(z);
  const double f = 3 * (t - z) / (z * t * t);
  const double df = 3 / z - 3 * (t - z) * (t + 2 * z * (1 + t * t)) / (z2 * t * t * t);
  return {f, df / z};
}

}  // namespace

BipolarParameters scale_bipolar(const BipolarModel& m, double area, double kelvin) {
  BipolarParameters p;
  const double tr = m.reference_temperature;
  const double ratio = kelvin / tr;
  const double beta_factor = std::pow(ratio, m.beta_temperature_exponent);
  const double xti = m.saturation_current_temperature_exponent;
  const double eg = m.bandgap_energy;
  p.ebers_moll = m.form == BipolarForm::ebers_moll;
  p.vt = thermal_voltage(kelvin);
  p.is = area * saturation_current_at(m.saturation_current, kelvin, tr, eg, xti, 1);
  p.nf_vt = m.emission_forward * p.vt;
  p.nr_vt = m.emission_reverse * p.vt;
  p.bf = m.beta_forward * beta_factor;
  p.br = m.beta_reverse * beta_factor;
  p.vcrit_be = critical_voltage(p.is, p.nf_vt);
  p.vcrit_bc = critical_voltage(p.is, p.nr_vt);
  p.rb = m.base_resistance / area;
  p.rbm = (m.base_resistance_min < 0 ? m.base_resistance : m.base_resistance_min) / area;
  p.re = m.emitter_resistance / area;
  p.rc = m.collector_resistance / area;
  p.xcjc = m.bc_internal_fraction;
  p.fc = m.depletion_fill_coefficient;
  p.tf = m.forward_transit_time;
  p.tr = m.reverse_transit_time;

  p.vje = junction_potential_at(m.be_potential, kelvin, tr, eg);
  p.vjc = junction_potential_at(m.bc_potential, kelvin, tr, eg);
  p.vjs = junction_potential_at(m.cs_potential, kelvin, tr, eg);
  p.mje = m.be_grading;
  p.mjc = m.bc_grading;
  p.mjs = m.cs_grading;
  p.cje = area * depletion_capacitance_at(m.be_capacitance, m.be_potential, p.vje, p.mje);
  p.cjc = area * depletion_capacitance_at(m.bc_capacitance, m.bc_potential, p.vjc, p.mjc);
  p.cjs = area * depletion_capacitance_at(m.cs_capacitance, m.cs_potential, p.vjs, p.mjs);
  if (p.ebers_moll) return p;  // the extras stay at their neutral values

  p.inv_vaf = inverse(m.early_voltage_forward);
  p.inv_var = inverse(m.early_voltage_reverse);
  p.inv_ikf = inverse(area * m.knee_current_forward);
  p.inv_ikr = inverse(area * m.knee_current_reverse);
  p.ne_vt = m.be_leakage_emission * p.vt;
  p.nc_vt = m.bc_leakage_emission * p.vt;
  p.ise = area *
          saturation_current_at(m.be_leakage_current, kelvin, tr, eg, xti, m.be_leakage_emission) /
          beta_factor;
  p.isc = area *
          saturation_current_at(m.bc_leakage_current, kelvin, tr, eg, xti, m.bc_leakage_emission) /
          beta_factor;
  p.irb = area * m.base_resistance_half_current;
  p.xtf = m.transit_bias_coefficient;
  // The textbook form exp(vbc / (1.44 vtf)): the bias dependence halves for
  // every transit_bc_voltage of B-C reverse bias (1.44 ~ 1 / ln 2).
  p.inv_vtf = inverse(1.44 * m.transit_bc_voltage);
  p.itf = area * m.transit_high_current;
  return p;
}

GummelPoonCurrents gummel_poon_currents(const BipolarParameters& p, double vbe, double vbc) {
  GummelPoonCurrents c;
  const ValueSlope be = junction_current(p.is, vbe, p.nf_vt);
  const ValueSlope bc = junction_current(p.is, vbc, p.nr_vt);
  c.ibe1 = be.value;
  c.gbe1 = be.slope;
  c.ibc1 = bc.value;
  c.gbc1 = bc.slope;
  c.ibe = c.ibe1 / p.bf;
  c.dibe_dvbe = c.gbe1 / p.bf;
  c.ibc = c.ibc1 / p.br;
  c.dibc_dvbc = c.gbc1 / p.br;
  if (p.ebers_moll) {
    c.ict = c.ibe1 - c.ibc1;
    c.dict_dvbe = c.gbe1;
    c.dict_dvbc = -c.gbc1;
    return c;
  }
  if (p.ise > 0) {
    const ValueSlope leak = junction_current(p.ise, vbe, p.ne_vt);
    c.ibe += leak.value;
    c.dibe_dvbe += leak.slope;
  }
  if (p.isc > 0) {
    const ValueSlope leak = junction_current(p.isc, vbc, p.nc_vt);
    c.ibc += leak.value;
    c.dibc_dvbc += leak.slope;
  }
  // qb = q1 (1 + sqrt(1 + 4 q2)) / 2 with the Early-effect factor
  // q1 = 1 / (1 - vbc/vaf - vbe/var) and the high-injection term
  // q2 = ibe1/ikf + ibc1/ikr (Getreu, "Modeling the Bipolar Transistor",
  // 1978; Massobrio and Antognetti, 2nd ed., sec. 2.4).
  // The denominator of q1 is kept away from zero, which only a B-C forward
  // bias near the Early voltage would reach.
  const double d = std::max(1 - vbc * p.inv_vaf - vbe * p.inv_var, 1e-3);
  const double q1 = 1 / d;
  const double dq1_dvbe = p.inv_var * q1 * q1;
  const double dq1_dvbc = p.inv_vaf * q1 * q1;
  const double q2 = c.ibe1 * p.inv_ikf + c.ibc1 * p.inv_ikr;
  const double s = std::sqrt(std::max(1 + 4 * q2, 0.0));
  const double dqb_dq2 = s > 0 ? q1 / s : 0;
  c.qb = q1 * (1 + s) / 2;
  c.dqb_dvbe = dq1_dvbe * (1 + s) / 2 + dqb_dq2 * c.gbe1 * p.inv_ikf;
  c.dqb_dvbc = dq1_dvbc * (1 + s) / 2 + dqb_dq2 * c.gbc1 * p.inv_ikr;
  c.ict = (c.ibe1 - c.ibc1) / c.qb;
  c.dict_dvbe = (c.gbe1 - c.ict * c.dqb_dvbe) / c.qb;
  c.dict_dvbc = (-c.gbc1 - c.ict * c.dqb_dvbc) / c.qb;
  return c;
}

BaseResistance base_resistance(const BipolarParameters& p, const GummelPoonCurrents& i) {
  const double span = p.rb - p.rbm;
  if (std::isinf(p.irb)) {
    // Without a half current the base resistance falls with the base
    // charge: rbm + (rb - rbm) / qb (Massobrio and Antognetti, sec. 2.4).
    const double k = -span / (i.qb * i.qb);
    return {p.rbm + span / i.qb, k * i.dqb_dvbe, k * i.dqb_dvbc};
  }
  // Current crowding (Hauser, IEEE Trans. Electron Devices 1968, as stated
  // in Massobrio and Antognetti, sec. 2.4): rbm + (rb - rbm) f(z), with
  // f(z) = 3 (tan z - z) / (z tan^2 z), falling from 1 to 0, and
  // z = (sqrt(1 + 144 ib / (pi^2 irb)) - 1) / ((24 / pi^2) sqrt(ib / irb)),
  // written here as z = 6 sqrt(u) / (1 + sqrt(1 + a u)), u = ib / irb,
  // a = 144 / pi^2, which does not cancel at small current. A reverse base
  // current is taken as zero (the resistance stays at rb).
  const double u = std::max(i.ibe + i.ibc, 0.0) / p.irb;
  const double a = 144 / (std::numbers::pi * std::numbers::pi);
  const double s = std::sqrt(1 + a * u);
  const double z = 6 * std::sqrt(u) / (1 + s);
  const TanForm t = tan_form(z);
  // d f / d u = h(z) * z dz/du, with z dz/du = d(z^2/2)/du.
  const double z_dz_du = 18 * ((1 + s) - u * a / s) / ((1 + s) * (1 + s) * (1 + s));
  const double dr_dib = u > 0 ? span * t.h * z_dz_du / p.irb : 0;
  return {p.rbm + span * t.f, dr_dib * i.dibe_dvbe, dr_dib * i.dibc_dvbc};
}

GummelPoonCharges gummel_poon_charges(const BipolarParameters& p, const GummelPoonCurrents& i,
                                      double vbe, double vbc, double vbx, double vsc) {
  GummelPoonCharges q;
  const ValueSlope be = depletion_charge(vbe, p.cje, p.vje, p.mje, p.fc);
  const ValueSlope bc = depletion_charge(vbc, p.xcjc * p.cjc, p.vjc, p.mjc, p.fc);
  const ValueSlope bx = depletion_charge(vbx, (1 - p.xcjc) * p.cjc, p.vjc, p.mjc, p.fc);
  const ValueSlope cs = depletion_charge(vsc, p.cjs, p.vjs, p.mjs, p.fc);
  q.qbe = be.value;
  q.cbe_vbe = be.slope;
  q.qbc = bc.value;
  q.cbc = bc.slope;
  q.qbx = bx.value;
  q.cbx = bx.slope;
  q.qcs = cs.value;
  q.ccs = cs.slope;
  if (p.tf > 0) {
    // Forward diffusion charge tff ibe1 / qb, with the bias-dependent transit
    // time tff = tf (1 + xtf r^2 exp(vbc / (1.44 vtf))), r = ibe1 / (ibe1 + itf)
    // (Massobrio and Antognetti, sec. 2.4).
    double r = 1, dr = 0;
    if (p.itf > 0) {
      r = i.ibe1 / (i.ibe1 + p.itf);
      dr = i.gbe1 * p.itf / ((i.ibe1 + p.itf) * (i.ibe1 + p.itf));
    }
    const double e = std::exp(vbc * p.inv_vtf);
    const double tff = p.tf * (1 + p.xtf * r * r * e);
    const double dtff_dvbe = p.tf * p.xtf * 2 * r * dr * e;
    const double dtff_dvbc = p.tf * p.xtf * r * r * e * p.inv_vtf;
    const double charge = tff * i.ibe1 / i.qb;
    q.qbe += charge;
    q.cbe_vbe += dtff_dvbe * i.ibe1 / i.qb + tff * i.gbe1 / i.qb - charge * i.dqb_dvbe / i.qb;
    q.cbe_vbc += dtff_dvbc * i.ibe1 / i.qb - charge * i.dqb_dvbc / i.qb;
  }
  q.qbc += p.tr * i.ibc1;
  q.cbc += p.tr * i.gbc1;
  return q;
}

}  // namespace stage::devices
