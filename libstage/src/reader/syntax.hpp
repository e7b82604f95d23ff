// The syntax tree of a `.stage` file, as the grammar builds it and before any
// meaning is given to it: expressions, argument lists and statements. Every
// node records the byte offset where it starts in its file, which
// SourceText turns into a line and column for messages.
#pragma once

#include <boost/spirit/home/x3/support/ast/variant.hpp>
#include <optional>
#include <string>
#include <vector>

namespace stage::ast {

namespace x3 = boost::spirit::x3;

struct Located {
  int offset = 0;
};

// A number with what follows it on the line, e.g. "4.7k", "10 nF", "27 °C";
// the unit is read when the value is evaluated.
struct Number : Located {
  std::string text;
};

// A plain name, or `element.current`.
struct Name : Located {
  std::string text;
};

struct Call;
struct Unary;
struct Chain;
struct Tuple;

struct Expr : x3::variant<Number, Name, x3::forward_ast<Call>, x3::forward_ast<Unary>,
                          x3::forward_ast<Chain>, x3::forward_ast<Tuple>> {
  using base_type::base_type;
  using base_type::operator=;
};

// `key = value` or a positional `value`.
struct Argument : Located {
  std::optional<std::string> key;
  Expr value;
};

// `name(arguments)`: an element, a waveform, a function, an analysis.
struct Call : Located {
  std::string name;
  std::vector<Argument> arguments;
};

// Leading signs, kept as written so `-40 °C` can be read as one temperature.
struct Unary : Located {
  std::string signs;
  Expr operand;
};

struct Operation : Located {
  char op = '+';
  Expr operand;
};

// `first op operand op operand …` at one precedence level.
struct Chain : Located {
  Expr first;
  std::vector<Operation> rest;
};

// `( item, item, … )`; with one item it is a parenthesised expression.
struct Tuple : Located {
  std::vector<Expr> items;
};

struct Title : Located {
  std::string text;
};
struct Let : Located {
  std::string name;
  Expr value;
};
struct Include : Located {
  std::string path;
};
struct Temperature : Located {
  Expr value;
};
struct Solver : Located {
  std::vector<Argument> arguments;
};
struct Instance : Located {
  std::string name;
  Call call;
};
struct Model : Located {
  std::string name;
  std::string base;  // a model kind (npn, pnp, diode) or another model's name
  std::vector<Argument> parameters;
};
struct Analyze : Located {
  Call call;
};
struct Block;

struct Statement : x3::variant<Title, Let, Include, Temperature, Solver, Instance, Model, Analyze,
                               x3::forward_ast<Block>> {
  using base_type::base_type;
  using base_type::operator=;
};

struct Block : Located {
  std::string name;
  std::vector<Name> ports;
  std::vector<Argument> parameters;  // defaults
  std::vector<Statement> body;
};

struct File {
  std::vector<Statement> statements;
};

// The expression inside a one-item tuple (brackets around one value), unless
// `keep_groups`. The grammar builds no chain without an operator and no
// unary without a sign: a plain value is the node itself.
const Expr& unwrap(const Expr& e, bool keep_groups = false);
int offset_of(const Expr& e);
int offset_of(const Statement& s);

}  // namespace stage::ast
