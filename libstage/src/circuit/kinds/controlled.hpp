// The descriptors of the controlled sources: vcvs, vccs, cccs, ccvs.
#pragma once

#include "circuit/kind_descriptor.hpp"

namespace stage::kinds {

template <>
struct KindOf<VoltageControlledVoltageSource> {
  using E = VoltageControlledVoltageSource;
  static constexpr Spelling<E> spellings[] = {{"vcvs"}};
  static constexpr Field<E> fields[] = {
      terminal("p", &E::p), terminal("n", &E::n),
      control_pair("control", &E::control_p, &E::control_n),
      value("gain", &E::gain, Quantity::dimensionless).required()};
  static constexpr Descriptor<E> descriptor{
      spellings, fields, Role::single_current | Role::branch_current | Role::holds_voltage};
};

template <>
struct KindOf<VoltageControlledCurrentSource> {
  using E = VoltageControlledCurrentSource;
  static constexpr Spelling<E> spellings[] = {{"vccs"}};
  static constexpr Field<E> fields[] = {terminal("a", &E::a), terminal("b", &E::b),
                                        control_pair("control", &E::control_p, &E::control_n),
                                        value("gain", &E::gain, Quantity::conductance).required()};
  static constexpr Descriptor<E> descriptor{spellings, fields, Role::single_current};
};

template <>
struct KindOf<CurrentControlledCurrentSource> {
  using E = CurrentControlledCurrentSource;
  static constexpr Spelling<E> spellings[] = {{"cccs"}};
  static constexpr Field<E> fields[] = {
      terminal("a", &E::a), terminal("b", &E::b), sensed_element("sense", &E::sense),
      value("gain", &E::gain, Quantity::dimensionless).required()};
  static constexpr Descriptor<E> descriptor{spellings, fields, Role::single_current};
};

template <>
struct KindOf<CurrentControlledVoltageSource> {
  using E = CurrentControlledVoltageSource;
  static constexpr Spelling<E> spellings[] = {{"ccvs"}};
  static constexpr Field<E> fields[] = {terminal("p", &E::p), terminal("n", &E::n),
                                        sensed_element("sense", &E::sense),
                                        value("gain", &E::gain, Quantity::resistance).required()};
  static constexpr Descriptor<E> descriptor{
      spellings, fields, Role::single_current | Role::branch_current | Role::holds_voltage};
};

}  // namespace stage::kinds
