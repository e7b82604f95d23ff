// The InputError constructor (NumericalError's is in mna/numerical_error.cpp).
// It builds the full message here, in one place, so every input diagnostic has the same shape:
// `file:line:column: message`, the source line, and a caret under the column.
#include "stage/errors.hpp"

#include <fstream>
#include <utility>

namespace stage {
namespace {

// The caret line keeps the tabs of the source line so the caret lines up in a
// terminal whatever the tab width; columns count characters, not bytes.
std::string caret_line(const std::string& line_text, int column) {
  std::string caret;
  int seen = 1;
  for (std::size_t i = 0; i < line_text.size() && seen < column; ++i) {
    const auto byte = static_cast<unsigned char>(line_text[i]);
    if ((byte & 0xC0) == 0x80) continue;  // UTF-8 continuation byte
    caret += line_text[i] == '\t' ? '\t' : ' ';
    ++seen;
  }
  for (; seen < column; ++seen) caret += ' ';
  return caret + '^';
}

// The line itself, read from the file, for errors raised after reading (an
// analysis statement checked against the circuit); empty when unreadable.
std::string line_from_file(const SourceLocation& where) {
  std::ifstream file(where.file);
  std::string line;
  for (int n = 0; n < where.line && std::getline(file, line); ++n) {
  }
  return file ? line : std::string();
}

std::string format(const SourceLocation& where, const std::string& message, std::string line_text) {
  if (line_text.empty() && where.line > 0) line_text = line_from_file(where);
  std::string text = where.file;
  if (where.line > 0) {
    text += ':' + std::to_string(where.line) + ':' + std::to_string(where.column);
  }
  text += ": " + message;
  if (where.line > 0) {
    text += '\n' + line_text + '\n' + caret_line(line_text, where.column);
  }
  return text;
}

}  // namespace

InputError::InputError(SourceLocation where, std::string message, std::string line_text)
    : std::runtime_error(format(where, message, line_text)),
      where_(std::move(where)),
      message_(std::move(message)) {}

}  // namespace stage
