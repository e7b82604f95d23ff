// Numbering of unknowns: circuit nodes, device-internal nodes, branches.
#include "mna/topology.hpp"

#include "stage/circuit.hpp"

namespace stage::mna {

Topology::Topology() : names_{kGround}, kinds_{Kind::node} {
  nodes_.emplace(kGround, kGroundIndex);
}

Index Topology::node(const std::string& name) {
  auto [it, inserted] = nodes_.emplace(name, static_cast<Index>(names_.size()));
  if (inserted) {
    names_.push_back(name);
    kinds_.push_back(Kind::node);
  }
  return it->second;
}

Index Topology::internal_node(const std::string& device, const std::string& suffix) {
  const Index i = static_cast<Index>(names_.size());
  names_.push_back(device + ":" + suffix);
  kinds_.push_back(Kind::internal_node);
  return i;
}

Index Topology::branch(const std::string& device) {
  const Index i = static_cast<Index>(names_.size());
  names_.push_back(device + ".current");
  kinds_.push_back(Kind::branch);
  branches_.emplace(device, i);
  return i;
}

std::optional<Index> Topology::find_node(const std::string& name) const {
  auto it = nodes_.find(name);
  if (it == nodes_.end()) return std::nullopt;
  return it->second;
}

std::optional<Index> Topology::find_branch(const std::string& device) const {
  auto it = branches_.find(device);
  if (it == branches_.end()) return std::nullopt;
  return it->second;
}

std::optional<Index> Topology::find_unknown(const std::string& name) const {
  for (Index i = 1; i < static_cast<Index>(names_.size()); ++i) {
    if (names_[i] == name) return i;
  }
  return std::nullopt;
}

}  // namespace stage::mna
