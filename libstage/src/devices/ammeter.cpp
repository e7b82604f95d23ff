// The ammeter in series with a sensed terminal, and which terminals get one.
#include "devices/ammeter.hpp"

#include <algorithm>

#include "circuit/element_kinds.hpp"
#include "mna/topology.hpp"
#include "mna/topology_check.hpp"

namespace stage::devices {
namespace {

std::string ammeter_name(const MeteredTerminal& metered) {
  return metered.element + ":" + metered.terminal;
}

// The circuit node `element`'s `terminal` is written on.
std::string written_node(const Element& element, const std::string& terminal) {
  const std::vector<std::string> terminals = kinds::terminal_names(element.data);
  const std::vector<std::string> nodes = kinds::nodes(element.data);
  const auto at = std::find(terminals.begin(), terminals.end(), terminal) - terminals.begin();
  return nodes[static_cast<std::size_t>(at)];
}

}  // namespace

AmmeterDevice::AmmeterDevice(std::string name, mna::Index node, mna::Index terminal,
                             mna::Index branch)
    : Device(std::move(name)), node_(node), terminal_(terminal), k_(branch) {}

void AmmeterDevice::declare(mna::PatternBuilder& pattern) {
  slots_.declare(pattern, node_, terminal_, k_);
}

void AmmeterDevice::evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) {
  const double* x = request.x;
  out.f[node_] += x[k_];
  out.f[terminal_] -= x[k_];
  out.f[k_] += x[node_] - x[terminal_];
  slots_.add(out.g, 1.0);
}

void AmmeterDevice::describe_topology(mna::TopologyCheck& check) const {
  check.fixes_voltage(node_, terminal_, name());
}

std::vector<MeteredTerminal> metered_terminals(const Circuit& circuit) {
  std::vector<MeteredTerminal> out;
  for (const Element& e : circuit.elements()) {
    kinds::with_descriptor(e.data, [&](const auto& data, const auto& kind) {
      for (const auto& f : kind.fields) {
        if (f.kind != kinds::FieldKind::sensed_element) continue;
        const kinds::SensedCurrent sensed = kinds::sensed_current(circuit, data.*f.text);
        if (sensed.element == nullptr || sensed.terminal.empty()) continue;
        const MeteredTerminal metered{sensed.element->name, sensed.terminal};
        if (std::find(out.begin(), out.end(), metered) == out.end()) out.push_back(metered);
      }
    });
  }
  return out;
}

std::string sensed_branch_owner(const Circuit& circuit, const std::string& sense) {
  const kinds::SensedCurrent sensed = kinds::sensed_current(circuit, sense);
  if (sensed.element == nullptr) return sense;
  if (sensed.terminal.empty()) return sensed.element->name;
  return ammeter_name({sensed.element->name, sensed.terminal});
}

Element with_terminal_nodes(const Element& element, const std::vector<MeteredTerminal>& metered,
                            mna::Topology& topology) {
  Element rerouted = element;
  for (const MeteredTerminal& m : metered) {
    if (m.element != element.name) continue;
    topology.node(written_node(element, m.terminal));
    const mna::Index inner = topology.terminal_node(m.element, m.terminal);
    kinds::set_terminal(rerouted.data, m.terminal, topology.name(inner));
  }
  return rerouted;
}

std::unique_ptr<mna::Device> make_ammeter(const MeteredTerminal& metered, const Circuit& circuit,
                                          mna::Topology& topology) {
  const std::string name = ammeter_name(metered);
  const mna::Index node =
      topology.node(written_node(*circuit.find(metered.element), metered.terminal));
  const mna::Index terminal = *topology.find_node(name);
  return std::make_unique<AmmeterDevice>(name, node, terminal, topology.branch(name));
}

}  // namespace stage::devices
