// Shared pn-junction helpers; see junction.hpp for the relations used.
#include "devices/junction.hpp"

#include <spdlog/fmt/fmt.h>

#include <cmath>
#include <numbers>

#include "devices/physical_constants.hpp"

namespace stage::devices {

ValueSlope junction_current(double saturation_current, double v, double nvt) {
  const double arg = v / nvt;
  if (arg <= kMaxExponent) {
    const double e = std::exp(arg);
    return {saturation_current * (e - 1), saturation_current * e / nvt};
  }
  const double e = std::exp(kMaxExponent);
  return {saturation_current * (e * (1 + arg - kMaxExponent) - 1), saturation_current * e / nvt};
}

void check_exponent_range(const std::string& device, std::string_view junction, double v,
                          double nvt, std::vector<mna::ModelRangeFinding>& invalid) {
  if (!beyond_exponent_range(v, nvt)) return;
  const double edge = kMaxExponent * nvt;
  invalid.push_back(
      {device,
       fmt::format(
           "{}: its {} junction is driven to {:.4g} V, beyond {:.4g} V where the model's "
           "exponential "
           "holds; nothing in the circuit limits the junction's current (a source or a very low "
           "resistance across it?)",
           device, junction, v, edge)});
}

ValueSlope depletion_charge(double v, double c0, double phi, double m, double fill) {
  if (c0 == 0) return {};
  const double v_fill = fill * phi;
  const double vc = std::min(v, v_fill);
  const double base = 1 - vc / phi;
  ValueSlope at;
  at.slope = c0 * std::pow(base, -m);
  at.value = m == 1 ? -c0 * phi * std::log(base) : c0 * phi * (1 - std::pow(base, 1 - m)) / (1 - m);
  if (v <= v_fill) return at;
  // Linear continuation of C: C(v) = C_f (1 + m (v - v_f) / (phi (1 - fill))).
  const double dv = v - v_fill;
  const double rise = m / (phi * (1 - fill));
  return {at.value + at.slope * (dv + 0.5 * rise * dv * dv), at.slope * (1 + rise * dv)};
}

double critical_voltage(double saturation_current, double nvt) {
  return nvt * std::log(nvt / (std::numbers::sqrt2 * saturation_current));
}

double limit_junction_voltage(double v_new, double v_old, double nvt, double v_crit) {
  if (v_new <= v_crit || std::abs(v_new - v_old) <= 2 * nvt) return v_new;
  if (v_old > 0) {
    const double arg = 1 + (v_new - v_old) / nvt;
    return arg > 0 ? v_old + nvt * std::log(arg) : v_crit;
  }
  return nvt * std::log(v_new / nvt);
}

double saturation_current_at(double is, double kelvin, double reference, double bandgap_ev,
                             double exponent, double emission) {
  const double ratio = kelvin / reference;
  const double nvt = emission * thermal_voltage(kelvin);
  return is * std::pow(ratio, exponent / emission) * std::exp((ratio - 1) * bandgap_ev / nvt);
}

double junction_potential_at(double phi, double kelvin, double reference, double bandgap_ev) {
  const double ratio = kelvin / reference;
  return phi * ratio - 3 * thermal_voltage(kelvin) * std::log(ratio) - bandgap_ev * (ratio - 1);
}

double depletion_capacitance_at(double c0, double phi, double phi_at_t, double grading) {
  return c0 * std::pow(phi / phi_at_t, grading);
}

}  // namespace stage::devices
