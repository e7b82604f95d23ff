// The parameter tables of the bipolar and diode models (spec section 4): the
// name each parameter has in a `.stage` file, the field it sets, its quantity
// for unit checking, and whether it is a Gummel–Poon extra that
// `form = ebers_moll` rejects. Every extra beyond the Ebers–Moll transport
// model is marked: Early voltages, knee currents, leakage (recombination)
// currents, resistances and every charge (depletion and transit).
#include <array>

#include "stage/models.hpp"

namespace stage {
namespace {

using B = BipolarModel;
using BP = ModelParameter<BipolarModel>;
constexpr bool kExtra = true;

constexpr std::array kBipolar{
    BP{"saturation_current", &B::saturation_current, Quantity::current},
    BP{"beta_forward", &B::beta_forward, Quantity::dimensionless},
    BP{"beta_reverse", &B::beta_reverse, Quantity::dimensionless},
    BP{"emission_forward", &B::emission_forward, Quantity::dimensionless},
    BP{"emission_reverse", &B::emission_reverse, Quantity::dimensionless},
    BP{"early_voltage_forward", &B::early_voltage_forward, Quantity::voltage, kExtra},
    BP{"early_voltage_reverse", &B::early_voltage_reverse, Quantity::voltage, kExtra},
    BP{"knee_current_forward", &B::knee_current_forward, Quantity::current, kExtra},
    BP{"knee_current_reverse", &B::knee_current_reverse, Quantity::current, kExtra},
    BP{"be_leakage_current", &B::be_leakage_current, Quantity::current, kExtra},
    BP{"be_leakage_emission", &B::be_leakage_emission, Quantity::dimensionless, kExtra},
    BP{"bc_leakage_current", &B::bc_leakage_current, Quantity::current, kExtra},
    BP{"bc_leakage_emission", &B::bc_leakage_emission, Quantity::dimensionless, kExtra},
    BP{"base_resistance", &B::base_resistance, Quantity::resistance, kExtra},
    BP{"base_resistance_min", &B::base_resistance_min, Quantity::resistance, kExtra},
    BP{"base_resistance_half_current", &B::base_resistance_half_current, Quantity::current, kExtra},
    BP{"emitter_resistance", &B::emitter_resistance, Quantity::resistance, kExtra},
    BP{"collector_resistance", &B::collector_resistance, Quantity::resistance, kExtra},
    BP{"be_capacitance", &B::be_capacitance, Quantity::capacitance, kExtra},
    BP{"be_potential", &B::be_potential, Quantity::voltage, kExtra},
    BP{"be_grading", &B::be_grading, Quantity::dimensionless, kExtra},
    BP{"bc_capacitance", &B::bc_capacitance, Quantity::capacitance, kExtra},
    BP{"bc_potential", &B::bc_potential, Quantity::voltage, kExtra},
    BP{"bc_grading", &B::bc_grading, Quantity::dimensionless, kExtra},
    BP{"bc_internal_fraction", &B::bc_internal_fraction, Quantity::dimensionless, kExtra},
    BP{"cs_capacitance", &B::cs_capacitance, Quantity::capacitance, kExtra},
    BP{"cs_potential", &B::cs_potential, Quantity::voltage, kExtra},
    BP{"cs_grading", &B::cs_grading, Quantity::dimensionless, kExtra},
    BP{"forward_transit_time", &B::forward_transit_time, Quantity::time, kExtra},
    BP{"reverse_transit_time", &B::reverse_transit_time, Quantity::time, kExtra},
    BP{"transit_bias_coefficient", &B::transit_bias_coefficient, Quantity::dimensionless, kExtra},
    BP{"transit_bc_voltage", &B::transit_bc_voltage, Quantity::voltage, kExtra},
    BP{"transit_high_current", &B::transit_high_current, Quantity::current, kExtra},
    BP{"excess_phase", &B::excess_phase, Quantity::angle, kExtra},
    BP{"depletion_fill_coefficient", &B::depletion_fill_coefficient, Quantity::dimensionless,
       kExtra},
    BP{"beta_temperature_exponent", &B::beta_temperature_exponent, Quantity::dimensionless},
    BP{"bandgap_energy", &B::bandgap_energy, Quantity::energy},
    BP{"saturation_current_temperature_exponent", &B::saturation_current_temperature_exponent,
       Quantity::dimensionless},
    BP{"reference_temperature", &B::reference_temperature, Quantity::temperature},
    BP{"flicker_coefficient", &B::flicker_coefficient, Quantity::dimensionless},
    BP{"flicker_exponent", &B::flicker_exponent, Quantity::dimensionless},
};

using D = DiodeModel;
using DP = ModelParameter<DiodeModel>;

constexpr std::array kDiode{
    DP{"saturation_current", &D::saturation_current, Quantity::current},
    DP{"emission_coefficient", &D::emission_coefficient, Quantity::dimensionless},
    DP{"series_resistance", &D::series_resistance, Quantity::resistance},
    DP{"junction_capacitance", &D::junction_capacitance, Quantity::capacitance},
    DP{"junction_potential", &D::junction_potential, Quantity::voltage},
    DP{"grading", &D::grading, Quantity::dimensionless},
    DP{"transit_time", &D::transit_time, Quantity::time},
    DP{"breakdown_voltage", &D::breakdown_voltage, Quantity::voltage},
    DP{"breakdown_current", &D::breakdown_current, Quantity::current},
    DP{"depletion_fill_coefficient", &D::depletion_fill_coefficient, Quantity::dimensionless},
    DP{"bandgap_energy", &D::bandgap_energy, Quantity::energy},
    DP{"saturation_current_temperature_exponent", &D::saturation_current_temperature_exponent,
       Quantity::dimensionless},
    DP{"reference_temperature", &D::reference_temperature, Quantity::temperature},
};

}  // namespace

std::span<const ModelParameter<BipolarModel>> bipolar_parameters() { return kBipolar; }
std::span<const ModelParameter<DiodeModel>> diode_parameters() { return kDiode; }

}  // namespace stage
