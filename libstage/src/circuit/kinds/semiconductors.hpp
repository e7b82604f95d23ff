// The descriptors of the kinds with a model: diode, and the bipolar
// transistor, which the language spells npn or pnp. `model_type` names
// the kind of model its `model =` argument refers to.
#pragma once

#include "circuit/kind_descriptor.hpp"

namespace stage::kinds {

template <>
struct KindOf<Diode> {
  using model_type = DiodeModel;
  static constexpr Spelling<Diode> spellings[] = {{"diode"}};
  static constexpr Field<Diode> fields[] = {
      terminal("anode", &Diode::anode), terminal("cathode", &Diode::cathode),
      model("model", &Diode::model),
      value("area", &Diode::area, Quantity::dimensionless, ParameterRange::positive)};
  static constexpr Descriptor<Diode> descriptor{
      spellings,
      fields,
      Role::one_port | Role::single_current,
      {},
      [](const Diode&) -> std::string_view { return "diode"; }};
};

template <>
struct KindOf<Bipolar> {
  using model_type = BipolarModel;
  static constexpr Spelling<Bipolar> spellings[] = {
      {"npn", [](Bipolar& q) { q.polarity = Polarity::npn; }},
      {"pnp", [](Bipolar& q) { q.polarity = Polarity::pnp; }}};
  static constexpr Field<Bipolar> fields[] = {
      terminal("collector", &Bipolar::collector),
      terminal("base", &Bipolar::base),
      terminal("emitter", &Bipolar::emitter),
      optional_terminal("substrate", &Bipolar::substrate),
      model("model", &Bipolar::model),
      value("area", &Bipolar::area, Quantity::dimensionless, ParameterRange::positive)};
  static constexpr Descriptor<Bipolar> descriptor{
      .spellings = spellings,
      .fields = fields,
      .model_kind = [](const Bipolar& q) -> std::string_view {
        return q.polarity == Polarity::npn ? "npn" : "pnp";
      },
      .amplifier = {"collector", "emitter"},
      .polarity = [](const Bipolar& q) { return q.polarity == Polarity::npn ? 1 : -1; }};
};

}  // namespace stage::kinds
