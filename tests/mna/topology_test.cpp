// Numbering of unknowns by kind: circuit nodes, internal nodes, and the
// unknowns a device owns (a branch current is one of these), each named so
// that messages say what it is.
#include "mna/topology.hpp"

#include <gtest/gtest.h>

#include <stdexcept>

namespace {

using stage::mna::Topology;
using stage::mna::UnknownKind;

TEST(Topology, EveryUnknownHasAKindANameAndAnOwner) {
  Topology t;
  const auto out = t.node("out");
  const auto base = t.internal_node("q1", "base");
  const auto current = t.branch("v1");
  const auto temperature = t.add_unknown("q1", UnknownKind::temperature);
  EXPECT_EQ(t.size(), 4);

  EXPECT_EQ(t.kind(out), UnknownKind::voltage);
  EXPECT_TRUE(t.is_circuit_node(out));
  EXPECT_EQ(t.description(out), "the voltage at node 'out'");

  EXPECT_EQ(t.kind(base), UnknownKind::voltage);
  EXPECT_TRUE(t.is_internal_node(base));
  EXPECT_EQ(t.owner(base), "q1");
  EXPECT_EQ(t.name(base), "q1:base");

  EXPECT_EQ(t.kind(current), UnknownKind::current);
  EXPECT_EQ(t.name(current), "v1.current");
  EXPECT_EQ(t.find_branch("v1"), current);
  EXPECT_EQ(t.description(current), "the current v1.current");

  EXPECT_EQ(t.kind(temperature), UnknownKind::temperature);
  EXPECT_EQ(t.name(temperature), "q1.temperature");
  EXPECT_EQ(t.owner(temperature), "q1");
  EXPECT_FALSE(t.is_circuit_node(temperature));
  EXPECT_FALSE(t.is_internal_node(temperature));
  EXPECT_EQ(t.find_unknown("q1.temperature"), temperature);
  EXPECT_EQ(t.description(temperature), "the temperature of q1");
  EXPECT_FALSE(t.find_branch("q1").has_value());
}

// A sensed terminal's own node: inside the element (no circuit node), found
// by its name so that the element's device is made on it, and listed for
// the element.
TEST(Topology, TerminalNodeIsTheElementsAndFoundByName) {
  Topology t;
  const auto in = t.node("in");
  const auto collector = t.terminal_node("q1", "collector");
  EXPECT_EQ(t.name(collector), "q1:collector");
  EXPECT_TRUE(t.is_internal_node(collector));
  EXPECT_FALSE(t.is_circuit_node(collector));
  EXPECT_EQ(t.owner(collector), "q1");
  EXPECT_EQ(t.node("q1:collector"), collector);
  EXPECT_NE(t.node("in"), collector);
  EXPECT_EQ(t.node("in"), in);
  EXPECT_EQ(t.terminal_nodes("q1"), std::vector<stage::mna::Index>{collector});
  EXPECT_TRUE(t.terminal_nodes("in").empty());
}

// Two unknowns of one kind and owner would share a name: a device's mistake.
TEST(Topology, AnOwnerHasOneUnknownOfEachKind) {
  Topology t;
  t.add_unknown("q1", UnknownKind::temperature);
  EXPECT_THROW(t.add_unknown("q1", UnknownKind::temperature), std::logic_error);
  EXPECT_NO_THROW(t.branch("q1"));
  EXPECT_THROW(t.branch("q1"), std::logic_error);
}

}  // namespace
