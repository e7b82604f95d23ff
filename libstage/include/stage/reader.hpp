// Reading `.stage` files (spec: libstage/src/reader/circuit-format.md) into a
// Deck: the elaborated circuit, its solver settings and its analysis
// statements.
#pragma once

#include <cstdint>
#include <filesystem>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
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

// Where each element ("<name>") and model ("model <name>") of a deck was
// written, looked up as in a std::map of subjects to locations, but kept in
// a few dozen bytes a subject (a large circuit has millions of elements): the
// line and column are worked out from the file's text when asked for.
class Places {
 public:
  using value_type = std::pair<const std::string, SourceLocation>;

  // A found subject and its location, or end().
  class const_iterator {
   public:
    const value_type& operator*() const { return *found_; }
    const value_type* operator->() const { return &*found_; }
    bool operator==(const const_iterator& other) const {
      return found_.has_value() == other.found_.has_value() &&
             (!found_ || found_->first == other.found_->first);
    }

   private:
    friend class Places;
    std::optional<value_type> found_;
  };

  // Internal: places in the files of `tree`.
  explicit Places(std::shared_ptr<const SyntaxTree> tree = nullptr) : tree_(std::move(tree)) {}

  const_iterator find(const std::string& subject) const;
  const_iterator end() const { return {}; }
  std::size_t count(const std::string& subject) const { return find(subject) == end() ? 0 : 1; }
  std::size_t size() const { return entries_.size(); }
  bool empty() const { return entries_.empty(); }

  // Internal, for the reader. Makes room for `count` subjects in all, whose
  // names take `name_bytes`.
  void reserve(std::size_t count, std::size_t name_bytes);
  // Records that `subject`, not recorded before, was written at `offset` in
  // the tree's file number `file`.
  void add(std::string_view subject, int file, int offset);
  // Indexes the subjects recorded, all at once (cheaper than one by one, as
  // the index then stays in the cache): find() sees those indexed.
  void index();

 private:
  struct Entry {
    std::uint32_t name;  // offset of the subject in names_
    int file;
    int offset;
  };
  // The names index_ reads; each ends where the next begins.
  auto names() const {
    return [this](std::size_t k) {
      const std::size_t end = k + 1 < entries_.size() ? entries_[k + 1].name : names_.size();
      return std::string_view(names_.data() + entries_[k].name, end - entries_[k].name);
    };
  }

  std::shared_ptr<const SyntaxTree> tree_;
  std::string names_;  // the subjects, one after another
  std::vector<Entry> entries_;
  detail::NameIndex index_;
};

// A read circuit description.
class Deck {
 public:
  Circuit circuit;
  SolverOptions solver;  // the `solver(...)` statement's settings; every run uses them
  std::vector<AnalysisStatement> analyses;
  std::filesystem::path file;
  // Where each element ("<name>") and model ("model <name>") was written,
  // for problems found after reading (Problem::subject names them).
  Places places;

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
