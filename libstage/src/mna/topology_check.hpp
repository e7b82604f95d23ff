// Diagnosis of a singular circuit from its graph: nodes with no DC path to
// ground, loops of voltage-defined branches, cut-sets of current sources.
#pragma once

#include <string>
#include <vector>

#include "mna/types.hpp"

namespace stage::mna {

class Topology;

class TopologyCheck {
 public:
  explicit TopologyCheck(const Topology& topology);

  // A DC conducting path between a and b (resistor, junction, ...).
  void conducts(Index a, Index b, const std::string& element);
  // A branch whose voltage is fixed (voltage source, inductor at DC, vcvs,
  // ccvs): also conducts, and a loop of these is singular.
  void fixes_voltage(Index a, Index b, const std::string& element);
  // Only a forced current (current source, controlled-current output): no
  // conductance; nodes reached only this way form a cut-set.
  void forces_current(Index a, Index b, const std::string& element);
  // A capacitor: open at DC.
  void capacitive(Index a, Index b, const std::string& element);

  struct Finding {
    std::string message;                // one line, names the cause
    std::vector<std::string> involved;  // nodes or elements
  };
  // Problems that make the DC system singular; empty if the graph is sound.
  std::vector<Finding> findings() const;

  // The elements with a terminal at `node`, each once, in the order declared.
  std::vector<std::string> elements_at(Index node) const;

 private:
  struct Edge {
    Index a, b;
    std::string element;
    enum class Kind { conducts, fixes_voltage, forces_current, capacitive } kind;
  };
  const Topology& topology_;
  std::vector<Edge> edges_;
};

}  // namespace stage::mna
