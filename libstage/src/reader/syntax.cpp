// Small helpers over the syntax tree shared by everything that reads it.
#include "reader/syntax.hpp"

namespace stage::ast {

const Expr& unwrap(const Expr& e, bool keep_groups) {
  const Expr* current = &e;
  while (const auto* tuple = boost::get<x3::forward_ast<Tuple>>(current)) {
    if (keep_groups || tuple->get().items.size() != 1) return *current;
    current = &tuple->get().items.front();
  }
  return *current;
}

namespace {
struct OffsetOf {
  template <class T>
  int operator()(const T& node) const {
    return node.offset;
  }
  template <class T>
  int operator()(const x3::forward_ast<T>& node) const {
    return node.get().offset;
  }
};
}  // namespace

int offset_of(const Expr& e) { return boost::apply_visitor(OffsetOf{}, e); }
int offset_of(const Statement& s) { return boost::apply_visitor(OffsetOf{}, s); }

}  // namespace stage::ast
