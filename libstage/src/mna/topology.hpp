// Numbering of the unknowns: node voltages (circuit nodes and device-internal
// nodes), branch currents, and the other unknowns a device owns (a
// temperature). Index 0 is ground; unknowns are 1..size(). Each unknown has
// a kind, which says what it and its row of the system are.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

#include "mna/types.hpp"

namespace stage::mna {

// What an unknown is: its unit, the equation its row of F holds, and so the
// absolute tolerances Newton and the transient step control hold the
// unknown and its row to (SolverOptions):
//   voltage      V   a node voltage; its row is KCL there, a sum of currents (A)
//   current      A   a branch current; its row is its owner's branch equation (V)
//   temperature  K   a device's temperature; its row is its owner's heat
//                    balance, a sum of heat flows (W), and its charge a heat (J)
enum class UnknownKind { voltage, current, temperature };

// "voltage", "current", "temperature": the suffix of an owned unknown's name.
std::string_view to_string(UnknownKind kind);

class Topology {
 public:
  Topology();

  // The index of a circuit node, created on first use; "gnd" is 0.
  Index node(const std::string& name);
  // A node inside a device (for example behind a series resistance), named
  // "<device>:<suffix>" so that failure messages can point at it.
  Index internal_node(const std::string& device, const std::string& suffix);
  // Any unknown inside a device, named likewise: a current that an inner
  // network of the device needs (not a branch current of the element).
  Index internal_unknown(const std::string& device, const std::string& suffix, UnknownKind kind);
  // A node between element `element`'s terminal `terminal` and the circuit
  // node it is written on, where an ammeter measures the current into the
  // element there: an internal node named "<element>:<terminal>", which
  // node() then returns for that name (the element's device is made with the
  // terminal on it).
  Index terminal_node(const std::string& element, const std::string& terminal);
  // The terminal nodes terminal_node added for `element`.
  std::vector<Index> terminal_nodes(const std::string& element) const;
  // An unknown of `kind` that device `owner` adds to the system, named
  // "<owner>.<kind>" ("q1.temperature"): at most one of each kind per owner
  // (a second throws std::logic_error, a device's mistake).
  Index add_unknown(const std::string& owner, UnknownKind kind);
  // The branch-current unknown of `device` (add_unknown of a current).
  Index branch(const std::string& device);

  std::optional<Index> find_node(const std::string& name) const;
  std::optional<Index> find_branch(const std::string& device) const;
  // Any unknown by the name name() gives it (a linear search: for messages).
  std::optional<Index> find_unknown(const std::string& name) const;

  int size() const { return static_cast<int>(names_.size()) - 1; }
  const std::string& name(Index i) const { return names_[i]; }
  UnknownKind kind(Index i) const { return kinds_[i]; }
  // The device that owns unknown i; empty for a circuit node.
  const std::string& owner(Index i) const { return owners_[i]; }
  // A node of the circuit as written (ground included), not one inside a device.
  bool is_circuit_node(Index i) const { return owners_[i].empty(); }
  // A voltage unknown inside a device (internal_node).
  bool is_internal_node(Index i) const {
    return kinds_[i] == UnknownKind::voltage && !owners_[i].empty();
  }
  // What unknown i is, for messages: "the voltage at node 'out'", "the
  // current v1.current", "the temperature of q1".
  std::string description(Index i) const;

 private:
  Index add(std::string name, UnknownKind kind, std::string owner);

  std::vector<std::string> names_;
  std::vector<UnknownKind> kinds_;
  std::vector<std::string> owners_;
  std::unordered_map<std::string, Index> nodes_;
  std::unordered_map<std::string, Index> owned_;                // add_unknown's, by name
  std::unordered_multimap<std::string, Index> terminal_nodes_;  // by element
};

}  // namespace stage::mna
