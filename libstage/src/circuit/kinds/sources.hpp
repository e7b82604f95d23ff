// The descriptors of the independent sources: voltage and current.
#pragma once

#include "circuit/kind_descriptor.hpp"

namespace stage::kinds {

// The arguments after the terminals, the same for both kinds at their own
// quantity: the DC value (by default the waveform's value at t = 0), the
// small-signal magnitude and phase, the waveform.
template <class Source>
constexpr auto source_fields(Field<Source> first, Field<Source> second, Quantity level) {
  return std::array<Field<Source>, 6>{
      first,
      second,
      value("dc", &Source::dc, level).positional().from_wave_start(),
      value("ac", &Source::ac_magnitude, level),
      value("ac_phase", &Source::ac_phase_deg, Quantity::angle),
      waveform("wave", &Source::wave, level)};
}

template <>
struct KindOf<VoltageSource> {
  static constexpr Spelling<VoltageSource> spellings[] = {{"voltage"}};
  static constexpr auto fields = source_fields(terminal("p", &VoltageSource::p),
                                               terminal("n", &VoltageSource::n), Quantity::voltage);
  static constexpr Descriptor<VoltageSource> descriptor{
      spellings, fields,
      Role::independent_source | Role::single_current | Role::branch_current | Role::holds_voltage,
      "dc"};
};

template <>
struct KindOf<CurrentSource> {
  static constexpr Spelling<CurrentSource> spellings[] = {{"current"}};
  static constexpr auto fields = source_fields(terminal("a", &CurrentSource::a),
                                               terminal("b", &CurrentSource::b), Quantity::current);
  static constexpr Descriptor<CurrentSource> descriptor{
      spellings, fields, Role::independent_source | Role::single_current | Role::one_port, "dc"};
};

}  // namespace stage::kinds
