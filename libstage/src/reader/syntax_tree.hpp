// The parsed files of one deck: the main file first, then every included
// file, each with its text (for messages) and a map from each `include`
// statement to the file it brought in. Elaboration needs nothing else, so a
// Deck can be elaborated again (parameter sweeps) without touching the disk.
#pragma once

#include <map>
#include <vector>

#include "reader/source_text.hpp"
#include "reader/syntax.hpp"

namespace stage {

class SyntaxTree {
 public:
  struct File {
    reader::SourceText source;
    ast::File ast;
    // Offset of an `include` statement -> index into `files`; -1 when the
    // file was already included elsewhere and is not read twice.
    std::map<int, int> includes;
  };
  std::vector<File> files;
};

}  // namespace stage
