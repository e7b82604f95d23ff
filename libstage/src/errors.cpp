// The constructors of stage::Error and its two subclasses. The full text is
// built here, in one place, so every diagnostic has the same shape:
// `file:line:column: message`, the source line, and a caret under the column.
#include "stage/errors.hpp"

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

// The source line and caret are shown when the caller had the line; an
// error with no text at hand (a C++ caller's) still names the place.
std::string located(const SourceLocation& where, const std::string& message,
                    const std::string& line_text) {
  std::string text = where.file;
  if (where.line > 0) {
    text += ':' + std::to_string(where.line) + ':' + std::to_string(where.column);
  }
  text += ": " + message;
  if (where.line > 0 && !line_text.empty()) {
    text += '\n' + line_text + '\n' + caret_line(line_text, where.column);
  }
  return text;
}

}  // namespace

Error::Error(ErrorKind kind, std::string message, std::vector<std::string> involved)
    : std::runtime_error(message),
      kind_(kind),
      message_(std::move(message)),
      involved_(std::move(involved)) {}

Error::Error(ErrorKind kind, SourceLocation where, std::string message, std::string line_text)
    : std::runtime_error(located(where, message, line_text)),
      kind_(kind),
      message_(std::move(message)),
      where_(std::move(where)) {}

InputError::InputError(SourceLocation where, std::string message, std::string line_text)
    : Error(ErrorKind::input, std::move(where), std::move(message), std::move(line_text)) {}

NumericalError::NumericalError(ErrorKind kind, std::string message,
                               std::vector<std::string> involved)
    : Error(kind, std::move(message), std::move(involved)) {}

}  // namespace stage
