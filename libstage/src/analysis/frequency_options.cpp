// Validation of FrequencyOptions against the circuit they are meant for, so
// that a bad request is reported before any solving starts.
#include <algorithm>
#include <cmath>

#include "circuit/element_kinds.hpp"
#include "stage/frequency.hpp"

namespace stage {
namespace {

bool has_node(const Circuit& circuit, const std::string& node) {
  if (node == kGround) return true;
  return std::any_of(circuit.elements().begin(), circuit.elements().end(), [&](const Element& e) {
    const auto nodes = kinds::nodes(e.data);
    return std::find(nodes.begin(), nodes.end(), node) != nodes.end();
  });
}

std::optional<std::string> input_error(const Circuit& circuit, const std::string& input) {
  const Element* e = circuit.find(input);
  if (e == nullptr) return "the input '" + input + "' is not an element of the circuit";
  if (!kinds::has_role(e->data, kinds::Role::independent_source)) {
    return "the input '" + input + "' must be an independent voltage or current source";
  }
  if (kinds::field_value(e->data, "ac").value_or(0.0) == 0.0) {
    return "the input '" + input + "' has no AC value: give it ac = <magnitude> (the gain is " +
           "relative to it)";
  }
  return std::nullopt;
}

std::optional<std::string> output_error(const Circuit& circuit, const SignalRef& output) {
  switch (output.kind) {
    case SignalRef::Kind::node_voltage:
      if (output.a == kGround) return std::string("the output cannot be the ground node");
      if (!has_node(circuit, output.a)) return "the output node '" + output.a + "' does not exist";
      return std::nullopt;
    case SignalRef::Kind::node_pair:
      for (const auto& node : {output.a, output.b}) {
        if (!has_node(circuit, node)) return "the output node '" + node + "' does not exist";
      }
      if (output.a == output.b) return std::string("the output's two nodes are the same node");
      return std::nullopt;
    case SignalRef::Kind::element_current: {
      const Element* e = circuit.find(output.a);
      if (e == nullptr) return "the output element '" + output.a + "' does not exist";
      if (!kinds::has_role(e->data, kinds::Role::single_current)) {
        return "the output '" + output.a + ".current': a " + std::string(kinds::keyword(e->data)) +
               " has no single current";
      }
      if (kinds::has_role(e->data, kinds::Role::independent_source) &&
          !kinds::has_role(e->data, kinds::Role::holds_voltage)) {
        return "the output '" + output.a + ".current' is a current source's own value";
      }
      return std::nullopt;
    }
  }
  return std::nullopt;
}

// The two nodes of the output voltage, positive first.
std::pair<std::string, std::string> output_nodes(const SignalRef& output) {
  if (output.kind == SignalRef::Kind::node_pair) return {output.a, output.b};
  return {output.a, kGround};
}

std::optional<std::string> load_error(const Circuit& circuit, const FrequencyOptions& options) {
  const std::string& load = *options.load;
  const Element* e = circuit.find(load);
  if (e == nullptr) return "the load '" + load + "' is not an element of the circuit";
  if (kinds::has_role(e->data, kinds::Role::holds_voltage)) {
    return "the load '" + load + "' holds a voltage: it shorts the output for small " +
           "signals, so the output impedance without it cannot be read from this circuit";
  }
  if (!kinds::has_role(e->data, kinds::Role::one_port))
    return "the load '" + load + "' must be a two-terminal element";
  if (options.output.kind == SignalRef::Kind::element_current) return std::nullopt;
  auto nodes = kinds::nodes(e->data);
  auto wanted = output_nodes(options.output);
  std::sort(nodes.begin(), nodes.end());
  if (wanted.first > wanted.second) std::swap(wanted.first, wanted.second);
  if (nodes[0] != wanted.first || nodes[1] != wanted.second) {
    return "the load '" + load + "' connects " + nodes[0] + " and " + nodes[1] +
           "; it must connect the output's nodes " + wanted.first + " and " + wanted.second +
           " to be removed from the output impedance";
  }
  return std::nullopt;
}

}  // namespace

std::optional<std::string> frequency_options_error(const Circuit& circuit,
                                                   const FrequencyOptions& options) {
  // from = to is one frequency: a single point, with no band for corners.
  if (!(options.from > 0) || !std::isfinite(options.to) || !(options.from <= options.to)) {
    return std::string("the frequency range needs 0 < from <= to");
  }
  if (options.per_decade <= 0) return std::string("per_decade must be at least 1");
  if (options.at && !(*options.at > 0 && std::isfinite(*options.at))) {
    return std::string("the frequency `at` must be positive");
  }
  if (auto why = input_error(circuit, options.input)) return why;
  if (auto why = output_error(circuit, options.output)) return why;
  if (options.load) return load_error(circuit, options);
  return std::nullopt;
}

}  // namespace stage
