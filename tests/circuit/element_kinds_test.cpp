// The element-kind descriptors: the spec's table of element kinds (section 3
// of circuit-format.md) names every kind and every argument the descriptors
// hold, and what is asked through them (nodes, roles, own values) answers
// from the description.
#include "circuit/element_kinds.hpp"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace {

using namespace stage;

// Section 3 of the spec: from its heading to the next one.
std::string spec_section_3() {
  std::ifstream in(std::string(STAGE_SOURCE_DIR) + "/libstage/src/reader/circuit-format.md");
  std::stringstream text;
  text << in.rdbuf();
  const std::string spec = text.str();
  const auto from = spec.find("## 3. Element kinds");
  const auto to = spec.find("\n## 4.", from);
  EXPECT_NE(from, std::string::npos);
  return spec.substr(from, to - from);
}

// The spec's row of `keyword`: the table line that starts with `keyword(`.
std::string row_of(const std::string& section, std::string_view keyword) {
  const std::string start = "| `" + std::string(keyword) + "(";
  const auto at = section.find(start);
  if (at == std::string::npos) return "";
  return section.substr(at, section.find('\n', at) - at);
}

TEST(ElementKinds, TheSpecTableNamesEveryKindAndEveryArgument) {
  const std::string section = spec_section_3();
  int kinds_seen = 0;
  kinds::for_each_kind([&](const auto& kind) {
    ++kinds_seen;
    const std::string_view first = kind.spellings.front().keyword;
    const std::string row = row_of(section, first);
    ASSERT_FALSE(row.empty()) << "no row for " << first;
    const std::string signature = row.substr(0, row.find("` |"));
    for (const auto& field : kind.fields) {
      EXPECT_NE(signature.find(std::string(field.name)), std::string::npos)
          << first << " has an argument '" << field.name << "' its row does not show";
    }
    for (const auto& spelling : kind.spellings) {
      EXPECT_NE(section.find("`" + std::string(spelling.keyword) + "("), std::string::npos)
          << spelling.keyword;
    }
  });
  EXPECT_EQ(kinds_seen, static_cast<int>(std::variant_size_v<ElementData>));
}

TEST(ElementKinds, NodesAreTerminalsInOrderThenControllingNodes) {
  Bipolar q{Polarity::pnp, "c", "b", "e", std::string("s"), "m", 1};
  EXPECT_EQ(kinds::nodes(q), (std::vector<std::string>{"c", "b", "e", "s"}));
  q.substrate.reset();
  EXPECT_EQ(kinds::nodes(q), (std::vector<std::string>{"c", "b", "e"}));
  EXPECT_EQ(kinds::keyword(q), "pnp");
  const VoltageControlledVoltageSource e{"p", "n", "cp", "cn", 2};
  EXPECT_EQ(kinds::nodes(e), (std::vector<std::string>{"p", "n", "cp", "cn"}));
  EXPECT_EQ(kinds::keyword(e), "vcvs");
}

TEST(ElementKinds, OwnValuesAreReadCheckedAndWrittenThroughTheirField) {
  ElementData r = Resistor{"a", "b", 100};
  EXPECT_EQ(kinds::own_value(r), 100);
  EXPECT_TRUE(kinds::own_value_error(r, -1).has_value());
  EXPECT_FALSE(kinds::own_value_error(r, 47).has_value());
  EXPECT_TRUE(kinds::set_own_value(r, 47));
  EXPECT_EQ(std::get<Resistor>(r).resistance, 47);
  ElementData v = VoltageSource{"p", "gnd", 12};
  EXPECT_FALSE(kinds::own_value_error(v, -12).has_value());  // a source may be negative
  ElementData q = Bipolar{};
  EXPECT_FALSE(kinds::own_value(q).has_value());
  EXPECT_FALSE(kinds::set_own_value(q, 1));
  EXPECT_TRUE(kinds::own_value_error(q, 1).has_value());
}

TEST(ElementKinds, RolesReplaceKindTests) {
  EXPECT_TRUE(kinds::has_role(VoltageSource{}, kinds::Role::independent_source));
  EXPECT_TRUE(kinds::has_role(CurrentSource{}, kinds::Role::independent_source));
  EXPECT_FALSE(kinds::has_role(VoltageControlledVoltageSource{}, kinds::Role::independent_source));
  EXPECT_TRUE(kinds::has_role(Capacitor{}, kinds::Role::stores_energy));
  EXPECT_TRUE(kinds::has_role(Inductor{}, kinds::Role::branch_current));
  EXPECT_FALSE(kinds::has_role(Resistor{}, kinds::Role::branch_current));
  EXPECT_TRUE(kinds::has_role(Diode{}, kinds::Role::one_port));
  EXPECT_FALSE(kinds::has_role(Bipolar{}, kinds::Role::single_current));
}

}  // namespace
