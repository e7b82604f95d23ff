// The Gummel–Poon bipolar transistor equations, free of any node wiring:
// temperature and area scaling of the model, then currents, base resistance
// and charges as functions of the internal junction voltages (in the npn
// sense; a pnp is mirrored by its caller), each with analytic derivatives.
//
// With infinite Early voltages and knee currents and no leakage the
// normalised base charge qb is exactly 1 and the equations are the Ebers–Moll
// transport model; `form = ebers_moll` skips the extras outright.
//
// Not used here: the flicker parameters (noise), accepted by the reader with
// no effect yet. The excess-phase delay of the transport current is a network
// of its own that bipolar.cpp wires behind these currents; it does not change
// DC or the charges.
#pragma once

#include "stage/models.hpp"

namespace stage::devices {

// Model parameters at one temperature and area; infinities become zero
// inverses so the equations need no branches.
struct BipolarParameters {
  bool ebers_moll = false;
  double vt = 0;  // kT/q
  double transport_saturation = 0;
  double forward_ideality_vt = 0, reverse_ideality_vt = 0;  // emission coefficient * vt
  double beta_forward = 0, beta_reverse = 0;
  double inverse_early_forward = 0, inverse_early_reverse = 0;
  double inverse_knee_forward = 0, inverse_knee_reverse = 0;
  double be_leakage = 0, be_leakage_ideality_vt = 0, bc_leakage = 0, bc_leakage_ideality_vt = 0;
  double base_resistance = 0, base_resistance_min = 0, base_resistance_half_current = kInfinity;
  double emitter_resistance = 0, collector_resistance = 0;
  double be_capacitance = 0, be_potential = 0, be_grading = 0;
  double bc_capacitance = 0, bc_potential = 0, bc_grading = 0, bc_internal_fraction = 1;
  double cs_capacitance = 0, cs_potential = 0, cs_grading = 0;
  double fill_coefficient = 0;
  double forward_transit = 0, reverse_transit = 0, transit_bias = 0;
  double inverse_transit_bc_voltage = 0, transit_high_current = 0;
  double excess_phase_delay = 0;
  double vcrit_be = 0, vcrit_bc = 0;  // where Newton limiting starts
};

// Temperature relations (textbook forms; see junction.hpp for the
// saturation current and potentials), with Tr the reference temperature,
// a the saturation-current temperature exponent and b the beta one:
//   I_S(T)  = I_S (T/Tr)^a exp((T/Tr - 1) Eg / vt(T))
//   beta(T) = beta (T/Tr)^b
//   leakage current with its own emission n: scaled like I_S with n, divided
//   by (T/Tr)^b, so that the leakage-limited beta follows the same law
//   (Massobrio and Antognetti, "Semiconductor Device Modeling", 2nd ed.,
//   ch. 2, temperature dependence of the bipolar model; from memory);
//   potentials and zero-bias capacitances as in junction.hpp.
BipolarParameters scale_bipolar(const BipolarModel& model, double area, double kelvin);

// DC currents at internal junction voltages vbe = v(b') - v(e'),
// vbc = v(b') - v(c').
struct GummelPoonCurrents {
  double ibe1 = 0, gbe1 = 0;  // forward diffusion current I_S (e^(vbe/n vt) - 1) and slope
  double ibc1 = 0, gbc1 = 0;
  double qb = 1, dqb_dvbe = 0, dqb_dvbc = 0;     // normalised base charge
  double ict = 0, dict_dvbe = 0, dict_dvbc = 0;  // transport current c' -> e'
  double ibe = 0, dibe_dvbe = 0;  // base current b' -> e': ibe1/beta_forward + leakage
  double ibc = 0, dibc_dvbc = 0;  // base current b' -> c': ibc1/beta_reverse + leakage
};
GummelPoonCurrents gummel_poon_currents(const BipolarParameters& p, double vbe, double vbc);

// Base resistance between the base terminal and b'.
struct BaseResistance {
  double r = 0, dr_dvbe = 0, dr_dvbc = 0;
};
BaseResistance base_resistance(const BipolarParameters& p, const GummelPoonCurrents& i);

// Charges (depletion plus diffusion) and their capacitances.
struct GummelPoonCharges {
  double qbe = 0, cbe_vbe = 0, cbe_vbc = 0;  // b' -> e', depends on vbe and (via qb, tf) vbc
  double qbc = 0, cbc = 0;                   // b' -> c'
  double qbx = 0, cbx = 0;                   // b -> c' (external share of the B-C depletion)
  double qcs = 0, ccs = 0;                   // s -> c'
};
GummelPoonCharges gummel_poon_charges(const BipolarParameters& p, const GummelPoonCurrents& i,
                                      double vbe, double vbc, double vbx, double vsc);

}  // namespace stage::devices
