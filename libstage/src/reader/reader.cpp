// The reader's entry points: files in, Deck out. Loads the main file and every
// file it includes (relative to the including file, then the model search
// path), refusing include cycles with their chain, then elaborates.
#include "stage/reader.hpp"

#include <algorithm>
#include <cstdlib>
#include <fstream>
#include <limits>

#include "reader/elaborator.hpp"
#include "reader/grammar.hpp"

namespace stage {

namespace fs = std::filesystem;
namespace x3 = boost::spirit::x3;

namespace {

// Includes deeper than this are a mistake even without a cycle.
constexpr std::size_t kMaxIncludeDepth = 32;
// Offsets in the text are ints.
constexpr std::uintmax_t kLargestReadable = std::numeric_limits<int>::max();

// A text of `size` bytes, from a file or from the caller, within what can
// be read (offsets are ints) and the limit the options set.
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
  while (in) {
    const std::size_t had = text.size();
    text.resize(had + kPiece);
    in.read(text.data() + had, kPiece);
    text.resize(had + static_cast<std::size_t>(in.gcount()));
    check_size(text.size(), path.string(), from, options);
  }
  return text;
}

class Loader {
 public:
  Loader(SyntaxTree& tree, const ReadOptions& options) : tree_(tree), options_(options) {
    // The caller's folders first, then the defaults; a folder named twice
    // (a caller that passes the defaults itself) is searched once.
    for (const auto& list : {options.model_path, default_model_path()}) {
      for (const fs::path& p : list) {
        if (std::find(search_.begin(), search_.end(), p.lexically_normal()) == search_.end())
          search_.push_back(p.lexically_normal());
      }
    }
  }

  // Parses one file, keeping its blocks and includes, then, depth first,
  // everything it includes.
  int load(fs::path path, std::string text) {
    const fs::path key = fs::weakly_canonical(path);
    const int index = static_cast<int>(tree_.files.size());
    tree_.files.push_back({reader::SourceText(path.string(), std::move(text)), {}, {}});
    std::vector<ast::Include> includes;
    {
      reader::StatementStream stream(tree_.files[index].source);
      while (std::optional<ast::Statement> statement = stream.next()) {
        if (const auto* include = boost::get<ast::Include>(&*statement))
          includes.push_back(*include);
        if (const auto* instance = boost::get<ast::Instance>(&*statement)) {
          ++tree_.instances;
          tree_.instance_name_bytes += instance->name.size() + 1;
        }
        if (boost::get<ast::Include>(&*statement) ||
            boost::get<x3::forward_ast<ast::Block>>(&*statement)) {
          tree_.files[index].blocks_and_includes.push_back(std::move(*statement));
        }
      }
    }
    chain_.push_back(key);
    loaded_.insert(key);
    for (const ast::Include& include : includes) resolve(index, include, path.parent_path());
    chain_.pop_back();
    return index;
  }

 private:
  void resolve(int from, const ast::Include& include, const fs::path& folder) {
    const reader::SourceText& source = tree_.files[from].source;
    const fs::path written(include.path);
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
      if (chain_.size() >= kMaxIncludeDepth)
        source.fail(include.offset, "includes nest too deeply");
      if (loaded_.count(key)) {
        tree_.files[from].includes[include.offset] = -1;
        return;
      }
      std::string text = read_whole(candidate, source.location(include.offset), options_);
      const int index = load(candidate, std::move(text));
      tree_.files[from].includes[include.offset] = index;
      return;
    }
    std::string looked;
    for (const fs::path& c : candidates) looked += "\n  " + c.string();
    source.fail(include.offset, "cannot find '" + include.path + "'; looked for:" + looked);
  }

  SyntaxTree& tree_;
  const ReadOptions& options_;
  std::vector<fs::path> search_;
  std::vector<fs::path> chain_;
  std::set<fs::path> loaded_;
};

Deck read(const fs::path& path, std::string text, const ReadOptions& options) {
  auto tree = std::make_shared<SyntaxTree>();
  Loader(*tree, options).load(path, std::move(text));
  return elaborate::elaborate(std::move(tree), options);
}

}  // namespace

std::vector<fs::path> default_model_path() {
  std::vector<fs::path> path;
  if (const char* env = std::getenv("STAGE_MODEL_PATH")) {
    std::string_view rest(env);
    while (!rest.empty()) {
      const auto colon = rest.find(':');
      if (colon != 0) path.emplace_back(std::string(rest.substr(0, colon)));
      if (colon == std::string_view::npos) break;
      rest.remove_prefix(colon + 1);
    }
  }
  path.emplace_back(STAGE_INSTALLED_MODELS);
  path.emplace_back(STAGE_SOURCE_MODELS);
  return path;
}

Deck read_file(const fs::path& path, const ReadOptions& options) {
  return read(path, read_whole(path, {path.string(), 0, 0}, options), options);
}

Deck read_text(const std::string& text, const std::string& file_name, const ReadOptions& options) {
  check_size(text.size(), file_name, {file_name, 0, 0}, options);
  return read(file_name, text, options);
}

Places::const_iterator Places::find(const std::string& subject) const {
  const_iterator it;
  if (const std::optional<std::size_t> at = index_.find(subject, names())) {
    const Entry& e = entries_[*at];
    it.found_.emplace(subject, tree_->files[e.file].source.location(e.offset));
  }
  return it;
}

void Places::reserve(std::size_t count, std::size_t name_bytes) {
  entries_.reserve(count);
  names_.reserve(name_bytes);
  index_.rebuild(entries_.size(), names(), count);
}

void Places::add(std::string_view subject, int file, int offset) {
  entries_.push_back({static_cast<std::uint32_t>(names_.size()), file, offset});
  names_.append(subject);
  names_.push_back('\0');
  index_.added(entries_.size() - 1, entries_.size(), names());
}

std::string Deck::line_text(const SourceLocation& where) const {
  if (!tree) return {};
  for (const auto& file : tree->files) {
    if (file.source.file_name() == where.file) return file.source.line_text(where.line);
  }
  return {};
}

Circuit Deck::with_parameter(const std::string& name, double value) const {
  if (!tree) throw InputError({file.string(), 0, 0}, "this deck was not read from text");
  ReadOptions changed = options;
  changed.overrides[name] = value;
  return elaborate::elaborate(tree, changed).circuit;
}

}  // namespace stage
