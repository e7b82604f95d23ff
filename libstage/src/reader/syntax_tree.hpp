// The files of one deck as elaboration needs them: the main file first, then
// every included file, each with its text and, of its statements, only the
// block definitions and includes (the rest is parsed as it is elaborated,
// one statement at a time, so no whole syntax tree is held), and a map from
// each `include` statement to the file it brought in. A Deck can be
// elaborated again (parameter sweeps) without touching the disk.
#pragma once

#include <cstddef>
#include <deque>
#include <map>

#include "reader/source_text.hpp"
#include "reader/syntax.hpp"

namespace stage {

class SyntaxTree {
 public:
  struct File {
    int index;  // in `files`
    reader::SourceText source;
    // The `block` and `include` statements, in order (a deque: blocks are
    // referred to while more statements are added).
    std::deque<ast::Statement> blocks_and_includes;
    // Offset of an `include` statement -> index into `files`; -1 when the
    // file was already included elsewhere and is not read twice.
    std::map<int, int> includes;
    // Its lines of the form `name = …`: the elements and block instances it
    // writes (counted before it is parsed, to make room for them), and
    // their names' lengths.
    std::size_t instances = 0;
    std::size_t instance_name_bytes = 0;
  };
  // A deque: elaboration holds on to files while includes are added.
  std::deque<File> files;
};

}  // namespace stage
