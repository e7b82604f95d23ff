// Numbering of the unknowns: node voltages (circuit nodes and device-internal
// nodes) and branch currents. Index 0 is ground; unknowns are 1..size().
#pragma once

#include <optional>
#include <string>
#include <unordered_map>
#include <vector>

#include "mna/device.hpp"

namespace stage::mna {

class Topology {
 public:
  enum class Kind { node, internal_node, branch };

  Topology();

  // The index of a circuit node, created on first use; "gnd" is 0.
  Index node(const std::string& name);
  // A node inside a device (for example behind a series resistance), named
  // "<device>:<suffix>" so that failure messages can point at it.
  Index internal_node(const std::string& device, const std::string& suffix);
  // A branch-current unknown owned by `device`.
  Index branch(const std::string& device);

  std::optional<Index> find_node(const std::string& name) const;
  std::optional<Index> find_branch(const std::string& device) const;
  // Any unknown by the name name() gives it (a linear search: for messages).
  std::optional<Index> find_unknown(const std::string& name) const;

  int size() const { return static_cast<int>(names_.size()) - 1; }
  const std::string& name(Index i) const { return names_[i]; }
  Kind kind(Index i) const { return kinds_[i]; }
  // Node voltages (circuit and internal) take a conductance to ground in
  // Newton's fallbacks and voltage tolerances; branches take current ones.
  bool is_voltage(Index i) const { return i > 0 && kinds_[i] != Kind::branch; }

 private:
  std::vector<std::string> names_;
  std::vector<Kind> kinds_;
  std::unordered_map<std::string, Index> nodes_;
  std::unordered_map<std::string, Index> branches_;
};

}  // namespace stage::mna
