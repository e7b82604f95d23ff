// The questions asked of an element, answered from its kind's descriptor.
#include "circuit/element_kinds.hpp"

#include <algorithm>

namespace stage::kinds {
namespace {

template <class E>
const Field<E>* own_field(const Descriptor<E>& d) {
  if (d.own_value.empty()) return nullptr;
  for (const Field<E>& f : d.fields) {
    if (f.name == d.own_value) return &f;
  }
  return nullptr;
}

}  // namespace

std::vector<std::string> keywords() {
  std::vector<std::string> out;
  for_each_kind([&](const auto& d) {
    for (const auto& s : d.spellings) out.emplace_back(s.keyword);
  });
  return out;
}

std::string_view keyword(const ElementData& data) {
  return with_descriptor(data, [](const auto& e, const auto& d) {
    for (const auto& s : d.spellings) {
      if (s.preset == nullptr) return s.keyword;
      auto preset = e;
      s.preset(preset);
      if (preset == e) return s.keyword;
    }
    return d.spellings.front().keyword;
  });
}

void for_each_node(const ElementData& data, const std::function<void(const std::string&)>& visit) {
  with_descriptor(data, [&](const auto& e, const auto& d) {
    for (const auto& f : d.fields) {
      if (f.kind == FieldKind::terminal) visit(e.*f.text);
      if (f.kind == FieldKind::optional_terminal && (e.*f.optional_text)) {
        visit(*(e.*f.optional_text));
      }
      if (f.kind == FieldKind::control_pair) {
        visit(e.*f.text);
        visit(e.*f.second);
      }
    }
  });
}

std::vector<std::string> nodes(const ElementData& data) {
  std::vector<std::string> out;
  for_each_node(data, [&](const std::string& node) { out.push_back(node); });
  return out;
}

bool has_role(const ElementData& data, Role role) {
  return with_descriptor(data, [&](const auto&, const auto& d) { return has(d.roles, role); });
}

std::vector<std::string> terminal_names(const ElementData& data) {
  return with_descriptor(data, [](const auto& e, const auto& d) {
    std::vector<std::string> out;
    for (const auto& f : d.fields) {
      const bool connected = f.kind == FieldKind::terminal ||
                             (f.kind == FieldKind::optional_terminal && (e.*f.optional_text));
      if (connected) out.emplace_back(f.name);
    }
    return out;
  });
}

bool set_terminal(ElementData& data, std::string_view terminal, const std::string& node) {
  return with_descriptor(data, [&](auto& e, const auto& d) {
    for (const auto& f : d.fields) {
      if (f.name != terminal) continue;
      if (f.kind == FieldKind::terminal) e.*f.text = node;
      if (f.kind == FieldKind::optional_terminal) e.*f.optional_text = node;
      return f.kind == FieldKind::terminal || f.kind == FieldKind::optional_terminal;
    }
    return false;
  });
}

SensedCurrent sensed_current(const Circuit& circuit, const std::string& sense) {
  if (const Element* whole = circuit.find(sense)) {
    if (has_role(whole->data, Role::branch_current)) return {whole, "", ""};
    const std::vector<std::string> terminals = terminal_names(whole->data);
    if (has_role(whole->data, Role::single_current)) return {whole, terminals.front(), ""};
    std::string list;
    for (const auto& t : terminals) list += (list.empty() ? "" : ", ") + sense + "." + t;
    return {whole, "",
            "'" + sense + "' (" + std::string(keyword(whole->data)) +
                ") carries a different current at each terminal; name one (" + list + ")"};
  }
  const auto dot = sense.rfind('.');
  const Element* owner = dot == std::string::npos ? nullptr : circuit.find(sense.substr(0, dot));
  if (owner == nullptr) return {nullptr, "", "no element named '" + sense + "'"};
  const std::string terminal = sense.substr(dot + 1);
  const std::vector<std::string> terminals = terminal_names(owner->data);
  if (std::find(terminals.begin(), terminals.end(), terminal) == terminals.end()) {
    return {owner, terminal,
            "'" + owner->name + "' has no connected terminal named '" + terminal + "'"};
  }
  return {owner, terminal, ""};
}

std::optional<Amplifier> amplifier(const ElementData& data) {
  return with_descriptor(data, [](const auto& e, const auto& d) -> std::optional<Amplifier> {
    if (d.polarity == nullptr) return std::nullopt;
    Amplifier a{{}, {}, d.amplifier.main, d.amplifier.common, d.polarity(e)};
    for (const auto& f : d.fields) {
      if (f.kind != FieldKind::terminal) continue;
      if (f.name == a.main_terminal) a.main_node = e.*f.text;
      if (f.name == a.common_terminal) a.common_node = e.*f.text;
    }
    return a;
  });
}

std::optional<double> field_value(const ElementData& data, std::string_view name) {
  return with_descriptor(data, [&](const auto& e, const auto& d) -> std::optional<double> {
    for (const auto& f : d.fields) {
      if (f.name == name && f.kind == FieldKind::value) return e.*(f.number);
    }
    return std::nullopt;
  });
}

std::optional<Waveform>* waveform_of(ElementData& data) {
  return with_descriptor(data, [](auto& e, const auto& d) -> std::optional<Waveform>* {
    for (const auto& f : d.fields) {
      if (f.kind == FieldKind::waveform) return &(e.*(f.wave));
    }
    return nullptr;
  });
}

bool has_waveform(const ElementData& data) {
  return with_descriptor(data, [](const auto& e, const auto& d) {
    for (const auto& f : d.fields) {
      if (f.kind == FieldKind::waveform && (e.*(f.wave)).has_value()) return true;
    }
    return false;
  });
}

bool set_field_value(ElementData& data, std::string_view name, double value) {
  return with_descriptor(data, [&](auto& e, const auto& d) {
    for (const auto& f : d.fields) {
      if (f.name == name && f.kind == FieldKind::value) {
        e.*(f.number) = value;
        return true;
      }
    }
    return false;
  });
}

std::optional<double> own_value(const ElementData& data) {
  return with_descriptor(data, [](const auto& e, const auto& d) -> std::optional<double> {
    const auto* f = own_field(d);
    if (f == nullptr) return std::nullopt;
    return e.*(f->number);
  });
}

std::optional<std::string> own_value_error(const ElementData& data, double value) {
  return with_descriptor(data, [&](const auto&, const auto& d) -> std::optional<std::string> {
    const auto* f = own_field(d);
    if (f == nullptr) {
      return "a " + std::string(d.spellings.front().keyword) + " has no value of its own to set";
    }
    if (auto why = range_error(f->range, value)) {
      return "its " + std::string(f->name) + " " + std::string(*why);
    }
    return std::nullopt;
  });
}

bool set_own_value(ElementData& data, double value) {
  return with_descriptor(data, [&](auto& e, const auto& d) {
    const auto* f = own_field(d);
    if (f == nullptr) return false;
    e.*(f->number) = value;
    return true;
  });
}

}  // namespace stage::kinds
