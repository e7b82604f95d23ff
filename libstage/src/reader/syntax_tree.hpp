// The files of one deck as elaboration needs them: the main file first, then
// every included file, each with its text and, of its statements, only the
// block definitions and includes (the rest is parsed again as it is
// elaborated, one statement at a time, so no whole syntax tree is held), and
// a map from each `include` statement to the file it brought in. A Deck can
// be elaborated again (parameter sweeps) without touching the disk.
#pragma once

#include <cstddef>
#include <map>
#include <vector>

#include "reader/source_text.hpp"
#include "reader/syntax.hpp"

namespace stage {

class SyntaxTree {
 public:
  struct File {
    reader::SourceText source;
    // The `block` and `include` statements, in order.
    std::vector<ast::Statement> blocks_and_includes;
    // Offset of an `include` statement -> index into `files`; -1 when the
    // file was already included elsewhere and is not read twice.
    std::map<int, int> includes;
  };
  std::vector<File> files;
  // Element and block instances written outside blocks, in all files: the
  // circuit's size when no block is used.
  std::size_t instances = 0;
  std::size_t instance_name_bytes = 0;  // their names' lengths, plus one each
};

}  // namespace stage
