// Loading a deck's files: reading them within the size limits, resolving
// includes along the search path, refusing cycles and deep nesting.
#include "reader/loader.hpp"

#include <algorithm>
#include <cctype>
#include <fstream>
#include <limits>

#include "reader/grammar.hpp"

namespace stage::reader {

namespace fs = std::filesystem;
namespace x3 = boost::spirit::x3;

namespace {

// Includes deeper than this are a mistake even without a cycle.
constexpr std::size_t kMaxIncludeDepth = 32;
// Offsets in the text are ints.
constexpr std::uintmax_t kLargestReadable = std::numeric_limits<int>::max();

bool is_name_start(char c) { return std::isalpha(static_cast<unsigned char>(c)) || c == '_'; }
bool is_name_char(char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_'; }

// Counts the lines of a prepared text (where brackets hold no newlines, so a
// line is a statement) that start with `name =`: the elements and block
// instances it writes.
void count_instances(SyntaxTree::File& file) {
  const std::string& text = file.source.text();
  const auto blank = [&](std::size_t i) {
    return i < text.size() && (text[i] == ' ' || text[i] == '\t' || text[i] == '\f');
  };
  for (std::size_t line = 0; line < text.size();) {
    const std::size_t end = std::min(text.find('\n', line), text.size());
    std::size_t i = line;
    while (blank(i)) ++i;
    const std::size_t name = i;
    if (i < end && is_name_start(text[i])) {
      while (i < end && is_name_char(text[i])) ++i;
      const std::size_t name_end = i;
      while (blank(i)) ++i;
      if (i < end && text[i] == '=') {
        ++file.instances;
        file.instance_name_bytes += name_end - name;
      }
    }
    line = end + 1;
  }
}

}  // namespace

void check_size(std::uintmax_t size, const std::string& name, const SourceLocation& from,
                const ReadOptions& options) {
  if (size > kLargestReadable) {
    throw InputError(
        from, "the file '" + name + "' is larger than 2 GiB, the most a circuit file can be");
  }
  if (size > options.max_file_size) {
    const auto mib = [](std::uintmax_t bytes) { return std::to_string(bytes >> 20); };
    throw InputError(from, "the file '" + name + "' (" + mib(size) +
                               " MiB) is larger than the limit of " + mib(options.max_file_size) +
                               " MiB for a circuit file; raise it with --max-file-size MiB "
                               "(ReadOptions::max_file_size)");
  }
}

std::string read_whole(const fs::path& path, const SourceLocation& from,
                       const ReadOptions& options) {
  std::error_code ec;
  const auto size = fs::file_size(path, ec);
  if (!ec) check_size(size, path.string(), from, options);
  std::ifstream in(path, std::ios::binary);
  if (!in || fs::is_directory(path, ec)) {
    throw InputError(from, "cannot read the file '" + path.string() + "'");
  }
  // Read in pieces and checked as it grows: a device or a pipe has no size
  // to check first (`/dev/zero` never ends).
  constexpr std::size_t kPiece = 1 << 20;
  std::string text;
  if (!ec) text.reserve(size + kPiece);  // grown once, when the size is known
  while (in) {
    const std::size_t had = text.size();
    text.resize(had + kPiece);
    in.read(text.data() + had, kPiece);
    text.resize(had + static_cast<std::size_t>(in.gcount()));
    check_size(text.size(), path.string(), from, options);
  }
  return text;
}

Loader::Loader(SyntaxTree& tree, const ReadOptions& options) : tree_(tree), options_(options) {
  // The caller's folders first, then the defaults; a folder named twice
  // (a caller that passes the defaults itself) is searched once.
  for (const auto& list : {options.model_path, default_model_path()}) {
    for (const fs::path& p : list) {
      if (std::find(search_.begin(), search_.end(), p.lexically_normal()) == search_.end())
        search_.push_back(p.lexically_normal());
    }
  }
}

int Loader::add(const fs::path& path, SourceText source) {
  const int index = static_cast<int>(tree_.files.size());
  tree_.files.push_back({index, std::move(source), {}, {}});
  count_instances(tree_.files.back());
  keys_.push_back(fs::weakly_canonical(path));
  loaded_.insert(keys_.back());
  return index;
}

int Loader::load(const fs::path& path, SourceText source) {
  const int index = add(path, std::move(source));
  parse(index);
  return index;
}

void Loader::parse(int index) {
  SyntaxTree::File& file = tree_.files[index];
  std::vector<ast::Include> includes;
  StatementStream stream(file.source);
  while (std::optional<ast::Statement> statement = stream.next()) {
    if (const auto* include = boost::get<ast::Include>(&*statement)) includes.push_back(*include);
    if (boost::get<ast::Include>(&*statement) ||
        boost::get<x3::forward_ast<ast::Block>>(&*statement)) {
      file.blocks_and_includes.push_back(std::move(*statement));
    }
  }
  enter(index);
  for (const ast::Include& include : includes) {
    if (const int included = open(index, include); included >= 0) parse(included);
  }
  leave();
}

const ast::Statement& Loader::keep(int index, ast::Statement statement) {
  return tree_.files[index].blocks_and_includes.emplace_back(std::move(statement));
}

void Loader::enter(int index) { chain_.push_back(keys_[index]); }

void Loader::leave() { chain_.pop_back(); }

int Loader::open(int from, const ast::Include& include) {
  SyntaxTree::File& file = tree_.files[from];
  const SourceText& source = file.source;
  const fs::path written(include.path);
  const fs::path folder = fs::path(source.file_name()).parent_path();
  std::vector<fs::path> candidates{(folder / written).lexically_normal()};
  if (written.is_relative()) {
    for (const fs::path& p : search_) {
      fs::path candidate = (p / written).lexically_normal();
      if (std::find(candidates.begin(), candidates.end(), candidate) == candidates.end())
        candidates.push_back(std::move(candidate));
    }
  }
  std::error_code ec;
  for (const fs::path& candidate : candidates) {
    if (!fs::is_regular_file(candidate, ec)) continue;
    const fs::path key = fs::weakly_canonical(candidate);
    for (std::size_t i = 0; i < chain_.size(); ++i) {
      if (chain_[i] != key) continue;
      std::string cycle;
      for (std::size_t j = i; j < chain_.size(); ++j)
        cycle += chain_[j].filename().string() + " -> ";
      source.fail(include.offset, "include cycle: " + cycle + key.filename().string());
    }
    if (chain_.size() >= kMaxIncludeDepth) source.fail(include.offset, "includes nest too deeply");
    if (loaded_.count(key)) return file.includes[include.offset] = -1;
    std::string text = read_whole(candidate, source.location(include.offset), options_);
    return file.includes[include.offset] =
               add(candidate, SourceText(candidate.string(), std::move(text)));
  }
  std::string looked;
  for (const fs::path& c : candidates) looked += "\n  " + c.string();
  source.fail(include.offset, "cannot find '" + include.path + "'; looked for:" + looked);
}

}  // namespace stage::reader
