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
  const double reference = m.reference_temperature;
  const double ratio = kelvin / reference;
  const double beta_factor = std::pow(ratio, m.beta_temperature_exponent);
  const double is_exponent = m.saturation_current_temperature_exponent;
  const double eg = m.bandgap_energy;
  p.ebers_moll = m.form == BipolarForm::ebers_moll;
  p.vt = thermal_voltage(kelvin);
  p.transport_saturation =
      area * saturation_current_at(m.saturation_current, kelvin, reference, eg, is_exponent, 1);
  p.forward_ideality_vt = m.emission_forward * p.vt;
  p.reverse_ideality_vt = m.emission_reverse * p.vt;
  p.beta_forward = m.beta_forward * beta_factor;
  p.beta_reverse = m.beta_reverse * beta_factor;
  p.vcrit_be = critical_voltage(p.transport_saturation, p.forward_ideality_vt);
  p.vcrit_bc = critical_voltage(p.transport_saturation, p.reverse_ideality_vt);
  p.base_resistance = m.base_resistance / area;
  p.base_resistance_min =
      (m.base_resistance_min < 0 ? m.base_resistance : m.base_resistance_min) / area;
  p.emitter_resistance = m.emitter_resistance / area;
  p.collector_resistance = m.collector_resistance / area;
  p.bc_internal_fraction = m.bc_internal_fraction;
  p.fill_coefficient = m.depletion_fill_coefficient;
  p.forward_transit = m.forward_transit_time;
  p.reverse_transit = m.reverse_transit_time;

  p.be_potential = junction_potential_at(m.be_potential, kelvin, reference, eg);
  p.bc_potential = junction_potential_at(m.bc_potential, kelvin, reference, eg);
  p.cs_potential = junction_potential_at(m.cs_potential, kelvin, reference, eg);
  p.be_grading = m.be_grading;
  p.bc_grading = m.bc_grading;
  p.cs_grading = m.cs_grading;
  p.be_capacitance = area * depletion_capacitance_at(m.be_capacitance, m.be_potential,
                                                     p.be_potential, p.be_grading);
  p.bc_capacitance = area * depletion_capacitance_at(m.bc_capacitance, m.bc_potential,
                                                     p.bc_potential, p.bc_grading);
  p.cs_capacitance = area * depletion_capacitance_at(m.cs_capacitance, m.cs_potential,
                                                     p.cs_potential, p.cs_grading);
  if (p.ebers_moll) return p;  // the extras stay at their neutral values

  p.inverse_early_forward = inverse(m.early_voltage_forward);
  p.inverse_early_reverse = inverse(m.early_voltage_reverse);
  p.inverse_knee_forward = inverse(area * m.knee_current_forward);
  p.inverse_knee_reverse = inverse(area * m.knee_current_reverse);
  p.be_leakage_ideality_vt = m.be_leakage_emission * p.vt;
  p.bc_leakage_ideality_vt = m.bc_leakage_emission * p.vt;
  p.be_leakage = area *
                 saturation_current_at(m.be_leakage_current, kelvin, reference, eg, is_exponent,
                                       m.be_leakage_emission) /
                 beta_factor;
  p.bc_leakage = area *
                 saturation_current_at(m.bc_leakage_current, kelvin, reference, eg, is_exponent,
                                       m.bc_leakage_emission) /
                 beta_factor;
  p.base_resistance_half_current = area * m.base_resistance_half_current;
  p.transit_bias = m.transit_bias_coefficient;
  // The textbook form exp(vbc / (1.44 V_transit)): the bias dependence halves for
  // every transit_bc_voltage of B-C reverse bias (1.44 ~ 1 / ln 2).
  p.inverse_transit_bc_voltage = inverse(1.44 * m.transit_bc_voltage);
  p.transit_high_current = area * m.transit_high_current;
  p.excess_phase_delay = m.excess_phase_delay;
  return p;
}

GummelPoonCurrents gummel_poon_currents(const BipolarParameters& p, double vbe, double vbc) {
  GummelPoonCurrents c;
  const ValueSlope be = junction_current(p.transport_saturation, vbe, p.forward_ideality_vt);
  const ValueSlope bc = junction_current(p.transport_saturation, vbc, p.reverse_ideality_vt);
  c.ibe1 = be.value;
  c.gbe1 = be.slope;
  c.ibc1 = bc.value;
  c.gbc1 = bc.slope;
  c.ibe = c.ibe1 / p.beta_forward;
  c.dibe_dvbe = c.gbe1 / p.beta_forward;
  c.ibc = c.ibc1 / p.beta_reverse;
  c.dibc_dvbc = c.gbc1 / p.beta_reverse;
  if (p.ebers_moll) {
    c.ict = c.ibe1 - c.ibc1;
    c.dict_dvbe = c.gbe1;
    c.dict_dvbc = -c.gbc1;
    return c;
  }
  if (p.be_leakage > 0) {
    const ValueSlope leak = junction_current(p.be_leakage, vbe, p.be_leakage_ideality_vt);
    c.ibe += leak.value;
    c.dibe_dvbe += leak.slope;
  }
  if (p.bc_leakage > 0) {
    const ValueSlope leak = junction_current(p.bc_leakage, vbc, p.bc_leakage_ideality_vt);
    c.ibc += leak.value;
    c.dibc_dvbc += leak.slope;
  }
  // qb = q1 (1 + sqrt(1 + 4 q2)) / 2 with the Early-effect factor
  // q1 = 1 / (1 - vbc/V_early_f - vbe/V_early_r) and the high-injection term
  // q2 = ibe1/I_knee_f + ibc1/I_knee_r (Getreu, "Modeling the Bipolar Transistor",
  // 1978; Massobrio and Antognetti, 2nd ed., sec. 2.4).
  // The denominator of q1 is kept away from zero, which only a B-C forward
  // bias near the Early voltage would reach.
  const double d =
      std::max(1 - vbc * p.inverse_early_forward - vbe * p.inverse_early_reverse, 1e-3);
  const double q1 = 1 / d;
  const double dq1_dvbe = p.inverse_early_reverse * q1 * q1;
  const double dq1_dvbc = p.inverse_early_forward * q1 * q1;
  const double q2 = c.ibe1 * p.inverse_knee_forward + c.ibc1 * p.inverse_knee_reverse;
  const double s = std::sqrt(std::max(1 + 4 * q2, 0.0));
  const double dqb_dq2 = s > 0 ? q1 / s : 0;
  c.qb = q1 * (1 + s) / 2;
  c.dqb_dvbe = dq1_dvbe * (1 + s) / 2 + dqb_dq2 * c.gbe1 * p.inverse_knee_forward;
  c.dqb_dvbc = dq1_dvbc * (1 + s) / 2 + dqb_dq2 * c.gbc1 * p.inverse_knee_reverse;
  c.ict = (c.ibe1 - c.ibc1) / c.qb;
  c.dict_dvbe = (c.gbe1 - c.ict * c.dqb_dvbe) / c.qb;
  c.dict_dvbc = (-c.gbc1 - c.ict * c.dqb_dvbc) / c.qb;
  return c;
}

BaseResistance base_resistance(const BipolarParameters& p, const GummelPoonCurrents& i) {
  const double span = p.base_resistance - p.base_resistance_min;
  if (std::isinf(p.base_resistance_half_current)) {
    // Without a half current the base resistance falls with the base
    // charge: R_min + (R_0 - R_min) / qb (Massobrio and Antognetti, sec. 2.4).
    const double k = -span / (i.qb * i.qb);
    return {p.base_resistance_min + span / i.qb, k * i.dqb_dvbe, k * i.dqb_dvbc};
  }
  // Current crowding (Hauser, IEEE Trans. Electron Devices 1968, as stated
  // in Massobrio and Antognetti, sec. 2.4): R_min + (R_0 - R_min) f(z), with
  // f(z) = 3 (tan z - z) / (z tan^2 z), falling from 1 to 0, and
  // z = (sqrt(1 + 144 ib / (pi^2 I_half)) - 1) / ((24 / pi^2) sqrt(ib / I_half)),
  // written here as z = 6 sqrt(u) / (1 + sqrt(1 + a u)), u = ib / I_half,
  // a = 144 / pi^2, which does not cancel at small current. A reverse base
  // current is taken as zero (the resistance stays at R_0).
  const double u = std::max(i.ibe + i.ibc, 0.0) / p.base_resistance_half_current;
  const double a = 144 / (std::numbers::pi * std::numbers::pi);
  const double s = std::sqrt(1 + a * u);
  const double z = 6 * std::sqrt(u) / (1 + s);
  const TanForm t = tan_form(z);
  // d f / d u = h(z) * z dz/du, with z dz/du = d(z^2/2)/du.
  const double z_dz_du = 18 * ((1 + s) - u * a / s) / ((1 + s) * (1 + s) * (1 + s));
  const double dr_dib = u > 0 ? span * t.h * z_dz_du / p.base_resistance_half_current : 0;
  return {p.base_resistance_min + span * t.f, dr_dib * i.dibe_dvbe, dr_dib * i.dibc_dvbc};
}

GummelPoonCharges gummel_poon_charges(const BipolarParameters& p, const GummelPoonCurrents& i,
                                      double vbe, double vbc, double vbx, double vsc) {
  GummelPoonCharges q;
  const ValueSlope be =
      depletion_charge(vbe, p.be_capacitance, p.be_potential, p.be_grading, p.fill_coefficient);
  const ValueSlope bc = depletion_charge(vbc, p.bc_internal_fraction * p.bc_capacitance,
                                         p.bc_potential, p.bc_grading, p.fill_coefficient);
  const ValueSlope bx = depletion_charge(vbx, (1 - p.bc_internal_fraction) * p.bc_capacitance,
                                         p.bc_potential, p.bc_grading, p.fill_coefficient);
  const ValueSlope cs =
      depletion_charge(vsc, p.cs_capacitance, p.cs_potential, p.cs_grading, p.fill_coefficient);
  q.qbe = be.value;
  q.cbe_vbe = be.slope;
  q.qbc = bc.value;
  q.cbc = bc.slope;
  q.qbx = bx.value;
  q.cbx = bx.slope;
  q.qcs = cs.value;
  q.ccs = cs.slope;
  if (p.forward_transit > 0) {
    // Forward diffusion charge tff ibe1 / qb, with the bias-dependent transit
    // time tau_f (1 + transit_bias r^2 exp(vbc / (1.44 V_transit))), r = ibe1 / (ibe1 + I_transit)
    // (Massobrio and Antognetti, sec. 2.4).
    double r = 1, dr = 0;
    if (p.transit_high_current > 0) {
      r = i.ibe1 / (i.ibe1 + p.transit_high_current);
      dr = i.gbe1 * p.transit_high_current /
           ((i.ibe1 + p.transit_high_current) * (i.ibe1 + p.transit_high_current));
    }
    const double e = std::exp(vbc * p.inverse_transit_bc_voltage);
    const double tff = p.forward_transit * (1 + p.transit_bias * r * r * e);
    const double dtff_dvbe = p.forward_transit * p.transit_bias * 2 * r * dr * e;
    const double dtff_dvbc =
        p.forward_transit * p.transit_bias * r * r * e * p.inverse_transit_bc_voltage;
    const double charge = tff * i.ibe1 / i.qb;
    q.qbe += charge;
    q.cbe_vbe += dtff_dvbe * i.ibe1 / i.qb + tff * i.gbe1 / i.qb - charge * i.dqb_dvbe / i.qb;
    q.cbe_vbc += dtff_dvbc * i.ibe1 / i.qb - charge * i.dqb_dvbc / i.qb;
  }
  q.qbc += p.reverse_transit * i.ibc1;
  q.cbc += p.reverse_transit * i.gbc1;
  return q;
}

}  // namespace stage::devices
