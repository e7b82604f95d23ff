// No input crashes or hangs the reader: thousands of random mutations of the
// example circuits (bytes deleted, inserted, replaced; the text cut short)
// either read cleanly or fail with an InputError, or with a NumericalError
// naming what is at fault when a mutation leaves a circuit whose graph has no
// DC solution (a floating node), found before anything runs; never with
// anything else.
#include <gtest/gtest.h>

#include <fstream>
#include <random>
#include <sstream>

#include "stage/errors.hpp"
#include "stage/reader.hpp"
#include "stage/run.hpp"

namespace {

std::string read_example(const std::string& name) {
  std::ifstream file(std::string(STAGE_SOURCE_DIR) + "/apps/examples/" + name);
  std::stringstream text;
  text << file.rdbuf();
  return text.str();
}

std::string mutate(std::string text, std::mt19937& rng) {
  // Bytes that matter to the grammar, plus arbitrary ones.
  static constexpr char kAlphabet[] = "(){}=,#\"\n \t.-+*/^%kmuµΩ0123456789abcxyz_\xff\x80";
  std::uniform_int_distribution<int> edits(1, 6), kind(0, 3);
  std::uniform_int_distribution<int> letter(0, sizeof kAlphabet - 2);
  for (int e = edits(rng); e > 0 && !text.empty(); --e) {
    std::uniform_int_distribution<std::size_t> at(0, text.size() - 1);
    const std::size_t i = at(rng);
    switch (kind(rng)) {
      case 0:
        text.erase(i, 1);
        break;
      case 1:
        text.insert(i, 1, kAlphabet[letter(rng)]);
        break;
      case 2:
        text[i] = kAlphabet[letter(rng)];
        break;
      default:
        text.resize(i);
        break;
    }
  }
  return text;
}

TEST(Robustness, MutatedExamplesFailOnlyWithInputErrors) {
  std::mt19937 rng(20261201);  // fixed: a failure is reproducible
  int read_cleanly = 0, rejected = 0;
  for (const char* name :
       {"follower_32ohm.stage", "push_pull_class_b.stage", "push_pull_class_ab.stage"}) {
    const std::string original = read_example(name);
    ASSERT_FALSE(original.empty()) << name;
    for (int k = 0; k < 2000; ++k) {
      const std::string text = mutate(original, rng);
      try {
        const stage::Deck deck = stage::read_text(text, name);
        stage::check_deck(deck);
        ++read_cleanly;
      } catch (const stage::InputError&) {
        ++rejected;
      } catch (const stage::NumericalError& e) {
        EXPECT_FALSE(e.involved().empty()) << e.what();
        ++rejected;
      } catch (const std::exception& e) {
        ADD_FAILURE() << name << " mutation " << k << " threw " << e.what() << "\n" << text;
      }
    }
  }
  // Both outcomes occur, so the mutations reach past the first error.
  EXPECT_GT(read_cleanly, 0);
  EXPECT_GT(rejected, 0);
}

}  // namespace
