// Reading `.stage` files (spec: libstage/src/reader/circuit-format.md) into a
// Deck: the elaborated circuit, its solver settings and its analysis
// statements.
#pragma once

#include <cstdint>
#include <filesystem>
#include <map>
#include <memory>
#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/circuit.hpp"
#include "stage/solver.hpp"

namespace stage {

struct ReadOptions {
  // Searched for `include` after the including file's own folder. The
  // project's models/ folder is appended by default_model_path().
  std::vector<std::filesystem::path> model_path;
  // `let` parameters overridden from outside: by number (SI units), or
  // written as in the language, units and expressions allowed (the
  // command's --set NAME=VALUE; errors name "--set").
  std::map<std::string, double> overrides;
  std::map<std::string, std::string> written_overrides;
  // The largest file read, in bytes (the main file and each include alone):
  // a guard against reading something that is no circuit description.
  // Reading takes several times a file's size in memory. At most 2 GiB - 1,
  // as offsets in the text are ints. The command's --max-file-size.
  std::uintmax_t max_file_size = std::uintmax_t{1} << 30;
};

// The model search path: $STAGE_MODEL_PATH (colon-separated) then the
// installed and source-tree models/ folders.
std::vector<std::filesystem::path> default_model_path();

class SyntaxTree;  // reader-internal

// A read circuit description.
class Deck {
 public:
  Circuit circuit;
  SolverOptions solver;  // the `solver(...)` statement's settings; every run uses them
  std::vector<AnalysisStatement> analyses;
  std::filesystem::path file;
  // Where each element ("<name>") and model ("model <name>") was written,
  // for problems found after reading (Problem::subject names them).
  std::map<std::string, SourceLocation> places;

  // The circuit elaborated again with one `let` parameter set to `value`
  // (parameter sweeps, which keep `solver` as read). Throws InputError if
  // `name` is not a parameter.
  Circuit with_parameter(const std::string& name, double value) const;

  // The text of line `where.line` of `where.file` as it was read, for the
  // caret line of an error found after reading; empty when the deck has no
  // such file (a deck not read from text). The disk is not read again.
  std::string line_text(const SourceLocation& where) const;

  // Internal: the syntax tree and options the deck was elaborated from.
  std::shared_ptr<const SyntaxTree> tree;
  ReadOptions options;
};

// Throw InputError on any problem in the text; nothing is run.
Deck read_file(const std::filesystem::path& path, const ReadOptions& options = {});
Deck read_text(const std::string& text, const std::string& file_name,
               const ReadOptions& options = {});

}  // namespace stage
