// Input errors with their line and column, block flattening, and includes
// (relative paths, search path, cycles) using fixture files in a temp folder.
#include <filesystem>
#include <fstream>

#include "reader_test_support.hpp"

namespace stage::testing {
namespace {

namespace fs = std::filesystem;

TEST(Errors, SyntaxAndRange) {
  expect_error("r = resistor(a, b, 0)\n", 1, 20, "must be positive");
  expect_error("c = capacitor(a, b, -1 nF)\n", 1, 21, "must be positive");
  expect_error("r = resistor(a, b, 1k)\nr = resistor(b, gnd, 1k)\n", 2, 1, "already exists");
  expect_error("let rl = 8\nr = resistor(rl, gnd, 1k)\n", 2, 14, "is a parameter, not a node");
  expect_error("q = npn(c, b, e, model = nothing)\n", 1, 18, "no model named 'nothing'");
  expect_error("r = resistor(a, b, 1k) extra\n", 1, 24, "expected the end of the statement");
  expect_error("r = resistor(a, b,\n  1k\n", 1, 13, "never closed");
  expect_error("r = resistr(a, b, 1k)\n", 1, 5, "nearest: resistor");
  expect_error("r = resistor(a, b, resistence = 1k)\n", 1, 20, "nearest: resistance");
  expect_error("x = \xff\n", 1, 5, "not valid UTF-8");
  expect_error("let x = " + std::string(150, '(') + "1" + std::string(150, ')') + "\n", 1, 109,
               "nested more than");
  expect_error("f = cccs(a, gnd, sense = r2, gain = 2)\nr1 = resistor(a, gnd, 1)\n", 1, 18,
               "no element named 'r2' (nearest: r1");
  const std::string transistor = "model m = npn { }\nq1 = npn(c, b, gnd, model = m)\n";
  expect_error(transistor + "f = cccs(a, gnd, sense = q1.colector, gain = 2)\n", 3, 18,
               "'q1' has no connected terminal named 'colector' (nearest: collector");
  expect_error(transistor + "f = cccs(a, gnd, sense = q1.substrate, gain = 2)\n", 3, 18,
               "no connected terminal named 'substrate'");
  expect_error(transistor + "f = cccs(a, gnd, sense = q1, gain = 2)\n", 3, 18,
               "name one (q1.collector, q1.base, q1.emitter)");
  expect_error(transistor + "f = cccs(a, gnd, sense = q2.collector, gain = 2)\n", 3, 18,
               "no element named 'q2.collector' (nearest: q1.collector");
}

// Messages that say what was probably meant (issue 13's rough edges).
TEST(Errors, MessagesSayWhatWasMeant) {
  expect_error("r = resistor(a, gnd, 4k7)\n", 1, 24, "for 4k7 write 4.7k");
  expect_error("r = resistor(a, gnd, 1 K\u03a9)\n", 1, 24, "did you mean 'k\u03a9'");
  // 1e-400 is below the smallest double (about 2.2e-308, IEEE 754 binary64).
  expect_error("r = resistor(a, gnd, 1e-400)\n", 1, 22, "underflows");
  expect_error("q = npn(a, b, gnd, model = resistor(a, b, 1))\n", 1, 28, "the name of a model");
  expect_error("v = voltage(vcc, vcc, 12 V)\n", 1, 1,
               "'v' holds a voltage between 'vcc' and itself");
  expect_error("block amp(a)\n  r = resistor(a, gnd, 1k)\n", 3, 1,
               "block 'amp' opened at line 1 has no 'end'");
}

TEST(Errors, EmptyAndBlankFilesAreFine) {
  EXPECT_TRUE(read("").circuit.elements().empty());
  EXPECT_TRUE(read("\n\n# only a comment\n   \n").circuit.elements().empty());
}

TEST(Errors, MessageShowsLineAndCaret) {
  try {
    read("let a = 1\nr = resistor(a1, b, 10 nF)\n");
    FAIL();
  } catch (const InputError& e) {
    EXPECT_STREQ(e.what(),
                 "test.stage:2:21: expected a value in Ω, but this value is in F\n"
                 "r = resistor(a1, b, 10 nF)\n"
                 "                    ^");
  }
}

TEST(Blocks, FlattenWithHierarchicalNames) {
  const Deck deck = read(
      "block follower(in, out, rail; re = 1 kΩ)\n"
      "  q  = npn(rail, in, out, model = m)\n"
      "  r1 = resistor(out, mid, re)\n"
      "  r2 = resistor(mid, gnd, re / 2)\n"
      "end\n"
      "model m = npn { }\n"
      "x1 = follower(sig, drive, vcc, re = 470 Ω)\n"
      "x2 = follower(in = a, out = b, rail = vcc)\n");
  const auto& q = element<Bipolar>(deck, "x1/q");
  EXPECT_EQ(q.collector, "vcc");
  EXPECT_EQ(q.base, "sig");
  EXPECT_EQ(q.emitter, "drive");
  EXPECT_EQ(element<Resistor>(deck, "x1/r1").b, "x1/mid");
  EXPECT_EQ(element<Resistor>(deck, "x1/r2").b, "gnd");
  EXPECT_DOUBLE_EQ(element<Resistor>(deck, "x1/r2").resistance, 235);   // 470 / 2
  EXPECT_DOUBLE_EQ(element<Resistor>(deck, "x2/r1").resistance, 1000);  // default
  EXPECT_EQ(element<Resistor>(deck, "x2/r1").a, "b");
}

TEST(Blocks, NestedAndRecursive) {
  const Deck deck = read(
      "block inner(a; r = 1k)\n  r1 = resistor(a, n, r)\nend\n"
      "block outer(p)\n  y = inner(p, r = 2k)\nend\nx = outer(top)\n");
  EXPECT_EQ(element<Resistor>(deck, "x/y/r1").a, "top");
  EXPECT_EQ(element<Resistor>(deck, "x/y/r1").b, "x/y/n");
  expect_error("block a(p)\n  u = b(p)\nend\nblock b(p)\n  v = a(p)\nend\nx = a(n)\n", 5, 7,
               "contains itself: a -> b -> a");
}

TEST(Blocks, UsableAboveTheirDefinition) {
  // Spec section 9: blocks may be used before their definition.
  const Deck deck = read(
      "let rx = 3k\nr0 = resistor(top, gnd, 1k)\nx = divider(top, r = rx)\n"
      "block divider(a; r = 1k)\n  r1 = resistor(a, mid, r)\nend\n");
  EXPECT_EQ(element<Resistor>(deck, "x/r1").b, "x/mid");
  EXPECT_DOUBLE_EQ(element<Resistor>(deck, "x/r1").resistance, 3000);
  // Elements keep the order they are written in, the block's where it is used.
  ASSERT_EQ(deck.circuit.elements().size(), 2u);
  EXPECT_EQ(deck.circuit.elements()[1].name, "x/r1");
  // Elaborated again from what was kept of the text.
  const Circuit again = deck.with_parameter("rx", 5000);
  EXPECT_DOUBLE_EQ(std::get<Resistor>(again.elements()[1].data).resistance, 5000);
}

TEST(Errors, LinesAreCountedFarIntoALongFile) {
  // Lines and columns counted by hand: 130 elements with comments, then a
  // call written over three lines (its newlines inside the brackets count),
  // then the line at fault.
  std::string text;
  for (int k = 1; k <= 130; ++k) {
    text += "r" + std::to_string(k) + " = resistor(a, b, 1k)  # µ comment\n";
  }
  text += "c = capacitor(a,\n  b,\n  1 nF)\n";
  try {
    read(text + "bad = resistor(a, b, 1 nF)\n");
    FAIL();
  } catch (const InputError& e) {
    EXPECT_EQ(e.where().line, 134) << e.what();
    EXPECT_EQ(e.where().column, 22) << e.what();
    EXPECT_NE(std::string(e.what()).find("\nbad = resistor(a, b, 1 nF)\n"), std::string::npos)
        << e.what();
  }
  expect_error(text + "r5 = resistor(a, b, 1k) # µ\n", 134, 1, "already exists");
}

TEST(Errors, SyntaxIsReportedBeforeMeaning) {
  // Every file is checked for syntax before any statement is given meaning,
  // so a syntax error below a wrong value is the one reported.
  expect_error("r1 = resistor(a, b, 1 nF)\nr2 = resistor(a b)\n", 2, 17, "expected");
  // And a block's definition is checked before the statements above it.
  expect_error("r1 = resistor(a, b, 1 nF)\nblock resistor(p)\nend\n", 2, 1,
               "cannot be named like the element kind");
}

class Includes : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() /
           ("stage_reader_" + std::to_string(::testing::UnitTest::GetInstance()->random_seed()) +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::create_directories(dir_ / "sub" / "models");
    fs::create_directories(dir_ / "library");
  }
  void TearDown() override { fs::remove_all(dir_); }
  void write(const fs::path& name, const std::string& text) { std::ofstream(dir_ / name) << text; }
  fs::path dir_;
};

TEST_F(Includes, RelativeToTheIncludingFileThenSearchPath) {
  write("sub/main.stage", "include \"models/a.stage\"\nq = npn(c, b, e, model = qa)\n");
  write("sub/models/a.stage", "include \"lib.stage\"\nmodel qa = qlib { beta_forward = 77 }\n");
  write("library/lib.stage", "model qlib = npn { saturation_current = 2 fA }\n");
  ReadOptions options;
  options.model_path = {dir_ / "library"};
  const Deck deck = read_file(dir_ / "sub/main.stage", options);
  EXPECT_DOUBLE_EQ(deck.circuit.bipolar_models().at("qa").beta_forward, 77);
  EXPECT_DOUBLE_EQ(deck.circuit.bipolar_models().at("qa").saturation_current, 2e-15);
}

TEST_F(Includes, CycleIsReportedWithItsChain) {
  write("a.stage", "include \"b.stage\"\n");
  write("b.stage", "\ninclude \"a.stage\"\n");
  try {
    read_file(dir_ / "a.stage");
    FAIL();
  } catch (const InputError& e) {
    EXPECT_EQ(e.where().line, 2);
    EXPECT_EQ(e.where().column, 1);
    EXPECT_NE(e.message().find("a.stage -> b.stage -> a.stage"), std::string::npos) << e.what();
  }
}

TEST_F(Includes, MissingFile) {
  write("a.stage", "let x = 1\n  include \"nowhere.stage\"\n");
  try {
    read_file(dir_ / "a.stage");
    FAIL();
  } catch (const InputError& e) {
    EXPECT_EQ(e.where().line, 2);
    EXPECT_EQ(e.where().column, 3);
    EXPECT_NE(e.message().find("cannot find 'nowhere.stage'"), std::string::npos);
  }
}

// The command passes the default model folders itself; the reader adds them
// too. Each folder is still searched, and listed, once.
TEST_F(Includes, MissingFileListsEachFolderOnce) {
  write("a.stage", "include \"nowhere.stage\"\n");
  ReadOptions options;
  options.model_path = default_model_path();
  options.model_path.push_back(dir_);
  try {
    read_file(dir_ / "a.stage", options);
    FAIL();
  } catch (const InputError& e) {
    const std::string message = e.message();
    for (const auto& folder : options.model_path) {
      const std::string listed = "\n  " + (folder / "nowhere.stage").lexically_normal().string();
      const auto first = message.find(listed);
      ASSERT_NE(first, std::string::npos) << message;
      EXPECT_EQ(message.find(listed, first + 1), std::string::npos) << message;
    }
  }
}

// ReadOptions::max_file_size (the command's --max-file-size) holds for the
// main file and for each include; the message says how to raise it.
TEST_F(Includes, FileLargerThanTheLimitIsRefusedWithHowToRaiseIt) {
  write("a.stage", "include \"big.stage\"\n");
  write("big.stage", "r = resistor(a, gnd, 1k)\n" + std::string(3u << 20, '#') + "\n");
  ReadOptions options;
  options.max_file_size = 2u << 20;
  try {
    read_file(dir_ / "a.stage", options);
    FAIL();
  } catch (const InputError& e) {
    EXPECT_EQ(e.where().line, 1);
    EXPECT_NE(e.message().find("(3 MiB) is larger than the limit of 2 MiB"), std::string::npos)
        << e.message();
    EXPECT_NE(e.message().find("--max-file-size"), std::string::npos) << e.message();
  }
  EXPECT_THROW(read_file(dir_ / "big.stage", options), InputError);
  options.max_file_size = 4u << 20;
  EXPECT_EQ(read_file(dir_ / "a.stage", options).circuit.elements().size(), 1u);
}

// The same limit holds for text handed in from C++, and for a file with no
// size to check first: a device that never ends is read only up to it.
TEST_F(Includes, TextAndEndlessFilesAreHeldToTheLimit) {
  ReadOptions options;
  options.max_file_size = 1u << 20;
  EXPECT_THROW(read_text(std::string(2u << 20, '#'), "big.stage", options), InputError);
  try {
    read_file("/dev/zero", options);
    FAIL();
  } catch (const InputError& e) {
    EXPECT_NE(e.message().find("larger than the limit of 1 MiB"), std::string::npos) << e.message();
  }
}

}  // namespace
}  // namespace stage::testing
