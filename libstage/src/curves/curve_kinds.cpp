// The tables behind curve_kinds.hpp. Default tolerances are common practice
// for regression against handbook curves read off a log plot: 5 % on
// currents, gains and capacitances, 10 % on transition frequency (itself an
// extrapolated figure), 10 mV on voltages.
#include "curves/curve_kinds.hpp"

#include <algorithm>
#include <array>

namespace stage::curves {
namespace {

using Q = CurveQuantity;

constexpr std::array kQuantities{
    QuantityInfo{Q::base_emitter_voltage, "base_emitter_voltage", "V", false, 0.010},
    QuantityInfo{Q::collector_emitter_voltage, "collector_emitter_voltage", "V", false, 0.010},
    QuantityInfo{Q::reverse_voltage, "reverse_voltage", "V", false, 0.010},
    QuantityInfo{Q::forward_voltage, "forward_voltage", "V", false, 0.010},
    QuantityInfo{Q::collector_current, "collector_current", "A", true, 0.05},
    QuantityInfo{Q::base_current, "base_current", "A", true, 0.05},
    QuantityInfo{Q::forward_current, "forward_current", "A", true, 0.05},
    QuantityInfo{Q::current_gain, "current_gain", "1", true, 0.05},
    QuantityInfo{Q::base_emitter_capacitance, "base_emitter_capacitance", "F", true, 0.05},
    QuantityInfo{Q::base_collector_capacitance, "base_collector_capacitance", "F", true, 0.05},
    QuantityInfo{Q::diode_capacitance, "diode_capacitance", "F", true, 0.05},
    QuantityInfo{Q::transition_frequency, "transition_frequency", "Hz", true, 0.10},
    QuantityInfo{Q::temperature, "temperature", "K", false, 0},
    QuantityInfo{Q::frequency, "frequency", "Hz", false, 0},
    QuantityInfo{Q::forced_beta, "forced_beta", "1", false, 0},
};

constexpr std::array kGummelMeasures{Q::collector_current, Q::base_current};
constexpr std::array kGainMeasures{Q::current_gain};
constexpr std::array kOutputMeasures{Q::collector_current};
constexpr std::array kSaturationMeasures{Q::collector_emitter_voltage, Q::base_emitter_voltage};
constexpr std::array kCapacitanceMeasures{Q::base_emitter_capacitance,
                                          Q::base_collector_capacitance, Q::diode_capacitance};
constexpr std::array kTransitionMeasures{Q::transition_frequency};
constexpr std::array kDiodeMeasures{Q::forward_current};

constexpr std::array kNeedsVce{Q::collector_emitter_voltage};
constexpr std::array kNeedsIb{Q::base_current};
constexpr std::array kNeedsBeta{Q::forced_beta};
constexpr std::array<Q, 0> kNeedsNothing{};
constexpr std::array kTemperature{Q::temperature};
constexpr std::array kTemperatureFrequency{Q::temperature, Q::frequency};

const std::array kKinds{
    KindRule{CurveKind::forward_gummel, "forward_gummel", Q::base_emitter_voltage, kGummelMeasures,
             false, kNeedsVce, kTemperature, std::nullopt, true},
    KindRule{CurveKind::current_gain, "current_gain", Q::collector_current, kGainMeasures, false,
             kNeedsVce, kTemperature, std::nullopt, true},
    KindRule{CurveKind::output_family, "output_family", Q::collector_emitter_voltage,
             kOutputMeasures, false, kNeedsIb, kTemperature, Q::base_current, true},
    KindRule{CurveKind::saturation, "saturation", Q::collector_current, kSaturationMeasures, false,
             kNeedsBeta, kTemperature, std::nullopt, true},
    // The measured quantity names the junction, so the rule is the same for
    // transistors and diodes; the fixture checks the model's kind.
    KindRule{CurveKind::junction_capacitance, "junction_capacitance", Q::reverse_voltage,
             kCapacitanceMeasures, true, kNeedsNothing, kTemperatureFrequency, std::nullopt, true},
    KindRule{CurveKind::transition_frequency, "transition_frequency", Q::collector_current,
             kTransitionMeasures, false, kNeedsVce, kTemperatureFrequency, std::nullopt, true},
    KindRule{CurveKind::diode_forward, "diode_forward", Q::forward_voltage, kDiodeMeasures, false,
             kNeedsNothing, kTemperature, std::nullopt, false},
};

}  // namespace

std::span<const QuantityInfo> all_quantities() { return kQuantities; }
std::span<const KindRule> all_kinds() { return kKinds; }

const QuantityInfo& info(CurveQuantity quantity) {
  return *std::find_if(kQuantities.begin(), kQuantities.end(),
                       [&](const QuantityInfo& i) { return i.quantity == quantity; });
}

std::optional<CurveQuantity> quantity_named(std::string_view name) {
  for (const auto& i : kQuantities) {
    if (i.name == name) return i.quantity;
  }
  return std::nullopt;
}

const KindRule& rule(CurveKind kind) {
  return *std::find_if(kKinds.begin(), kKinds.end(),
                       [&](const KindRule& r) { return r.kind == kind; });
}

std::optional<CurveKind> kind_named(std::string_view name) {
  for (const auto& r : kKinds) {
    if (r.name == name) return r.kind;
  }
  return std::nullopt;
}

}  // namespace stage::curves

namespace stage {

std::string_view to_string(CurveKind kind) { return curves::rule(kind).name; }
std::string_view to_string(CurveQuantity quantity) { return curves::info(quantity).name; }
std::string_view unit_of(CurveQuantity quantity) { return curves::info(quantity).unit; }
bool compared_by_ratio(CurveQuantity quantity) { return curves::info(quantity).by_ratio; }

std::optional<double> Curve::condition(CurveQuantity quantity) const {
  for (const auto& [q, value] : held) {
    if (q == quantity) return value;
  }
  return std::nullopt;
}

double Curve::tolerance(CurveQuantity quantity) const {
  for (const auto& t : tolerances) {
    if (t.quantity == quantity) return t.value;
  }
  return curves::info(quantity).default_tolerance;
}

}  // namespace stage
