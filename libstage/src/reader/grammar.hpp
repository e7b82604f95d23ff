// The grammar of the `.stage` language (spec sections 1–2): text in, syntax
// tree out. It gives no meaning to names or values; that is elaboration's job.
#pragma once

#include "reader/source_text.hpp"
#include "reader/syntax.hpp"

namespace stage::reader {

// Throws InputError naming what was expected where parsing stopped.
ast::File parse(const SourceText& source);

}  // namespace stage::reader
