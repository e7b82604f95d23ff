// Graph diagnosis of a singular DC system. Union-find over the DC paths:
// a group of nodes with no path to ground is floating, or held only by
// current sources (a cut-set); a voltage-fixing branch that closes a loop of
// voltage-fixing branches makes the branch equations dependent.
#include "mna/topology_check.hpp"

#include <algorithm>
#include <map>
#include <numeric>
#include <set>

#include "mna/topology.hpp"

namespace stage::mna {
namespace {

class DisjointSets {
 public:
  explicit DisjointSets(int n) : parent_(n) { std::iota(parent_.begin(), parent_.end(), 0); }
  int root(int i) {
    while (parent_[i] != i) i = parent_[i] = parent_[parent_[i]];
    return i;
  }
  // False if a and b were already joined.
  bool join(int a, int b) {
    a = root(a);
    b = root(b);
    if (a == b) return false;
    parent_[a] = b;
    return true;
  }

 private:
  std::vector<int> parent_;
};

}  // namespace

TopologyCheck::TopologyCheck(const Topology& topology) : topology_(topology) {}

void TopologyCheck::conducts(Index a, Index b, const std::string& element) {
  edges_.push_back({a, b, element, Edge::Kind::conducts});
}
void TopologyCheck::fixes_voltage(Index a, Index b, const std::string& element) {
  edges_.push_back({a, b, element, Edge::Kind::fixes_voltage});
}
void TopologyCheck::forces_current(Index a, Index b, const std::string& element) {
  edges_.push_back({a, b, element, Edge::Kind::forces_current});
}
void TopologyCheck::capacitive(Index a, Index b, const std::string& element) {
  edges_.push_back({a, b, element, Edge::Kind::capacitive});
}

std::vector<std::string> TopologyCheck::elements_at(Index node) const {
  std::vector<std::string> names;
  for (const Edge& e : edges_) {
    const bool touches = e.a == node || e.b == node;
    if (touches && std::find(names.begin(), names.end(), e.element) == names.end()) {
      names.push_back(e.element);
    }
  }
  return names;
}

std::vector<TopologyCheck::Finding> TopologyCheck::findings() const {
  const int count = topology_.size() + 1;
  std::vector<Finding> found;

  DisjointSets voltage_loops(count);
  for (const Edge& e : edges_) {
    if (e.kind != Edge::Kind::fixes_voltage) continue;
    if (e.a == e.b) {
      found.push_back({"'" + e.element + "' has both terminals on node '" + topology_.name(e.a) +
                           "': a source shorted on itself",
                       {e.element}});
    } else if (!voltage_loops.join(e.a, e.b)) {
      found.push_back({"a loop of voltage sources or inductors closes through '" + e.element +
                           "': their voltages are not independent",
                       {e.element}});
    }
  }

  DisjointSets dc_paths(count);
  for (const Edge& e : edges_) {
    if (e.kind == Edge::Kind::conducts || e.kind == Edge::Kind::fixes_voltage) {
      dc_paths.join(e.a, e.b);
    }
  }
  std::map<int, std::vector<std::string>> groups;  // root -> circuit nodes
  for (Index i = 1; i < count; ++i) {
    if (topology_.is_circuit_node(i) && dc_paths.root(i) != dc_paths.root(0)) {
      groups[dc_paths.root(i)].push_back(topology_.name(i));
    }
  }
  for (const auto& [root, nodes] : groups) {
    std::set<std::string> sources;
    for (const Edge& e : edges_) {
      const bool touches = dc_paths.root(e.a) == root || dc_paths.root(e.b) == root;
      if (touches && e.kind == Edge::Kind::forces_current) sources.insert(e.element);
    }
    std::string list;
    for (const auto& n : nodes) list += (list.empty() ? "" : ", ") + n;
    if (sources.empty()) {
      found.push_back({"no DC path to ground from node(s) " + list +
                           " (floating, or connected only through capacitors)",
                       nodes});
    } else {
      std::vector<std::string> involved(sources.begin(), sources.end());
      std::string names;
      for (const auto& s : involved) names += (names.empty() ? "" : ", ") + s;
      found.push_back({"node(s) " + list + " are reached only through current sources (" + names +
                           "): a cut-set of current sources fixes no voltage",
                       involved});
    }
  }
  return found;
}

}  // namespace stage::mna
