// The ammeter the assembly puts in series with a terminal whose current a
// current-controlled source senses, when the element has no branch current
// of its own (spec section 3, `sense =`): a zero-volt branch from the circuit
// node into the terminal's own node. It is no element: no source, no
// reported current, no power.
#pragma once

#include <memory>
#include <string>
#include <vector>

#include "devices/stamp.hpp"
#include "stage/circuit.hpp"

namespace stage::mna {
class Topology;
}

namespace stage::devices {

// Branch current k flows from `node` into `terminal` (the current into the
// element there); row k holds v(node) - v(terminal) = 0.
class AmmeterDevice final : public mna::Device {
 public:
  AmmeterDevice(std::string name, mna::Index node, mna::Index terminal, mna::Index branch);
  void declare(mna::PatternBuilder& pattern) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  mna::Index branch() const override { return k_; }

 private:
  mna::Index node_, terminal_, k_;
  BranchSlots slots_;
};

// An element's terminal with an ammeter in series.
struct MeteredTerminal {
  std::string element, terminal;
  bool operator==(const MeteredTerminal&) const = default;
};

// The terminals the circuit's current-controlled sources sense through an
// ammeter, each once.
std::vector<MeteredTerminal> metered_terminals(const Circuit& circuit);

// The owner of the branch unknown a current-controlled source reads for
// `sense`: the element itself when the current is its own branch, else the
// ammeter's name, "<element>:<terminal>".
std::string sensed_branch_owner(const Circuit& circuit, const std::string& sense);

// `element` with each of its metered terminals on its own terminal node
// (Topology::terminal_node), ready for its make_device.
Element with_terminal_nodes(const Element& element, const std::vector<MeteredTerminal>& metered,
                            mna::Topology& topology);

// The ammeter of a metered terminal, once its element's device is made.
std::unique_ptr<mna::Device> make_ammeter(const MeteredTerminal& metered, const Circuit& circuit,
                                          mna::Topology& topology);

}  // namespace stage::devices
