// A flat, elaborated circuit: named nodes, elements with numeric values and
// models. This is what the reader produces from a `.stage` file and what an
// embedding tool builds in code; every analysis takes it as input.
//
//   stage::Circuit c;
//   c.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
//   c.add("r1", stage::Resistor{"vcc", "out", 1e3});
//
// Node names are strings; `gnd` is the ground node. Hierarchical names from
// blocks look like `x1/q` and `x1/mid`.
#pragma once

#include <algorithm>
#include <cstdint>
#include <functional>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include "stage/models.hpp"
#include "stage/waveform.hpp"

namespace stage {

inline constexpr const char* kGround = "gnd";

struct Resistor {
  std::string a, b;
  double resistance = 0;
  bool operator==(const Resistor&) const = default;
};

struct Capacitor {
  std::string a, b;
  double capacitance = 0;
  std::optional<double> initial_voltage;  // used by a transient with start = zero
  bool operator==(const Capacitor&) const = default;
};

struct Inductor {
  std::string a, b;
  double inductance = 0;
  std::optional<double> initial_current;
  bool operator==(const Inductor&) const = default;
};

// Holds v(p) - v(n). Its reported current is the current it delivers: out of
// `p` into the circuit.
struct VoltageSource {
  std::string p, n;
  double dc = 0;
  double ac_magnitude = 0;
  double ac_phase_deg = 0;
  std::optional<Waveform> wave;
  bool operator==(const VoltageSource&) const = default;
};

// Drives current from `a` through the source into `b`.
struct CurrentSource {
  std::string a, b;
  double dc = 0;
  double ac_magnitude = 0;
  double ac_phase_deg = 0;
  std::optional<Waveform> wave;
  bool operator==(const CurrentSource&) const = default;
};

// v(p) - v(n) = gain * (v(cp) - v(cn))
struct VoltageControlledVoltageSource {
  std::string p, n, control_p, control_n;
  double gain = 0;
  bool operator==(const VoltageControlledVoltageSource&) const = default;
};

// current gain * (v(cp) - v(cn)) from `a` through it to `b`
struct VoltageControlledCurrentSource {
  std::string a, b, control_p, control_n;
  double gain = 0;
  bool operator==(const VoltageControlledCurrentSource&) const = default;
};

// current gain * i(sense) from `a` through it to `b`
struct CurrentControlledCurrentSource {
  std::string a, b, sense;
  double gain = 0;
  bool operator==(const CurrentControlledCurrentSource&) const = default;
};

// v(p) - v(n) = gain * i(sense)
struct CurrentControlledVoltageSource {
  std::string p, n, sense;
  double gain = 0;
  bool operator==(const CurrentControlledVoltageSource&) const = default;
};

struct Diode {
  std::string anode, cathode;
  std::string model;
  double area = 1;
  bool operator==(const Diode&) const = default;
};

enum class Polarity { npn, pnp };

struct Bipolar {
  Polarity polarity = Polarity::npn;
  std::string collector, base, emitter;
  std::optional<std::string> substrate;  // default: ground
  std::string model;
  double area = 1;
  bool operator==(const Bipolar&) const = default;
};

using ElementData =
    std::variant<Resistor, Capacitor, Inductor, VoltageSource, CurrentSource,
                 VoltageControlledVoltageSource, VoltageControlledCurrentSource,
                 CurrentControlledCurrentSource, CurrentControlledVoltageSource, Diode, Bipolar>;

struct Element {
  std::string name;
  ElementData data;
  bool operator==(const Element&) const = default;
};

namespace detail {

// Things held in a vector, found by name: open addressing over a table of
// positions + 1 (0: an empty slot), the names kept by the owner and read
// through `name_at(position)`. A few bytes an entry, for millions of entries.
class NameIndex {
 public:
  template <class NameAt>
  std::optional<std::size_t> find(std::string_view name, const NameAt& name_at) const {
    if (slots_.empty()) return std::nullopt;
    const std::uint32_t at = slots_[slot_of(name, name_at)];
    return at == 0 ? std::nullopt : std::optional<std::size_t>(at - 1);
  }
  // After the entry at `position` was added as the last of `count`.
  template <class NameAt>
  void added(std::size_t position, std::size_t count, const NameAt& name_at) {
    if (slots_.size() < count + count / 3) return rebuild(count, name_at, count);
    slots_[slot_of(name_at(position), name_at)] = static_cast<std::uint32_t>(position + 1);
  }
  // Indexes `count` entries afresh, with room for `room` in all.
  template <class NameAt>
  void rebuild(std::size_t count, const NameAt& name_at, std::size_t room) {
    room = std::max(room, count);
    std::size_t size = 16;
    while (size < room + room / 3) size *= 2;  // at most 3/4 full
    slots_.assign(size, 0);
    for (std::size_t k = 0; k < count; ++k) {
      slots_[slot_of(name_at(k), name_at)] = static_cast<std::uint32_t>(k + 1);
    }
  }

 private:
  template <class NameAt>
  std::size_t slot_of(std::string_view name, const NameAt& name_at) const {
    const std::size_t mask = slots_.size() - 1;
    std::size_t slot = std::hash<std::string_view>{}(name)&mask;
    while (slots_[slot] != 0 && name_at(slots_[slot] - 1) != name) slot = (slot + 1) & mask;
    return slot;
  }

  std::vector<std::uint32_t> slots_;
};

}  // namespace detail

class Circuit {
 public:
  std::string title;
  double temperature = kRoomTemperature;  // kelvin

  // Adds an element; throws an invalid_request Error on a duplicate name.
  Circuit& add(std::string name, ElementData data);
  // Makes room for `count` elements in all, so that adding them allocates
  // once (a reader that knows the size ahead).
  void reserve(std::size_t count);
  // Takes an element out (the others keep their order); false if there is none.
  bool remove(const std::string& name);
  // Adds a model of any kind (a BipolarModel, a DiodeModel, an AnyModel),
  // or replaces the one of the same kind and name.
  template <class Model>
  Circuit& add_model(std::string name, Model model) {
    models_.add(std::move(name), std::move(model));
    return *this;
  }

  const std::vector<Element>& elements() const { return elements_; }
  const Element* find(const std::string& name) const;
  Element* find(const std::string& name);

  const Models& models() const { return models_; }
  // The models of one kind, by name.
  const std::map<std::string, BipolarModel>& bipolar_models() const {
    return models_.of<BipolarModel>();
  }
  const std::map<std::string, DiodeModel>& diode_models() const { return models_.of<DiodeModel>(); }

 private:
  // The names index_ reads.
  auto names() const {
    return [this](std::size_t k) -> std::string_view { return elements_[k].name; };
  }

  std::vector<Element> elements_;
  detail::NameIndex index_;
  Models models_;
};

}  // namespace stage
