// Inputs built to exhaust the reader or an analysis (issue 19's list): each
// is refused with an input error at its place before any work grows with
// it, instead of a crash, a hang or running out of memory.
#include <gtest/gtest.h>

#include <string>

#include "stage/errors.hpp"
#include "stage/reader.hpp"
#include "stage/run.hpp"

namespace {

// The error a text is refused with, or "" when it is not refused.
std::string refusal(const std::string& text) {
  try {
    stage::check_deck(stage::read_text(text, "hostile.stage"));
  } catch (const stage::Error& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::input) << e.what();
    return e.what();
  }
  return "";
}

const std::string kDivider = "v1 = voltage(a, gnd, 1 V)\nr1 = resistor(a, gnd, 1k)\n";

// Each unbracketed '^' made the grammar recurse once: 16,000 of them
// overflowed the stack.
TEST(HostileInput, LongPowerChainsAreRefused) {
  std::string chain = "1";
  for (int i = 0; i < 16000; ++i) chain += "^1";
  const std::string why = refusal("let x = " + chain + "\n" + kDivider + "analyze bias()\n");
  EXPECT_NE(why.find("more than 100 '^' in one statement"), std::string::npos) << why;
  // A hundred are still read, and grouped to the right: 2^1^...^1 = 2.
  std::string hundred = "2";
  for (int i = 0; i < 100; ++i) hundred += "^1";
  const auto deck = stage::read_text(
      "let x = " + hundred + "\nv1 = voltage(a, gnd, 1 V)\nr1 = resistor(a, gnd, x * 1k)\n",
      "ok.stage");
  EXPECT_EQ(std::get<stage::Resistor>(deck.circuit.elements()[1].data).resistance, 2000.0);
}

// 29 levels of blocks, each instancing the next twice: 2^29 elements from a
// 1.4 KB file, refused from the definitions before any is made.
TEST(HostileInput, BlocksThatExpandBeyondTheLimitAreRefusedBeforeExpanding) {
  std::string text = "block b0(a, b)\nr1 = resistor(a, b, 1k)\nend\n";
  for (int i = 1; i < 30; ++i) {
    text += "block b" + std::to_string(i) + "(a, b)\nx1 = b" + std::to_string(i - 1) +
            "(a, m)\nx2 = b" + std::to_string(i - 1) + "(m, b)\nend\n";
  }
  const std::string why = refusal(text + "v1 = voltage(a, gnd, 1 V)\nx = b29(a, gnd)\n");
  EXPECT_NE(why.find("hostile.stage:"), std::string::npos) << why;
  EXPECT_NE(why.find("more than 10000000 elements"), std::string::npos) << why;
}

// A name of 100,000 characters beside a similar one: the nearest-name search
// took the product of the lengths (15 s); such a name gets no suggestion.
TEST(HostileInput, VeryLongUnknownNamesGetNoSuggestion) {
  const std::string name(100000, 'n');
  const std::string why =
      refusal("let " + name + " = 1\nv1 = voltage(a, gnd, 1 V)\nr1 = resistor(a, gnd, " + name +
              "x)\nanalyze bias()\n");
  EXPECT_NE(why.find("hostile.stage:3:"), std::string::npos) << why.substr(0, 200);
  EXPECT_EQ(why.find("nearest"), std::string::npos) << why.substr(0, 200);
}

// A pulse of period 1 fs over a 1 s transient has 4e15 corners, each a step
// the transient would land on, all listed up front.
TEST(HostileInput, WaveformsWithTooManyCornersAreRefused) {
  const std::string why = refusal(
      "v1 = voltage(a, gnd, wave = pulse(low = 0 V, high = 1 V, period = 1 fs, rise = 0 s, "
      "fall = 0 s, high_time = 0.5 fs))\nr1 = resistor(a, gnd, 1k)\nanalyze transient(stop = 1 "
      "s)\n");
  EXPECT_NE(why.find("'v1' has more than 10000000 corners"), std::string::npos) << why;
}

}  // namespace
