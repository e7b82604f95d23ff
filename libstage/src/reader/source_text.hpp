// One input file held in memory: its name, its text and where its lines
// start, so that a byte offset found by the grammar becomes a line and column
// and every error can show the offending line with a caret.
#pragma once

#include <string>
#include <vector>

#include "stage/errors.hpp"

namespace stage::reader {

class SourceText {
 public:
  SourceText(std::string file_name, std::string text);

  const std::string& file_name() const { return file_name_; }
  const std::string& text() const { return text_; }

  // Line and column (from 1; columns count UTF-8 characters) of a byte offset.
  SourceLocation location(int offset) const;
  std::string line_text(int line) const;

  InputError error(int offset, const std::string& message) const;
  [[noreturn]] void fail(int offset, const std::string& message) const;

 private:
  std::string file_name_;
  std::string text_;
  std::vector<int> line_starts_;
};

// The text the grammar reads, byte for byte as long as the source so offsets
// still match: comments become blanks and the newlines inside ( ) and { }
// form feeds (skipped like blanks, but a unit cannot reach across them).
// Checks first what needs no grammar and protects it: valid UTF-8, brackets
// that close and do not nest absurdly deep. Throws InputError.
std::string prepare_for_grammar(const SourceText& source);

}  // namespace stage::reader
