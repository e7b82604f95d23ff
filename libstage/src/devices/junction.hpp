// The pieces of a pn junction that the diode and the bipolar transistor share:
// the exponential current, the depletion charge, Newton's junction-voltage
// limiting and the temperature scaling of junction parameters.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "mna/device.hpp"

namespace stage::devices {

// A quantity and its derivative with respect to the junction voltage.
struct ValueSlope {
  double value = 0;
  double slope = 0;
};

// Shockley current is * (exp(v / nvt) - 1). Above an exponent of
// kMaxExponent the exponential is continued by its tangent so that an
// unlimited evaluation (a report, a derivative check far out) stays finite.
inline constexpr double kMaxExponent = 80;
ValueSlope junction_current(double saturation_current, double v, double nvt);

// True where junction_current leaves the model for its tangent.
inline bool beyond_exponent_range(double v, double nvt) { return v > kMaxExponent * nvt; }

// Adds to `invalid` a message naming the device and its junction when v lies
// beyond nvt * kMaxExponent, where junction_current leaves the model for its
// tangent: a solution there is not a solution of the model.
void check_exponent_range(const std::string& device, std::string_view junction, double v,
                          double nvt, std::vector<mna::ModelRangeFinding>& invalid);

// Depletion charge of a junction with zero-bias capacitance c0, built-in
// potential phi and grading m: C(v) = c0 / (1 - v/phi)^m below fill*phi, and
// above it C continued linearly with the slope it has there, so the charge
// stays finite in forward bias. value = charge, slope = capacitance.
ValueSlope depletion_charge(double v, double c0, double phi, double m, double fill);

// The voltage above which the junction exponential is limited in Newton:
// where the junction's current-to-voltage curve bends (its curvature radius is
// smallest), nvt * ln(nvt / (sqrt(2) * is)).
double critical_voltage(double saturation_current, double nvt);

// Logarithmic limiting of a Newton step in junction voltage: above the
// critical voltage a step larger than 2 nvt is replaced by the step that
// changes the junction current by the same amount as the linearised current
// did, so the exponential grows at most linearly per iteration. See Vlach and
// Singhal, "Computer Methods for Circuit Analysis and Design", 2nd ed., on
// damping Newton for exponential nonlinearities (from memory).
double limit_junction_voltage(double v_new, double v_old, double nvt, double v_crit);

// Saturation current at `kelvin` from its value at `reference`: the
// intrinsic carrier density squared goes as T^3 exp(-Eg/kT), giving
// is(T) = is * (T/Tr)^(exponent/n) * exp((T/Tr - 1) * Eg / (n kT/q)).
// (Sze and Ng, "Physics of Semiconductor Devices", 3rd ed., sec. 2.3 for the
// diode current; the exponent form is the usual compact-model statement.)
double saturation_current_at(double is, double kelvin, double reference, double bandgap_ev,
                             double exponent, double emission);

// Built-in potential at `kelvin`. phi = (kT/q) ln(Na Nd / ni^2) with
// ni^2 ~ T^3 exp(-Eg/kT) (Sze and Ng, sec. 2.2) gives, for a bandgap taken
// constant (the model's bandgap_energy),
// phi(T) = phi * T/Tr - 3 (kT/q) ln(T/Tr) - Eg (T/Tr - 1).
double junction_potential_at(double phi, double kelvin, double reference, double bandgap_ev);

// Zero-bias depletion capacitance at a new potential: the depletion width
// goes as phi^m (Sze and Ng, sec. 2.2.2 and 2.3), so c0(T) = c0 (phi/phi(T))^m.
double depletion_capacitance_at(double c0, double phi, double phi_at_t, double grading);

}  // namespace stage::devices
