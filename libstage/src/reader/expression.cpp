// Expression evaluation over the syntax tree. Errors point at the operator,
// name or number at fault. Recursion is bounded because the grammar only
// nests through brackets, whose depth SourceText limits.
#include "reader/expression.hpp"

#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <limits>
#include <numbers>

#include "reader/suggest.hpp"
#include "reader/unit_table.hpp"

namespace stage::reader {

const Value* Scope::find(const std::string& name) const {
  for (const Scope* s = this; s; s = s->parent_) {
    if (const auto it = s->values_.find(name); it != s->values_.end()) return &it->second;
  }
  return nullptr;
}

std::vector<std::string> Scope::names() const {
  std::vector<std::string> all;
  for (const Scope* s = this; s; s = s->parent_) {
    for (const auto& [name, value] : s->values_) all.push_back(name);
  }
  return all;
}

namespace {

namespace x3 = boost::spirit::x3;

std::string unit_text(Quantity q) { return std::string(unit_name(q)); }

class Evaluator {
 public:
  Evaluator(const Scope& scope, const SourceText& source, EvaluationRules rules)
      : scope_(scope), source_(source), rules_(rules) {}

  Value operator()(const ast::Number& n) const { return number(n, 1); }

  Value operator()(const ast::Name& name) const {
    if (name.text == "pi") return {std::numbers::pi, std::nullopt};
    if (name.text == "inf") return {INFINITY, std::nullopt};
    if (name.text.find('.') != std::string::npos) {
      source_.fail(name.offset, "'" + name.text + "' is not a value that can be computed with");
    }
    if (const Value* v = scope_.find(name.text)) return *v;
    source_.fail(name.offset,
                 "unknown name '" + name.text + "'" + suggestion(name.text, scope_.names()));
  }

  Value operator()(const x3::forward_ast<ast::Unary>& node) const {
    const ast::Unary& unary = node.get();
    double sign = 1;
    for (char c : unary.signs) sign = c == '-' ? -sign : sign;
    // The sign of a number belongs to it: -40 °C is 233.15 K, not -313.15 K.
    if (const auto* n = boost::get<ast::Number>(&ast::unwrap(unary.operand))) {
      return number(*n, sign);
    }
    Value v = boost::apply_visitor(*this, unary.operand);
    v.number *= sign;
    return v;
  }

  Value operator()(const x3::forward_ast<ast::Chain>& node) const {
    const ast::Chain& chain = node.get();
    if (!chain.rest.empty() && chain.rest.front().op == '^') return power(chain);
    Value left = boost::apply_visitor(*this, chain.first);
    for (const ast::Operation& operation : chain.rest) {
      const Value right = boost::apply_visitor(*this, operation.operand);
      left = binary(operation, left, right);
    }
    return left;
  }

  Value operator()(const x3::forward_ast<ast::Tuple>& node) const {
    const ast::Tuple& tuple = node.get();
    if (tuple.items.size() != 1) {
      source_.fail(tuple.offset, "a list of values is not allowed here; expected one value");
    }
    return boost::apply_visitor(*this, tuple.items.front());
  }

  Value operator()(const x3::forward_ast<ast::Call>& node) const { return function(node.get()); }

 private:
  Value number(const ast::Number& n, double sign) const {
    const char* begin = n.text.c_str();
    char* end = nullptr;
    errno = 0;
    double value = std::strtod(begin, &end);
    if (errno == ERANGE && std::isinf(value)) {
      source_.fail(n.offset, "the number " + n.text + " is too large");
    }
    // strtod signals underflow with ERANGE and a value at or below the
    // smallest normal double: a written nonzero number read as (nearly) zero.
    if (errno == ERANGE && std::abs(value) <= std::numeric_limits<double>::min()) {
      source_.fail(n.offset, "the number " + n.text.substr(0, end - begin) +
                                 " underflows: it is smaller than a double can hold (about "
                                 "2e-308); write 0 if zero is meant");
    }
    std::size_t at = static_cast<std::size_t>(end - begin);
    const std::size_t number_end = at;
    while (at < n.text.size() && (n.text[at] == ' ' || n.text[at] == '\t')) ++at;
    std::size_t word_end = n.text.size();
    while (word_end > at && (n.text[word_end - 1] == ' ' || n.text[word_end - 1] == '\t')) {
      --word_end;
    }
    value *= sign;
    if (at == word_end) return {value, std::nullopt};
    const std::string word = n.text.substr(at, word_end - at);
    UnitReading unit = read_unit(word, at == number_end);
    if (!unit.error.empty()) source_.fail(n.offset + static_cast<int>(at), unit.error);
    if (rules_.temperature_difference) unit.offset = 0;
    value = value * unit.scale + unit.offset;
    if (std::isinf(value)) source_.fail(n.offset, "the number " + n.text + " is too large");
    return {value, unit.quantity};
  }

  [[noreturn]] void mismatch(int offset, Quantity a, Quantity b, char op) const {
    source_.fail(offset, std::string("cannot ") + (op == '+' ? "add" : "subtract") + " " +
                             unit_text(b) + " to a value in " + unit_text(a));
  }

  Value binary(const ast::Operation& operation, const Value& left, const Value& right) const {
    const auto either = left.quantity ? left.quantity : right.quantity;
    switch (operation.op) {
      case '+':
      case '-':
        if (left.quantity && right.quantity && !units_fit(*right.quantity, *left.quantity)) {
          mismatch(operation.offset, *left.quantity, *right.quantity, operation.op);
        }
        return {operation.op == '+' ? left.number + right.number : left.number - right.number,
                either};
      case '*':
        // A product of two values with units has a unit this language does
        // not name; scaling by a plain number keeps the unit.
        return {left.number * right.number,
                left.quantity && right.quantity ? std::nullopt : either};
      default:  // '/'
        if (right.number == 0) source_.fail(operation.offset, "division by zero");
        return {left.number / right.number, right.quantity ? std::nullopt : left.quantity};
    }
  }

  // a ^ b ^ c groups to the right.
  Value power(const ast::Chain& chain) const {
    std::vector<Value> operands{boost::apply_visitor(*this, chain.first)};
    for (const ast::Operation& operation : chain.rest) {
      operands.push_back(boost::apply_visitor(*this, operation.operand));
    }
    double result = operands.back().number;
    for (std::size_t i = operands.size() - 1; i-- > 0;) {
      result = std::pow(operands[i].number, result);
      if (std::isnan(result)) {
        source_.fail(chain.rest[i].offset, "this power has no real value");
      }
    }
    return {result, std::nullopt};
  }

  Value function(const ast::Call& call) const {
    static const std::vector<std::string> kNames{"sqrt", "exp",  "ln",  "log10", "sin", "cos",
                                                 "tan",  "atan", "abs", "min",   "max", "pow"};
    std::vector<Value> args;
    for (const ast::Argument& a : call.arguments) {
      if (a.key) source_.fail(a.offset, "function arguments are positional (no name =)");
      args.push_back(boost::apply_visitor(*this, a.value));
    }
    const auto count = [&](std::size_t n) {
      if (args.size() != n) {
        source_.fail(call.offset, call.name + " takes " + std::to_string(n) + " argument" +
                                      (n == 1 ? "" : "s") + ", not " + std::to_string(args.size()));
      }
    };
    const auto domain = [&](bool ok) {
      if (!ok) source_.fail(call.offset, call.name + " is not defined for this argument");
    };
    const std::string& f = call.name;
    if (f == "min" || f == "max") {
      if (args.empty()) source_.fail(call.offset, f + " needs at least one argument");
      Value best = args.front();
      for (const Value& v : args) {
        if (v.quantity && best.quantity && !units_fit(*v.quantity, *best.quantity)) {
          source_.fail(call.offset, f + " of values in " + unit_text(*best.quantity) + " and " +
                                        unit_text(*v.quantity));
        }
        if (f == "min" ? v.number < best.number : v.number > best.number) best.number = v.number;
        if (!best.quantity) best.quantity = v.quantity;
      }
      return best;
    }
    if (f == "pow") {
      count(2);
      const double r = std::pow(args[0].number, args[1].number);
      domain(!std::isnan(r));
      return {r, std::nullopt};
    }
    if (f == "abs") {
      count(1);
      return {std::fabs(args[0].number), args[0].quantity};
    }
    const auto one = [&](double (*fn)(double), bool ok) -> Value {
      count(1);
      domain(ok);
      return {fn(args[0].number), std::nullopt};
    };
    const double x = args.empty() ? 0 : args.front().number;
    if (f == "sqrt") return one(std::sqrt, x >= 0);
    if (f == "exp") return one(std::exp, true);
    if (f == "ln") return one(std::log, x > 0);
    if (f == "log10") return one(std::log10, x > 0);
    if (f == "sin") return one(std::sin, true);
    if (f == "cos") return one(std::cos, true);
    if (f == "tan") return one(std::tan, true);
    if (f == "atan") return one(std::atan, true);
    source_.fail(call.offset, "unknown function '" + f + "'" + suggestion(f, kNames));
  }

  const Scope& scope_;
  const SourceText& source_;
  EvaluationRules rules_;
};

}  // namespace

Value evaluate(const ast::Expr& expr, const Scope& scope, const SourceText& source,
               EvaluationRules rules) {
  return boost::apply_visitor(Evaluator(scope, source, rules), expr);
}

double evaluate_as(const ast::Expr& expr, Quantity wanted, const Scope& scope,
                   const SourceText& source, bool allow_infinity, EvaluationRules rules) {
  const Value v = evaluate(expr, scope, source, rules);
  const int at = ast::offset_of(expr);
  if (v.quantity && !units_fit(*v.quantity, wanted)) {
    source.fail(at, "expected a value in " + unit_text(wanted) + ", but this value is in " +
                        unit_text(*v.quantity));
  }
  if (std::isnan(v.number)) source.fail(at, "this value is not a number");
  if (std::isinf(v.number) && !allow_infinity) source.fail(at, "this value must be finite");
  return v.number;
}

}  // namespace stage::reader
