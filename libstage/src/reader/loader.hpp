// Bringing a deck's files into its SyntaxTree: reading a file within the size
// limits, finding what an `include` names (relative to the including file,
// then the model search path), refusing include cycles with their chain.
// Files can be loaded whole ahead of elaboration (load) or opened one at a
// time as elaboration meets their `include` (open, enter, leave).
#pragma once

#include <filesystem>
#include <set>
#include <string>
#include <vector>

#include "reader/syntax_tree.hpp"
#include "stage/reader.hpp"

namespace stage::reader {

// A text of `size` bytes named `name`, checked against what can be read
// (offsets are ints) and the limit the options set.
void check_size(std::uintmax_t size, const std::string& name, const SourceLocation& from,
                const ReadOptions& options);

// The whole file, checked as it grows; errors point at `from`.
std::string read_whole(const std::filesystem::path& path, const SourceLocation& from,
                       const ReadOptions& options);

class Loader {
 public:
  Loader(SyntaxTree& tree, const ReadOptions& options);

  // Adds a file, not yet parsed, to the tree; returns its index.
  int add(const std::filesystem::path& path, SourceText source);
  // Adds a file and parses it, keeping its blocks and includes, then,
  // depth first, everything it includes. Returns its index.
  int load(const std::filesystem::path& path, SourceText source);

  // The file an `include` of file `from` names, added to the tree (not
  // parsed), or -1 when it was loaded before; checks the chain of files
  // entered for a cycle.
  int open(int from, const ast::Include& include);
  // Keeps a `block` or `include` statement of file `index` (read as it is
  // elaborated) in the tree; returns the kept statement.
  const ast::Statement& keep(int index, ast::Statement statement);
  // The statements of file `index` are being read (until leave()).
  void enter(int index);
  void leave();

 private:
  void parse(int index);

  SyntaxTree& tree_;
  const ReadOptions& options_;
  std::vector<std::filesystem::path> search_;
  std::vector<std::filesystem::path> keys_;   // each file's canonical path, by index
  std::vector<std::filesystem::path> chain_;  // the files entered
  std::set<std::filesystem::path> loaded_;
};

}  // namespace stage::reader
