// The descriptors of the passive kinds: resistor, capacitor, inductor.
#pragma once

#include "circuit/kind_descriptor.hpp"

namespace stage::kinds {

template <>
struct KindOf<Resistor> {
  static constexpr Spelling<Resistor> spellings[] = {{"resistor"}};
  static constexpr Field<Resistor> fields[] = {
      terminal("a", &Resistor::a), terminal("b", &Resistor::b),
      value("resistance", &Resistor::resistance, Quantity::resistance, ParameterRange::positive)
          .positional()
          .required()
          .with_hint(" (for a short, give both ends the same node name)")};
  static constexpr Descriptor<Resistor> descriptor{
      spellings, fields, Role::one_port | Role::single_current, "resistance"};
};

template <>
struct KindOf<Capacitor> {
  static constexpr Spelling<Capacitor> spellings[] = {{"capacitor"}};
  static constexpr Field<Capacitor> fields[] = {
      terminal("a", &Capacitor::a), terminal("b", &Capacitor::b),
      value("capacitance", &Capacitor::capacitance, Quantity::capacitance, ParameterRange::positive)
          .positional()
          .required(),
      optional_value("initial", &Capacitor::initial_voltage, Quantity::voltage)};
  static constexpr Descriptor<Capacitor> descriptor{
      spellings, fields, Role::one_port | Role::single_current | Role::stores_energy,
      "capacitance"};
};

template <>
struct KindOf<Inductor> {
  static constexpr Spelling<Inductor> spellings[] = {{"inductor"}};
  static constexpr Field<Inductor> fields[] = {
      terminal("a", &Inductor::a), terminal("b", &Inductor::b),
      value("inductance", &Inductor::inductance, Quantity::inductance, ParameterRange::positive)
          .positional()
          .required(),
      optional_value("initial", &Inductor::initial_current, Quantity::current)};
  static constexpr Descriptor<Inductor> descriptor{
      spellings, fields,
      Role::one_port | Role::single_current | Role::stores_energy | Role::branch_current,
      "inductance"};
};

}  // namespace stage::kinds
