// One input file held in memory: its name, its text and where its lines
// start, so that a byte offset found by the grammar becomes a line and column
// and every error can show the offending line with a caret.
#pragma once

#include <string>
#include <vector>

#include "stage/errors.hpp"

namespace stage::reader {

// Holds the text as the grammar reads it, byte for byte as long as the source
// so offsets still match: comments become blanks and the newlines inside ( )
// and { } form feeds (skipped like blanks, but a unit cannot reach across
// them). The bytes so replaced are kept aside, so lines and columns in
// messages show and count the text as written. One copy of the text in all.
class SourceText {
 public:
  // Checks first what needs no grammar and protects it: valid UTF-8, no NUL,
  // brackets that close and do not nest absurdly deep. Throws InputError.
  SourceText(std::string file_name, std::string text);

  const std::string& file_name() const { return file_name_; }
  // The text prepared for the grammar.
  const std::string& text() const { return text_; }

  // Line and column (from 1; columns count UTF-8 characters) of a byte offset.
  SourceLocation location(int offset) const;
  // A line as written.
  std::string line_text(int line) const;

  InputError error(int offset, const std::string& message) const;
  [[noreturn]] void fail(int offset, const std::string& message) const;

 private:
  // Bytes of the text as written that the prepared text replaced.
  struct Replaced {
    int offset;
    std::string written;
  };
  void prepare();
  void replace(int offset, int length, char by);
  // The text as written from `begin` to `end`.
  std::string written(int begin, int end) const;
  // Where line `line` (from 1) starts, or -1 when there is no such line.
  int line_start(int line) const;

  std::string file_name_;
  std::string text_;
  std::vector<Replaced> replaced_;  // by offset
  // Where every kLinesPerMark-th line of the text as written starts (lines
  // 1, 1 + k, 1 + 2k, …), so that an offset finds its line by bisection and
  // a count over a few lines, with a few bytes kept per thousand lines.
  static constexpr int kLinesPerMark = 64;
  std::vector<int> marks_;
  int lines_ = 1;
};

}  // namespace stage::reader
