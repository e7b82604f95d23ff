// The parameter tables of the bipolar and diode models (spec section 4): the
// name each parameter has in a `.stage` file, the field it sets, its quantity
// for unit checking, and whether it is a Gummel–Poon extra that
// `form = ebers_moll` rejects. Every extra beyond the Ebers–Moll transport
// model is marked: Early voltages, knee currents, leakage (recombination)
// currents, resistances and every charge (depletion and transit).
#include <array>
#include <cmath>

#include "stage/models.hpp"

namespace stage {
namespace {

using B = BipolarModel;
using R = ParameterRange;
using BP = ModelParameter<BipolarModel>;
constexpr bool kExtra = true;

constexpr std::array kBipolar{
    BP{"saturation_current", &B::saturation_current, Quantity::current, R::positive},
    BP{"beta_forward", &B::beta_forward, Quantity::dimensionless, R::positive},
    BP{"beta_reverse", &B::beta_reverse, Quantity::dimensionless, R::positive},
    BP{"emission_forward", &B::emission_forward, Quantity::dimensionless, R::positive},
    BP{"emission_reverse", &B::emission_reverse, Quantity::dimensionless, R::positive},
    BP{"early_voltage_forward", &B::early_voltage_forward, Quantity::voltage,
       R::positive_or_infinite, kExtra},
    BP{"early_voltage_reverse", &B::early_voltage_reverse, Quantity::voltage,
       R::positive_or_infinite, kExtra},
    BP{"knee_current_forward", &B::knee_current_forward, Quantity::current, R::positive_or_infinite,
       kExtra},
    BP{"knee_current_reverse", &B::knee_current_reverse, Quantity::current, R::positive_or_infinite,
       kExtra},
    BP{"be_leakage_current", &B::be_leakage_current, Quantity::current, R::non_negative, kExtra},
    BP{"be_leakage_emission", &B::be_leakage_emission, Quantity::dimensionless, R::positive,
       kExtra},
    BP{"bc_leakage_current", &B::bc_leakage_current, Quantity::current, R::non_negative, kExtra},
    BP{"bc_leakage_emission", &B::bc_leakage_emission, Quantity::dimensionless, R::positive,
       kExtra},
    BP{"base_resistance", &B::base_resistance, Quantity::resistance, R::non_negative, kExtra},
    BP{"base_resistance_min", &B::base_resistance_min, Quantity::resistance, R::finite, kExtra},
    BP{"base_resistance_half_current", &B::base_resistance_half_current, Quantity::current,
       R::positive_or_infinite, kExtra},
    BP{"emitter_resistance", &B::emitter_resistance, Quantity::resistance, R::non_negative, kExtra},
    BP{"collector_resistance", &B::collector_resistance, Quantity::resistance, R::non_negative,
       kExtra},
    BP{"be_capacitance", &B::be_capacitance, Quantity::capacitance, R::non_negative, kExtra},
    BP{"be_potential", &B::be_potential, Quantity::voltage, R::positive, kExtra},
    BP{"be_grading", &B::be_grading, Quantity::dimensionless, R::non_negative, kExtra},
    BP{"bc_capacitance", &B::bc_capacitance, Quantity::capacitance, R::non_negative, kExtra},
    BP{"bc_potential", &B::bc_potential, Quantity::voltage, R::positive, kExtra},
    BP{"bc_grading", &B::bc_grading, Quantity::dimensionless, R::non_negative, kExtra},
    BP{"bc_internal_fraction", &B::bc_internal_fraction, Quantity::dimensionless, R::fraction,
       kExtra},
    BP{"cs_capacitance", &B::cs_capacitance, Quantity::capacitance, R::non_negative, kExtra},
    BP{"cs_potential", &B::cs_potential, Quantity::voltage, R::positive, kExtra},
    BP{"cs_grading", &B::cs_grading, Quantity::dimensionless, R::non_negative, kExtra},
    BP{"forward_transit_time", &B::forward_transit_time, Quantity::time, R::non_negative, kExtra},
    BP{"reverse_transit_time", &B::reverse_transit_time, Quantity::time, R::non_negative, kExtra},
    BP{"transit_bias_coefficient", &B::transit_bias_coefficient, Quantity::dimensionless,
       R::non_negative, kExtra},
    BP{"transit_bc_voltage", &B::transit_bc_voltage, Quantity::voltage, R::positive_or_infinite,
       kExtra},
    BP{"transit_high_current", &B::transit_high_current, Quantity::current, R::non_negative,
       kExtra},
    BP{"excess_phase_delay", &B::excess_phase_delay, Quantity::time, R::non_negative, kExtra},
    BP{"depletion_fill_coefficient", &B::depletion_fill_coefficient, Quantity::dimensionless,
       R::below_one, kExtra},
    BP{"beta_temperature_exponent", &B::beta_temperature_exponent, Quantity::dimensionless,
       R::finite},
    BP{"bandgap_energy", &B::bandgap_energy, Quantity::energy, R::positive},
    BP{"saturation_current_temperature_exponent", &B::saturation_current_temperature_exponent,
       Quantity::dimensionless},
    BP{"reference_temperature", &B::reference_temperature, Quantity::temperature, R::positive},
    BP{"flicker_coefficient", &B::flicker_coefficient, Quantity::dimensionless, R::non_negative},
    BP{"flicker_exponent", &B::flicker_exponent, Quantity::dimensionless, R::positive},
    BP{"max_collector_emitter_voltage", &B::max_collector_emitter_voltage, Quantity::voltage,
       R::positive_or_infinite},
    BP{"max_collector_base_voltage", &B::max_collector_base_voltage, Quantity::voltage,
       R::positive_or_infinite},
    BP{"max_emitter_base_voltage", &B::max_emitter_base_voltage, Quantity::voltage,
       R::positive_or_infinite},
    BP{"max_collector_current", &B::max_collector_current, Quantity::current,
       R::positive_or_infinite},
    BP{"max_dissipation", &B::max_dissipation, Quantity::power, R::positive_or_infinite},
    BP{"rated_case_temperature", &B::rated_case_temperature, Quantity::temperature, R::positive},
    BP{"max_junction_temperature", &B::max_junction_temperature, Quantity::temperature,
       R::positive_or_infinite},
    BP{"second_breakdown_voltage", &B::second_breakdown_voltage, Quantity::voltage,
       R::positive_or_infinite},
    BP{"second_breakdown_current", &B::second_breakdown_current, Quantity::current,
       R::positive_or_infinite},
};

using D = DiodeModel;
using DP = ModelParameter<DiodeModel>;

constexpr std::array kDiode{
    DP{"saturation_current", &D::saturation_current, Quantity::current, R::positive},
    DP{"emission_coefficient", &D::emission_coefficient, Quantity::dimensionless, R::positive},
    DP{"series_resistance", &D::series_resistance, Quantity::resistance, R::non_negative},
    DP{"junction_capacitance", &D::junction_capacitance, Quantity::capacitance, R::non_negative},
    DP{"junction_potential", &D::junction_potential, Quantity::voltage, R::positive},
    DP{"grading", &D::grading, Quantity::dimensionless, R::non_negative},
    DP{"transit_time", &D::transit_time, Quantity::time, R::non_negative},
    DP{"breakdown_voltage", &D::breakdown_voltage, Quantity::voltage, R::positive_or_infinite},
    DP{"breakdown_current", &D::breakdown_current, Quantity::current, R::positive},
    DP{"depletion_fill_coefficient", &D::depletion_fill_coefficient, Quantity::dimensionless,
       R::below_one},
    DP{"bandgap_energy", &D::bandgap_energy, Quantity::energy, R::positive},
    DP{"saturation_current_temperature_exponent", &D::saturation_current_temperature_exponent,
       Quantity::dimensionless},
    DP{"reference_temperature", &D::reference_temperature, Quantity::temperature, R::positive},
};

}  // namespace

std::optional<std::string_view> range_error(ParameterRange range, double value) {
  switch (range) {
    case ParameterRange::finite:
      if (!std::isfinite(value)) return "must be finite";
      break;
    case ParameterRange::positive:
      if (!(std::isfinite(value) && value > 0)) return "must be positive and finite";
      break;
    case ParameterRange::positive_or_infinite:
      if (!(value > 0)) return "must be positive (inf switches it off)";
      break;
    case ParameterRange::non_negative:
      if (!(std::isfinite(value) && value >= 0)) return "must be zero or positive, and finite";
      break;
    case ParameterRange::below_one:
      if (!(value >= 0 && value < 1)) return "must be at least 0 and below 1";
      break;
    case ParameterRange::fraction:
      if (!(value >= 0 && value <= 1)) return "must lie between 0 and 1";
      break;
  }
  return std::nullopt;
}

std::span<const ModelParameter<BipolarModel>> bipolar_parameters() { return kBipolar; }
std::span<const ModelParameter<DiodeModel>> diode_parameters() { return kDiode; }

}  // namespace stage
