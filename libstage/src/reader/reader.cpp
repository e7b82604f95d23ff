// The reader's entry points: files in, Deck out, the main file with every
// file it includes (reader/loader.hpp) elaborated (reader/elaborator.hpp).
#include "stage/reader.hpp"

#include <cstdlib>

#include "reader/elaborator.hpp"
#include "reader/loader.hpp"

namespace stage {

namespace fs = std::filesystem;

namespace {

// Each statement is parsed once and elaborated as it is read, includes opened
// where they stand. Should that meet anything out of the ordinary (an error,
// or a block used above its definition), the deck is read again the careful
// way: every file parsed first, keeping its blocks and includes, then
// elaborated statement by statement; so errors are reported in that order
// (syntax and includes, then blocks, then meaning) whichever way succeeds.
Deck read(const fs::path& path, std::string text, const ReadOptions& options) {
  auto tree = std::make_shared<SyntaxTree>();
  {
    reader::Loader loader(*tree, options);
    loader.add(path, reader::SourceText(path.string(), std::move(text)));
    try {
      return elaborate::read(tree, loader, options);
    } catch (const Error&) {
    } catch (const elaborate::ReadCarefully&) {
    }
  }
  reader::SourceText main = std::move(tree->files.front().source);
  tree = std::make_shared<SyntaxTree>();
  reader::Loader(*tree, options).load(path, std::move(main));
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
  return read(path, reader::read_whole(path, {path.string(), 0, 0}, options), options);
}

Deck read_text(const std::string& text, const std::string& file_name, const ReadOptions& options) {
  reader::check_size(text.size(), file_name, {file_name, 0, 0}, options);
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
}

void Places::add(std::string_view subject, int file, int offset) {
  entries_.push_back({static_cast<std::uint32_t>(names_.size()), file, offset});
  names_.append(subject);
}

void Places::index() { index_.rebuild(entries_.size(), names(), entries_.size()); }

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
