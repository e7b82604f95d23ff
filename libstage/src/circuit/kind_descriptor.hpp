// The descriptor of an element kind (spec section 3): its names in the
// language, its arguments as fields of its description in stage/circuit.hpp,
// and the roles it plays. One descriptor per kind, in circuit/kinds/; the
// reader elaborates element statements from it, validate() checks values by
// it, and the analyses ask it for terminals and roles instead of naming kinds.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>

#include "stage/circuit.hpp"
#include "stage/models.hpp"
#include "stage/units.hpp"

namespace stage::kinds {

// What an argument of an element statement holds, and where it goes.
enum class FieldKind {
  terminal,           // a node name: `text`
  optional_terminal,  // a node name that may be left out: `optional_text`
  value,              // a number with a unit: `number`
  optional_value,     // a number that may be left out: `optional_number`
  waveform,           // sine(…), pulse(…) or piecewise(…) at `quantity`: `wave`
  control_pair,       // (node, node): `text` then `second`
  sensed_element,     // the name of an element whose current is sensed: `text`
  model,              // the name of a model: `text`
};

// One argument of a kind. Only the member pointer of its FieldKind is set.
template <class E>
struct Field {
  std::string_view name;
  FieldKind kind = FieldKind::terminal;
  bool is_positional = false;
  bool is_required = false;
  std::string E::*text = nullptr;
  std::string E::*second = nullptr;
  std::optional<std::string> E::*optional_text = nullptr;
  double E::*number = nullptr;
  std::optional<double> E::*optional_number = nullptr;
  std::optional<Waveform> E::*wave = nullptr;
  Quantity quantity = Quantity::dimensionless;  // of a value, or a waveform's level
  ParameterRange range = ParameterRange::finite;
  // Said after a range error in the text ("for a short, give both ends …").
  std::string_view hint = {};
  // Left out, a source's DC value is its waveform's value at t = 0.
  bool defaults_to_wave_start = false;

  constexpr Field positional() const {
    Field f = *this;
    f.is_positional = true;
    return f;
  }
  constexpr Field required() const {
    Field f = *this;
    f.is_required = true;
    return f;
  }
  constexpr Field from_wave_start() const {
    Field f = *this;
    f.defaults_to_wave_start = true;
    return f;
  }
  constexpr Field with_hint(std::string_view text) const {
    Field f = *this;
    f.hint = text;
    return f;
  }
};

// The fields as a kind's table writes them. Terminals are positional and
// required; everything else is by keyword and optional unless marked.
template <class E>
constexpr Field<E> terminal(std::string_view name, std::string E::*member) {
  return {.name = name,
          .kind = FieldKind::terminal,
          .is_positional = true,
          .is_required = true,
          .text = member};
}
template <class E>
constexpr Field<E> optional_terminal(std::string_view name, std::optional<std::string> E::*member) {
  return {.name = name, .kind = FieldKind::optional_terminal, .optional_text = member};
}
template <class E>
constexpr Field<E> value(std::string_view name, double E::*member, Quantity quantity,
                         ParameterRange range = ParameterRange::finite) {
  return {.name = name,
          .kind = FieldKind::value,
          .number = member,
          .quantity = quantity,
          .range = range};
}
template <class E>
constexpr Field<E> optional_value(std::string_view name, std::optional<double> E::*member,
                                  Quantity quantity) {
  return {.name = name,
          .kind = FieldKind::optional_value,
          .optional_number = member,
          .quantity = quantity};
}
template <class E>
constexpr Field<E> waveform(std::string_view name, std::optional<Waveform> E::*member,
                            Quantity level) {
  return {.name = name, .kind = FieldKind::waveform, .wave = member, .quantity = level};
}
template <class E>
constexpr Field<E> control_pair(std::string_view name, std::string E::*plus,
                                std::string E::*minus) {
  return {.name = name,
          .kind = FieldKind::control_pair,
          .is_required = true,
          .text = plus,
          .second = minus};
}
template <class E>
constexpr Field<E> sensed_element(std::string_view name, std::string E::*member) {
  return {.name = name, .kind = FieldKind::sensed_element, .is_required = true, .text = member};
}
template <class E>
constexpr Field<E> model(std::string_view name, std::string E::*member) {
  return {.name = name, .kind = FieldKind::model, .is_required = true, .text = member};
}

// What an element is for, beyond its equations; an analysis asks for a role
// and never for a kind.
enum class Role : unsigned {
  none = 0,
  independent_source = 1u << 0,  // drives a circuit: an input, a supply
  stores_energy = 1u << 1,       // its mean power over a period is stored, not spent
  branch_current = 1u << 2,      // its reported current is a branch unknown of its own
  one_port = 1u << 3,            // two terminals, one current: may be a load
  single_current = 1u << 4,      // one current flows through it, `<name>.current`
  holds_voltage = 1u << 5,       // fixes the voltage between its terminals
};
constexpr Role operator|(Role a, Role b) {
  return static_cast<Role>(static_cast<unsigned>(a) | static_cast<unsigned>(b));
}
constexpr bool has(Role set, Role role) {
  return (static_cast<unsigned>(set) & static_cast<unsigned>(role)) != 0;
}

// A name the kind goes by in the language, and what that name sets in the
// description (`npn` and `pnp` are one kind of two polarities).
template <class E>
struct Spelling {
  std::string_view keyword;
  void (*preset)(E&) = nullptr;
};

// The terminals of a kind that amplifies (a transistor): the one its main
// current flows into (collector) and the one its output is referred to
// (emitter), as field names.
struct AmplifierTerminals {
  std::string_view main;
  std::string_view common;
};

template <class E>
struct Descriptor {
  std::span<const Spelling<E>> spellings;
  std::span<const Field<E>> fields;  // terminals first, in the language's positional order
  Role roles = Role::none;
  // The value set_value changes (a resistance, a source's DC value), if any;
  // one of the kind's value fields, whose range it keeps.
  std::string_view own_value = {};
  // The model kind of the language (`npn`, `pnp`, `diode`) the element's
  // model must be, for kinds with a model field.
  std::string_view (*model_kind)(const E&) = nullptr;
  // For a kind that amplifies: its terminals, and its polarity (+1 for an
  // n type, -1 for a p type): a complementary pair is one of each.
  AmplifierTerminals amplifier = {};
  int (*polarity)(const E&) = nullptr;
};

// Specialised once per alternative of ElementData in circuit/kinds/, with a
// `static constexpr Descriptor<E> descriptor`.
template <class E>
struct KindOf;

}  // namespace stage::kinds
