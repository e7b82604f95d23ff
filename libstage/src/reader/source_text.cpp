// Offsets to lines and columns, and the preparation of raw text for the
// grammar: checks for bad UTF-8 and unbalanced or too deeply nested brackets
// (so the grammar never recurses without bound or runs off an unclosed list),
// blanking of comments, and newlines inside brackets turned into form feeds,
// in place, with the replaced bytes kept for messages.
#include "reader/source_text.hpp"

#include <algorithm>
#include <array>
#include <string_view>

namespace stage::reader {

SourceText::SourceText(std::string file_name, std::string text)
    : file_name_(std::move(file_name)), text_(std::move(text)) {
  prepare();
}

std::string SourceText::written(int begin, int end) const {
  std::string part = text_.substr(begin, end - begin);
  auto run = std::partition_point(replaced_.begin(), replaced_.end(), [&](const Replaced& r) {
    return r.offset + static_cast<int>(r.written.size()) <= begin;
  });
  for (; run != replaced_.end() && run->offset < end; ++run) {
    const int from = std::max(run->offset, begin);
    const int to = std::min(run->offset + static_cast<int>(run->written.size()), end);
    std::copy(run->written.begin() + (from - run->offset),
              run->written.begin() + (to - run->offset), part.begin() + (from - begin));
  }
  return part;
}

SourceLocation SourceText::location(int offset) const {
  offset = std::clamp(offset, 0, static_cast<int>(text_.size()));
  const auto next = std::upper_bound(marks_.begin(), marks_.end(), offset);
  const auto mark = static_cast<int>(next - marks_.begin()) - 1;
  const std::string before = written(marks_[mark], offset);
  const auto newlines = static_cast<int>(std::count(before.begin(), before.end(), '\n'));
  int column = 1;
  for (std::size_t i = before.rfind('\n') + 1; i < before.size(); ++i) {
    if ((static_cast<unsigned char>(before[i]) & 0xC0) != 0x80) ++column;
  }
  return {file_name_, mark * kLinesPerMark + 1 + newlines, column};
}

int SourceText::line_start(int line) const {
  if (line < 1 || line > lines_) return -1;
  const int mark = (line - 1) / kLinesPerMark;
  const int from = marks_[mark];
  const int to = mark + 1 < static_cast<int>(marks_.size()) ? marks_[mark + 1]
                                                            : static_cast<int>(text_.size());
  const std::string part = written(from, to);
  std::size_t start = 0;
  for (int k = (line - 1) % kLinesPerMark; k > 0; --k) start = part.find('\n', start) + 1;
  return from + static_cast<int>(start);
}

std::string SourceText::line_text(int line) const {
  const int begin = line_start(line);
  if (begin < 0) return {};
  const int next = line_start(line + 1);
  std::string text = written(begin, next < 0 ? static_cast<int>(text_.size()) : next);
  text.erase(std::min(text.find_first_of("\r\n"), text.size()));
  return text;
}

InputError SourceText::error(int offset, const std::string& message) const {
  const SourceLocation where = location(offset);
  return InputError(where, message, line_text(where.line));
}

void SourceText::fail(int offset, const std::string& message) const {
  throw error(offset, message);
}

namespace {

// Length of the valid UTF-8 sequence starting at `i`, or 0 if it is invalid.
int utf8_length(const std::string& s, std::size_t i) {
  const auto b0 = static_cast<unsigned char>(s[i]);
  int length = 0;
  unsigned min = 0;
  if (b0 < 0x80) return 1;
  if ((b0 & 0xE0) == 0xC0)
    length = 2, min = 0x80;
  else if ((b0 & 0xF0) == 0xE0)
    length = 3, min = 0x800;
  else if ((b0 & 0xF8) == 0xF0)
    length = 4, min = 0x10000;
  else
    return 0;
  if (i + length > s.size()) return 0;
  unsigned code = b0 & (0x7F >> length);
  for (int k = 1; k < length; ++k) {
    const auto b = static_cast<unsigned char>(s[i + k]);
    if ((b & 0xC0) != 0x80) return 0;
    code = (code << 6) | (b & 0x3F);
  }
  if (code < min || code > 0x10FFFF || (code >= 0xD800 && code <= 0xDFFF)) return 0;
  return length;
}

// ASCII that opens, closes, starts or ends nothing: bytes prepare() passes
// over outside comments and strings.
bool is_plain(char c) {
  static constexpr auto kPlain = [] {
    std::array<bool, 256> plain{};
    for (int b = 1; b < 0x80; ++b) plain[b] = true;
    for (const char special : std::string_view("\n\r#\"(){}^")) {
      plain[static_cast<unsigned char>(special)] = false;
    }
    return plain;
  }();
  return kPlain[static_cast<unsigned char>(c)];
}

}  // namespace

void SourceText::replace(int offset, int length, char by) {
  if (!replaced_.empty() &&
      replaced_.back().offset + static_cast<int>(replaced_.back().written.size()) == offset) {
    replaced_.back().written.append(text_, offset, length);
  } else {
    replaced_.push_back({offset, text_.substr(offset, length)});
  }
  std::fill_n(text_.begin() + offset, length, by);
}

void SourceText::prepare() {
  // Deep enough for any real circuit, shallow enough for the grammar's stack.
  constexpr std::size_t kMaxNesting = 100;
  const std::string& s = text_;
  marks_.push_back(0);
  struct Open {
    char bracket;
    int offset;
  };
  std::vector<Open> open;
  // Each '^' costs the grammar a level, as a bracket does: the powers of
  // one statement are bounded alike.
  std::size_t powers = 0;
  bool in_comment = false, in_string = false;
  for (std::size_t i = 0; i < s.size();) {
    // Runs of bytes that need nothing (most of a text) are passed at once.
    if (!in_comment && !in_string) {
      while (i < s.size() && is_plain(s[i])) ++i;
      if (i == s.size()) break;
    }
    const int length = utf8_length(s, i);
    const int offset = static_cast<int>(i);
    if (length == 0) fail(offset, "this byte is not valid UTF-8 text");
    const char c = s[i];
    if (c == '\0') fail(offset, "a NUL character is not allowed in a circuit description");
    if (c == '\n' && lines_++ % kLinesPerMark == 0) marks_.push_back(offset + 1);
    if (c == '\n' || c == '\r') {
      in_comment = in_string = false;
      if (open.empty()) powers = 0;
      if (!open.empty()) replace(offset, 1, '\f');  // skipped, but ends a number's unit
    }
    if (c == '#' && !in_string) in_comment = true;
    if (in_comment) replace(offset, length, ' ');
    i += length;
    if (in_comment) continue;
    if (in_string) {
      in_string = c != '"';
      continue;
    }
    if (c == '"')
      in_string = true;
    else if (c == '^' && ++powers > kMaxNesting)
      fail(offset, "more than " + std::to_string(kMaxNesting) +
                       " '^' in one statement; pow(…) or a let parameter can hold part of it");
    else if (c == '(' || c == '{') {
      if (open.size() >= kMaxNesting) {
        fail(offset, "brackets nested more than " + std::to_string(kMaxNesting) + " deep");
      }
      open.push_back({c, offset});
    } else if (c == ')' || c == '}') {
      const char wanted = c == ')' ? '(' : '{';
      if (open.empty()) fail(offset, std::string("this '") + c + "' closes nothing");
      if (open.back().bracket != wanted) {
        fail(offset, std::string("this '") + c + "' does not match the '" + open.back().bracket +
                         "' at " + std::to_string(location(open.back().offset).line) + ":" +
                         std::to_string(location(open.back().offset).column));
      }
      open.pop_back();
    }
  }
  if (!open.empty()) {
    fail(open.back().offset, std::string("this '") + open.back().bracket + "' is never closed");
  }
}

}  // namespace stage::reader
