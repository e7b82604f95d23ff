// Helpers shared by the reader tests: read a text, and expect an InputError
// at a given line and column whose message contains a given phrase.
#pragma once

#include <gtest/gtest.h>

#include <string>

#include "stage/errors.hpp"
#include "stage/reader.hpp"

namespace stage::testing {

inline Deck read(const std::string& text, const ReadOptions& options = {}) {
  return read_text(text, "test.stage", options);
}

inline void expect_error(const std::string& text, int line, int column, const std::string& phrase,
                         const ReadOptions& options = {}) {
  try {
    read(text, options);
    ADD_FAILURE() << "no error for:\n" << text;
  } catch (const InputError& e) {
    EXPECT_EQ(e.where().line, line) << e.what();
    EXPECT_EQ(e.where().column, column) << e.what();
    EXPECT_NE(e.message().find(phrase), std::string::npos) << e.what();
  }
}

template <class T>
const T& element(const Deck& deck, const std::string& name) {
  const Element* e = deck.circuit.find(name);
  if (!e) throw std::runtime_error("no element " + name);
  return std::get<T>(e->data);
}

}  // namespace stage::testing
