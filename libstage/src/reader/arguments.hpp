// Matching the arguments of a call (`resistor(a, b, 1k)`, `sine(...)`,
// `analyze frequency(...)`) to the named parameters its kind takes:
// positional first, then `key = value`, with errors for unknown keys (and the
// nearest valid ones), repeats, missing required ones and too many positions.
// Also reading names out of expressions: nodes, hierarchical names, keywords.
#pragma once

#include <boost/container/small_vector.hpp>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "reader/source_text.hpp"
#include "reader/syntax.hpp"

namespace stage::elaborate {

struct Slot {
  std::string_view name;
  bool positional = false;
  bool required = false;
};

class BoundArguments {
 public:
  // `what` names the call in messages ("resistor", "analyze sweep");
  // `slots` must outlive the binding.
  BoundArguments(const ast::Call& call, std::span<const Slot> slots, std::string_view what,
                 const reader::SourceText& source);

  // The value given for a slot, or null.
  const ast::Expr* get(std::string_view name) const;
  // Offset of the argument for messages (the call's when absent).
  int offset(std::string_view name) const;

 private:
  std::span<const Slot> slots_;
  // By slot; inline, as an element has a few (no allocation per element).
  boost::container::small_vector<const ast::Argument*, 12> given_;
  int call_offset_;
};

// `out`, `x1/mid`, `q1.current` as written, or nothing if `e` is not a name.
std::optional<std::string> name_of(const ast::Expr& e);

// The name in `e`, or an error saying what kind of name was expected.
std::string require_name(const ast::Expr& e, std::string_view expected,
                         const reader::SourceText& source);

// One of `choices` written as a bare word.
std::string require_choice(const ast::Expr& e, const std::vector<std::string>& choices,
                           const reader::SourceText& source);

}  // namespace stage::elaborate
