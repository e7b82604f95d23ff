// The grammar of the `.stage` language (spec sections 1–2): text in, syntax
// tree out. It gives no meaning to names or values; that is elaboration's job.
#pragma once

#include <optional>

#include "reader/source_text.hpp"
#include "reader/syntax.hpp"

namespace stage::reader {

// The statements of one file, parsed one at a time in order, so that a large
// file is never held as a whole syntax tree. Throws InputError naming what
// was expected where parsing stopped, as parse() does.
class StatementStream {
 public:
  // `source` must outlive the stream.
  explicit StatementStream(const SourceText& source);
  // The next statement, or nothing at the end of the text.
  std::optional<ast::Statement> next();

 private:
  const SourceText& source_;
  const char* first_;
};

// The whole file at once (small texts: a --set value).
ast::File parse(const SourceText& source);

}  // namespace stage::reader
