// The vocabulary of curve files in one place: each quantity's name, unit and
// default tolerance, and for each curve kind what it sweeps, what it may
// measure and which conditions it needs. The reader checks files against
// these rules; the fixtures rely on them.
#pragma once

#include <optional>
#include <span>
#include <string_view>

#include "stage/curves.hpp"

namespace stage::curves {

struct QuantityInfo {
  CurveQuantity quantity;
  std::string_view name;
  std::string_view unit;
  bool by_ratio;             // compared by ratio (true) or difference (false)
  double default_tolerance;  // fraction, or value in the unit
};

struct KindRule {
  CurveKind kind;
  std::string_view name;
  CurveQuantity swept;
  std::span<const CurveQuantity> measurable;
  bool measure_exactly_one;  // one of `measurable` (which junction); else any non-empty subset
  std::span<const CurveQuantity> required;  // conditions that must be held (or stepped)
  std::span<const CurveQuantity> optional;  // conditions that may be held
  std::optional<CurveQuantity> steppable;   // may be a per-point column instead of held
  bool bipolar;                             // a transistor curve (else a diode curve)
};

const QuantityInfo& info(CurveQuantity quantity);
std::optional<CurveQuantity> quantity_named(std::string_view name);
const KindRule& rule(CurveKind kind);
std::optional<CurveKind> kind_named(std::string_view name);
std::span<const QuantityInfo> all_quantities();
std::span<const KindRule> all_kinds();

}  // namespace stage::curves
