// Device model parameters (spec section 4) as plain structs, with the table
// that maps each `.stage` parameter name to its field and unit. Defaults are
// the spec's, each on the ground its table states: every effect a designer
// switches on deliberately defaults to off (zero, or infinity where infinity
// switches it off); the rest are silicon physics at 300 K.
#pragma once

#include <limits>
#include <map>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <tuple>
#include <variant>
#include <vector>

#include "stage/units.hpp"

namespace stage {

inline constexpr double kInfinity = std::numeric_limits<double>::infinity();
inline constexpr double kRoomTemperature = 300.15;  // 27 °C in kelvin
// Grading exponents of the depletion capacitance: 1/2 for an abrupt
// junction, 1/3 for a linearly graded one (Sze and Ng, "Physics of
// Semiconductor Devices", 3rd ed., sec. 2.2; from memory).
inline constexpr double kAbruptGrading = 0.5;
inline constexpr double kLinearlyGradedGrading = 1.0 / 3;
// Silicon band gap at 300 K, eV (Sze and Ng, 3rd ed., appendix F; from memory).
inline constexpr double kSiliconBandgap = 1.12;

enum class BipolarForm { gummel_poon, ebers_moll };

struct BipolarModel {
  BipolarForm form = BipolarForm::gummel_poon;
  double saturation_current = 1e-16;
  double beta_forward = 100;
  double beta_reverse = 1;
  double emission_forward = 1;
  double emission_reverse = 1;
  double early_voltage_forward = kInfinity;
  double early_voltage_reverse = kInfinity;
  double knee_current_forward = kInfinity;
  double knee_current_reverse = kInfinity;
  double be_leakage_current = 0;
  double be_leakage_emission = 2;
  double bc_leakage_current = 0;
  double bc_leakage_emission = 2;
  double base_resistance = 0;
  double base_resistance_min = -1;  // negative: equal to base_resistance
  double base_resistance_half_current = kInfinity;
  double emitter_resistance = 0;
  double collector_resistance = 0;
  double be_capacitance = 0;
  double be_potential = 0.95;
  double be_grading = kAbruptGrading;
  double bc_capacitance = 0;
  double bc_potential = 0.78;
  double bc_grading = kLinearlyGradedGrading;
  double bc_internal_fraction = 1;
  double cs_capacitance = 0;
  double cs_potential = 0.66;
  double cs_grading = kAbruptGrading;
  double forward_transit_time = 0;
  double reverse_transit_time = 0;
  double transit_bias_coefficient = 0;
  double transit_bc_voltage = kInfinity;
  double transit_high_current = 0;
  double excess_phase_delay = 0;  // s
  double depletion_fill_coefficient = 0.5;
  double beta_temperature_exponent = 0;
  double bandgap_energy = kSiliconBandgap;  // eV
  double saturation_current_temperature_exponent = 3;
  double reference_temperature = kRoomTemperature;
  double flicker_coefficient = 0;
  double flicker_exponent = 1;
  // Maximum ratings (spec section 4, "Ratings"); infinite: not rated. The
  // voltages are magnitudes in the transistor's own sense (VCE, VCB, VEB of
  // an npn; their negatives for a pnp).
  double max_collector_emitter_voltage = kInfinity;
  double max_collector_base_voltage = kInfinity;
  double max_emitter_base_voltage = kInfinity;
  double max_collector_current = kInfinity;
  double max_dissipation = kInfinity;           // W, at rated_case_temperature
  double rated_case_temperature = 298.15;       // K, 25 °C
  double max_junction_temperature = kInfinity;  // K; with max_dissipation, the derating
  // The second-breakdown segment of the safe operating area: it leaves the
  // constant-power line at this voltage and falls, straight on log axes,
  // to second_breakdown_current at max_collector_emitter_voltage.
  double second_breakdown_voltage = kInfinity;
  double second_breakdown_current = kInfinity;
  bool operator==(const BipolarModel&) const = default;
};

struct DiodeModel {
  double saturation_current = 1e-14;
  double emission_coefficient = 1;
  double series_resistance = 0;
  double junction_capacitance = 0;
  double junction_potential = 0.89;
  double grading = kAbruptGrading;
  double transit_time = 0;
  double breakdown_voltage = kInfinity;
  double breakdown_current = 1e-3;
  double depletion_fill_coefficient = 0.5;
  double bandgap_energy = kSiliconBandgap;  // eV
  double saturation_current_temperature_exponent = 3;
  double reference_temperature = kRoomTemperature;
  bool operator==(const DiodeModel&) const = default;
};

// Models by name, one map per model kind. Every model kind is listed once,
// as an argument of `Models` below; code that handles every kind iterates
// them instead of naming each.
template <class... Kinds>
class ModelLibrary {
 public:
  using Any = std::variant<Kinds...>;  // one model of any kind

  template <class Model>
  const std::map<std::string, Model>& of() const {
    return std::get<std::map<std::string, Model>>(maps_);
  }
  // Adds a model, or replaces the one of the same kind and name.
  template <class Model>
  void add(std::string name, Model model) {
    std::get<std::map<std::string, Model>>(maps_)[std::move(name)] = std::move(model);
  }
  void add(std::string name, const Any& model) {
    std::visit([&](const auto& m) { add(std::move(name), m); }, model);
  }
  // Calls f(map) with each kind's map in turn.
  template <class F>
  void for_each_kind(F&& f) const {
    std::apply([&](const auto&... map) { (f(map), ...); }, maps_);
  }
  std::size_t size() const {
    std::size_t n = 0;
    for_each_kind([&](const auto& map) { n += map.size(); });
    return n;
  }
  // Every model's name, kind by kind.
  std::vector<std::string> names() const {
    std::vector<std::string> out;
    for_each_kind([&](const auto& map) {
      for (const auto& entry : map) out.push_back(entry.first);
    });
    return out;
  }
  // The model of that name, of whichever kind; the first kind's if several.
  std::optional<Any> find(const std::string& name) const {
    std::optional<Any> found;
    for_each_kind([&](const auto& map) {
      const auto it = map.find(name);
      if (!found && it != map.end()) found = it->second;
    });
    return found;
  }
  bool operator==(const ModelLibrary&) const = default;

 private:
  std::tuple<std::map<std::string, Kinds>...> maps_;
};

using Models = ModelLibrary<BipolarModel, DiodeModel>;
using AnyModel = Models::Any;

// The values a model parameter may take (NaN never).
enum class ParameterRange {
  finite,                // any finite number
  positive,              // finite and above zero
  positive_or_infinite,  // above zero; infinity switches the effect off
  non_negative,          // finite, zero or above
  below_one,             // from 0 up to, not including, 1
  fraction,              // from 0 to 1
};

// One row of a model's parameter table.
template <class Model>
struct ModelParameter {
  std::string_view name;
  double Model::*field;
  Quantity quantity;
  ParameterRange range;
  // True for the Gummel–Poon extras that `form = ebers_moll` rejects.
  bool gummel_poon_only = false;
};

// Why `value` is outside `range`, as the end of a sentence ("must be
// positive"), or nothing.
std::optional<std::string_view> range_error(ParameterRange range, double value);

std::span<const ModelParameter<BipolarModel>> bipolar_parameters();
std::span<const ModelParameter<DiodeModel>> diode_parameters();

}  // namespace stage
