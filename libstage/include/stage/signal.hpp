// A named quantity of a solution that analyses read out: a node voltage, the
// voltage between two nodes, or an element's reported current.
#pragma once

#include <string>

namespace stage {

struct SignalRef {
  enum class Kind { node_voltage, node_pair, element_current };
  Kind kind = Kind::node_voltage;
  std::string a;  // node, positive node, or element name
  std::string b;  // negative node for node_pair

  static SignalRef node(std::string n) { return {Kind::node_voltage, std::move(n), {}}; }
  static SignalRef pair(std::string p, std::string n) {
    return {Kind::node_pair, std::move(p), std::move(n)};
  }
  static SignalRef current(std::string element) {
    return {Kind::element_current, std::move(element), {}};
  }
  // "out", "(p, n)" or "q1.current" as in the language.
  std::string label() const;
  bool operator==(const SignalRef&) const = default;
};

}  // namespace stage
