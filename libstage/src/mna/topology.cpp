// Numbering of unknowns: circuit nodes, device-internal nodes, and the
// unknowns devices own (branch currents, temperatures).
#include "mna/topology.hpp"

#include <stdexcept>

#include "stage/circuit.hpp"

namespace stage::mna {

std::string_view to_string(UnknownKind kind) {
  switch (kind) {
    case UnknownKind::voltage:
      return "voltage";
    case UnknownKind::current:
      return "current";
    case UnknownKind::temperature:
      return "temperature";
  }
  return "voltage";
}

Topology::Topology() : names_{kGround}, kinds_{UnknownKind::voltage}, owners_{""} {
  nodes_.emplace(kGround, kGroundIndex);
}

Index Topology::add(std::string name, UnknownKind kind, std::string owner) {
  const Index i = static_cast<Index>(names_.size());
  names_.push_back(std::move(name));
  kinds_.push_back(kind);
  owners_.push_back(std::move(owner));
  return i;
}

Index Topology::node(const std::string& name) {
  auto [it, inserted] = nodes_.emplace(name, static_cast<Index>(names_.size()));
  if (inserted) add(name, UnknownKind::voltage, "");
  return it->second;
}

Index Topology::internal_node(const std::string& device, const std::string& suffix) {
  return internal_unknown(device, suffix, UnknownKind::voltage);
}

Index Topology::internal_unknown(const std::string& device, const std::string& suffix,
                                 UnknownKind kind) {
  return add(device + ":" + suffix, kind, device);
}

Index Topology::terminal_node(const std::string& element, const std::string& terminal) {
  const Index i = internal_node(element, terminal);
  nodes_.emplace(names_[i], i);
  terminal_nodes_.emplace(element, i);
  return i;
}

std::vector<Index> Topology::terminal_nodes(const std::string& element) const {
  std::vector<Index> out;
  const auto [first, last] = terminal_nodes_.equal_range(element);
  for (auto it = first; it != last; ++it) out.push_back(it->second);
  return out;
}

Index Topology::add_unknown(const std::string& owner, UnknownKind kind) {
  std::string name = owner + "." + std::string(to_string(kind));
  const auto [it, inserted] = owned_.emplace(name, static_cast<Index>(names_.size()));
  if (!inserted) throw std::logic_error("device '" + owner + "' adds its " + name + " twice");
  return add(std::move(name), kind, owner);
}

Index Topology::branch(const std::string& device) {
  return add_unknown(device, UnknownKind::current);
}

std::optional<Index> Topology::find_node(const std::string& name) const {
  auto it = nodes_.find(name);
  if (it == nodes_.end()) return std::nullopt;
  return it->second;
}

std::optional<Index> Topology::find_branch(const std::string& device) const {
  auto it = owned_.find(device + "." + std::string(to_string(UnknownKind::current)));
  if (it == owned_.end()) return std::nullopt;
  return it->second;
}

std::optional<Index> Topology::find_unknown(const std::string& name) const {
  for (Index i = 1; i < static_cast<Index>(names_.size()); ++i) {
    if (names_[i] == name) return i;
  }
  return std::nullopt;
}

std::string Topology::description(Index i) const {
  switch (kinds_[i]) {
    case UnknownKind::voltage:
      return "the voltage at node '" + names_[i] + "'";
    case UnknownKind::current:
      return "the current " + names_[i];
    case UnknownKind::temperature:
      return "the temperature of " + owners_[i];
  }
  return names_[i];
}

}  // namespace stage::mna
