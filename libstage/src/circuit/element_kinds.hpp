// Every element kind's descriptor (circuit/kinds/), and what is asked of an
// element through them: its language name, its nodes, its roles, its own
// value. Adding a kind to ElementData without a descriptor does not compile.
#pragma once

#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include "circuit/kinds/controlled.hpp"
#include "circuit/kinds/models.hpp"
#include "circuit/kinds/passive.hpp"
#include "circuit/kinds/semiconductors.hpp"
#include "circuit/kinds/sources.hpp"

namespace stage::kinds {

// Calls f(element, descriptor) with the element's own alternative.
template <class Data, class F>
decltype(auto) with_descriptor(Data& data, F&& f) {
  return std::visit(
      [&](auto& e) -> decltype(auto) {
        using E = std::remove_const_t<std::remove_reference_t<decltype(e)>>;
        return f(e, KindOf<E>::descriptor);
      },
      data);
}

// Calls f(descriptor) for every kind, in the order of ElementData.
template <class F>
void for_each_kind(F&& f) {
  [&]<std::size_t... I>(std::index_sequence<I...>) {
    (f(KindOf<std::variant_alternative_t<I, ElementData>>::descriptor), ...);
  }
  (std::make_index_sequence<std::variant_size_v<ElementData>>{});
}

// The language's element keywords (spec section 3), every spelling of every kind.
std::vector<std::string> keywords();

// The keyword the element goes by ("resistor", "npn").
std::string_view keyword(const ElementData& data);

// The nodes it touches, by name: its terminals in the language's order, then
// its controlling nodes.
std::vector<std::string> nodes(const ElementData& data);
// The same, each handed to `visit` in place (the strings are the element's).
void for_each_node(const ElementData& data, const std::function<void(const std::string&)>& visit);

bool has_role(const ElementData& data, Role role);

// The names of its terminals that are connected, in the language's order
// ("a", "b"; "collector", "base", "emitter", and "substrate" when given).
std::vector<std::string> terminal_names(const ElementData& data);

// Connects its terminal `terminal` to `node`; false if it has no such terminal.
bool set_terminal(ElementData& data, std::string_view terminal, const std::string& node);

// What `sense = name` of a current-controlled source names (spec section 3):
// an element whose reported current is a branch of its own (terminal
// empty); another element with one current, at its first terminal; or
// `<element>.<terminal>`, the current into the element at that terminal.
// An element or terminal that cannot be sensed leaves `problem` saying why,
// with `element` null when there is no such element.
struct SensedCurrent {
  const Element* element = nullptr;
  std::string terminal;
  std::string problem;
};
SensedCurrent sensed_current(const Circuit& circuit, const std::string& sense);

// The nodes of an amplifying element (a transistor) by its descriptor's
// AmplifierTerminals, with the terminals' names and its polarity.
struct Amplifier {
  std::string main_node, common_node;
  std::string_view main_terminal, common_terminal;
  int polarity = 1;
};
std::optional<Amplifier> amplifier(const ElementData& data);

// The number in its value field `name` ("ac"), if its kind has one.
std::optional<double> field_value(const ElementData& data, std::string_view name);

// Where its waveform is kept, if its kind has one (an independent source).
std::optional<Waveform>* waveform_of(ElementData& data);
// True when it has a waveform field and a waveform in it.
bool has_waveform(const ElementData& data);

// Writes `value` into its value field `name`; false if its kind has none.
bool set_field_value(ElementData& data, std::string_view name, double value);

// Its own value (a resistance, a source's DC value), if its kind has one.
std::optional<double> own_value(const ElementData& data);

// Why `value` cannot be its own value (outside its field's range, or the
// kind has none), as a sentence; nothing when it can.
std::optional<std::string> own_value_error(const ElementData& data, double value);

// Writes `value` as its own value; false for a kind that has none.
bool set_own_value(ElementData& data, double value);

}  // namespace stage::kinds
