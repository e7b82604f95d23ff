// Evaluating expressions (spec section 1): numbers with prefixes and units,
// + - * / ^, functions, `pi`, `inf` and `let` names, with the light unit
// tracking the language promises: a unit written on a value follows it
// through +, -, scaling and min/max, and must fit where the value is used.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "reader/source_text.hpp"
#include "reader/syntax.hpp"
#include "stage/units.hpp"

namespace stage::reader {

struct Value {
  double number = 0;
  std::optional<Quantity> quantity;  // empty: no unit known
};

// Names visible to an expression: a chain of `let` tables (block instance,
// then the file).
class Scope {
 public:
  explicit Scope(const Scope* parent = nullptr) : parent_(parent) {}
  void set(const std::string& name, Value value) { values_[name] = value; }
  const Value* find(const std::string& name) const;
  bool contains_here(const std::string& name) const { return values_.count(name) != 0; }
  std::vector<std::string> names() const;

 private:
  const Scope* parent_;
  std::map<std::string, Value> values_;
};

struct EvaluationRules {
  // A °C value stands for a temperature difference (a sweep step): no offset.
  bool temperature_difference = false;
};

Value evaluate(const ast::Expr& expr, const Scope& scope, const SourceText& source,
               EvaluationRules rules = {});

// Evaluates and checks the result against the quantity the position wants;
// a known unit that does not fit is an error naming both units. Non-finite
// results are errors unless `allow_infinity`.
double evaluate_as(const ast::Expr& expr, Quantity wanted, const Scope& scope,
                   const SourceText& source, bool allow_infinity = false,
                   EvaluationRules rules = {});

}  // namespace stage::reader
