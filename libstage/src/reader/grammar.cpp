// The whole Boost.Spirit X3 grammar of the language, kept in this one
// translation unit because X3 is slow to compile. Statements end at a newline.
// The grammar reads the text as SourceText prepares it, where comments
// are blanks and the newlines inside ( ) and { } are form feeds, so one
// skipper (blanks and form feeds) serves everywhere; switching skippers inside
// recursive rules would make X3 nest contexts without end. A number's unit
// must follow it on the same line (only blanks between), so in a model body
// `beta_forward = 200` then `beta_reverse = 4` on the next line stay apart. Every rule whose
// attribute is a located node records its start offset.
#include "reader/grammar.hpp"

#include <boost/fusion/include/adapt_struct.hpp>
#include <boost/fusion/include/at_c.hpp>
#include <boost/spirit/home/x3.hpp>
#include <cctype>
#include <string>

BOOST_FUSION_ADAPT_STRUCT(stage::ast::Argument, key, value)
BOOST_FUSION_ADAPT_STRUCT(stage::ast::Call, name, arguments)
BOOST_FUSION_ADAPT_STRUCT(stage::ast::Operation, op, operand)
BOOST_FUSION_ADAPT_STRUCT(stage::ast::Let, name, value)
BOOST_FUSION_ADAPT_STRUCT(stage::ast::Instance, name, call)
BOOST_FUSION_ADAPT_STRUCT(stage::ast::Model, name, base, parameters)
BOOST_FUSION_ADAPT_STRUCT(stage::ast::Block, name, ports, parameters, body)

namespace stage::reader {
namespace grammar {

namespace x3 = boost::spirit::x3;
using x3::eoi;
using x3::eol;
using x3::lexeme;
using x3::lit;
using x3::raw;
using x3::ascii::alnum;
using x3::ascii::alpha;
using x3::ascii::blank;
using x3::ascii::char_;
using x3::ascii::digit;
using Iterator = const char*;

struct begin_tag;

// Records where each located node starts (after skipped blanks).
struct annotate {
  template <class T, class Context>
  void on_success(Iterator first, Iterator, T& node, const Context& context) const {
    if constexpr (std::is_base_of_v<ast::Located, T>) {
      node.offset = static_cast<int>(first - x3::get<begin_tag>(context));
    }
  }
};

// Offset of the first non-blank at or after `it`. Rules with semantic
// actions do not get on_success with their own node, so they record it here.
template <class Context>
int offset_at(Iterator it, const Context& context) {
  while (*it == ' ' || *it == '\t' || *it == '\f') ++it;
  return static_cast<int>(it - x3::get<begin_tag>(context));
}

// Moves a rule's parsed attribute into one member of its node (for nodes
// with a single field, which X3 does not adapt reliably).
template <class Node, class Member>
auto into(Member Node::*member) {
  return [member](auto& context) { x3::_val(context).*member = std::move(x3::_attr(context)); };
}

// Records where the node of a rule with semantic actions starts.
const auto mark = x3::eps[([](auto& context) {
  x3::_val(context).offset = offset_at(x3::_where(context).begin(), context);
})];

// The matched text of a raw[] directive into a node's `text`.
const auto matched_text = [](auto& context) {
  x3::_val(context).text.assign(x3::_attr(context).begin(), x3::_attr(context).end());
  x3::_val(context).offset = offset_at(x3::_attr(context).begin(), context);
};

// An expression level is its first operand alone when no operator follows
// (no wrapper nodes for the plain values that most arguments are), else a
// Chain of that operand and the operations after it.
const auto operand = [](auto& context) { x3::_val(context) = std::move(x3::_attr(context)); };
const auto chained = [](auto& context) {
  ast::Chain chain;
  chain.offset = ast::offset_of(x3::_val(context));
  chain.first = std::move(x3::_val(context));
  chain.rest = std::move(x3::_attr(context));
  x3::_val(context) = x3::forward_ast<ast::Chain>(std::move(chain));
};
// Leading signs and what they apply to.
const auto signed_operand = [](auto& context) {
  ast::Unary unary;
  unary.offset = offset_at(x3::_where(context).begin(), context);
  unary.signs = std::move(boost::fusion::at_c<0>(x3::_attr(context)));
  unary.operand = std::move(boost::fusion::at_c<1>(x3::_attr(context)));
  x3::_val(context) = x3::forward_ast<ast::Unary>(std::move(unary));
};

auto keyword(const char* word) { return lexeme[lit(word) >> !(alnum | '_')]; }

// Letters and the non-ASCII symbols that units use: µ μ Ω Ω °.
const auto unit_word = +(alpha | char_('%') | lit("\xC2\xB5") | lit("\xCE\xBC") | lit("\xCE\xA9") |
                         lit("\xE2\x84\xA6") | lit("\xC2\xB0"));
const auto digits_and_point = (+digit >> -('.' >> *digit)) | ('.' >> +digit);
const auto exponent = char_("eE") >> -char_("+-") >> +digit;
const auto name_chars = (alpha | '_') >> *(alnum | '_');

x3::rule<class identifier_r, std::string> const identifier = "a name";
x3::rule<struct number_r, ast::Number> const number = "a number";
x3::rule<struct name_r, ast::Name> const name = "a name";
x3::rule<struct expression_r, ast::Expr> const expression = "an expression";
x3::rule<struct plain_value_r, ast::Expr> const plain_value = "a value";
x3::rule<struct additive_r, ast::Expr> const additive = "an expression";
x3::rule<struct add_operation_r, ast::Operation> const add_operation = "'+' or '-'";
x3::rule<struct multiplicative_r, ast::Expr> const multiplicative = "an expression";
x3::rule<struct mul_operation_r, ast::Operation> const mul_operation = "'*' or '/'";
x3::rule<struct unary_r, ast::Expr> const unary = "an expression";
x3::rule<struct power_r, ast::Expr> const power = "an expression";
x3::rule<struct power_operation_r, ast::Operation> const power_operation = "'^'";
x3::rule<struct primary_r, ast::Expr> const primary = "a value";
x3::rule<struct tuple_r, ast::Tuple> const tuple = "a parenthesised list";
x3::rule<struct call_r, ast::Call> const call = "kind(arguments)";
x3::rule<struct arguments_r, std::vector<ast::Argument>> const arguments = "'(' arguments ')'";
x3::rule<struct argument_r, ast::Argument> const argument = "an argument";
x3::rule<struct keyed_argument_r, ast::Argument> const keyed_argument = "name = value";
x3::rule<struct positional_argument_r, ast::Argument> const positional_argument = "a value";
x3::rule<class quoted_r, std::string> const quoted = "a string in double quotes";

x3::rule<struct title_r, ast::Title> const title = "title";
x3::rule<struct let_r, ast::Let> const let = "let";
x3::rule<struct include_r, ast::Include> const include = "include";
x3::rule<struct temperature_r, ast::Temperature> const temperature = "temperature";
x3::rule<struct solver_r, ast::Solver> const solver = "solver";
x3::rule<struct instance_r, ast::Instance> const instance = "an element";
x3::rule<struct model_r, ast::Model> const model = "model";
x3::rule<struct model_body_r, std::vector<ast::Argument>> const model_body =
    "'{' parameter = value … '}'";
x3::rule<struct analyze_r, ast::Analyze> const analyze = "analyze";
x3::rule<struct block_r, ast::Block> const block = "block";
x3::rule<struct ports_r, std::vector<ast::Name>> const ports = "port names";
x3::rule<struct defaults_r, std::vector<ast::Argument>> const defaults =
    "'; parameter = default, …'";
x3::rule<struct statement_r, ast::Statement> const statement = "a statement";
x3::rule<struct statement_line_r, ast::Statement> const statement_line = "a statement";
x3::rule<struct block_body_r, std::vector<ast::Statement>> const block_body = "block body";
x3::rule<class line_end_r> const line_end = "the end of the statement";
x3::rule<class statement_end_r> const statement_end = "the end of the statement";
x3::rule<class block_end_r> const block_end = "a statement, or 'end' to close the block";
// What was expected where no statement could be read.
constexpr const char* kAnyStatement =
    "a statement (title, let, include, temperature, solver, model, block, analyze, "
    "or name = kind(…))";

const auto identifier_def = lexeme[(alpha | char_('_')) >> *(alnum | char_('_'))];
const auto number_def =
    raw[lexeme[digits_and_point >> -exponent >> *blank >> -unit_word]][matched_text];
const auto name_def = raw[lexeme[name_chars >> -('.' >> name_chars)]][matched_text];

// Most values are a plain number or name: read at once, without descending
// through the operator levels (that build and move a node at each), when what
// follows shows the value is whole. Otherwise the levels read it afresh.
const auto value_end = lit(',') | ')' | '}' | eol | eoi;
const auto plain_value_def = (number | name) >> &value_end;
const auto expression_def = plain_value | additive;
const auto additive_def = multiplicative[operand] >> -(+add_operation)[chained];
const auto add_operation_def = char_("+-") >> multiplicative;
const auto multiplicative_def = unary[operand] >> -(+mul_operation)[chained];
const auto mul_operation_def = char_("*/") >> unary;
const auto unary_def = (+char_("+-") >> power)[signed_operand] | power[operand];
const auto power_def = primary[operand] >> -(+power_operation)[chained];
const auto power_operation_def = char_('^') >> unary;
const auto primary_def = number | call | name | tuple;
const auto tuple_def = mark >>
                       (lit('(') >> (expression % ',') > lit(')'))[into(&ast::Tuple::items)];
const auto call_def = identifier >> arguments;
const auto arguments_def = lit('(') >> -(argument % ',') >> -lit(',') > lit(')');
// X3 keeps what a failed alternative wrote into a shared attribute, so the
// positional form clears the key a failed `name =` may have left.
const auto argument_def = keyed_argument | positional_argument;
const auto keyed_argument_def = identifier >> '=' >> expression;
const auto positional_argument_def = x3::attr(std::optional<std::string>()) >> expression;
// Any UTF-8 text up to the closing quote (x3::ascii::char_ would stop at bytes
// above 0x7F).
const auto quoted_def = lexeme['"' > *(x3::standard::char_ - '"' - eol) > '"'];

const auto title_def = mark >> (keyword("title") > quoted)[into(&ast::Title::text)];
const auto let_def = keyword("let") > identifier > '=' > expression;
const auto include_def = mark >> (keyword("include") > quoted)[into(&ast::Include::path)];
const auto temperature_def = mark >>
                             (keyword("temperature") > expression)[into(&ast::Temperature::value)];
const auto solver_def = mark >> (keyword("solver") > arguments)[into(&ast::Solver::arguments)];
const auto instance_def = identifier >> '=' > call;
const auto model_def = keyword("model") > identifier > '=' > identifier > model_body;
const auto model_body_def = lit('{') > -(argument % -lit(',')) >> -lit(',') > lit('}');
const auto analyze_def = mark >> (keyword("analyze") > call)[into(&ast::Analyze::call)];
const auto block_def = keyword("block") > identifier > '(' > ports > -defaults > ')' > line_end >
                       block_body > block_end;
const auto ports_def = -(name % ',');
const auto defaults_def = lit(';') >> -(argument % ',');
const auto block_body_def = *eol >> *(!keyword("end") >> statement_line);
const auto block_end_def = keyword("end");
const auto statement_def =
    title | let | include | temperature | solver | model | block | analyze | instance;
const auto statement_line_def = statement > statement_end;
const auto statement_end_def = line_end >> *eol;
const auto line_end_def = eol | eoi;

BOOST_SPIRIT_DEFINE(identifier, number, name, expression, plain_value, additive, add_operation,
                    multiplicative, mul_operation, unary, power, power_operation, primary, tuple,
                    call, arguments, argument, keyed_argument, positional_argument, quoted, title,
                    let, include, temperature, solver, instance, model, model_body, analyze, block,
                    ports, defaults, statement, statement_line, statement_end, block_body, line_end,
                    block_end)

#define STAGE_ANNOTATE(r) \
  struct r : annotate {};
STAGE_ANNOTATE(number_r)
STAGE_ANNOTATE(name_r)
STAGE_ANNOTATE(expression_r)
STAGE_ANNOTATE(plain_value_r)
STAGE_ANNOTATE(additive_r)
STAGE_ANNOTATE(add_operation_r)
STAGE_ANNOTATE(multiplicative_r)
STAGE_ANNOTATE(mul_operation_r)
STAGE_ANNOTATE(unary_r)
STAGE_ANNOTATE(power_r)
STAGE_ANNOTATE(power_operation_r)
STAGE_ANNOTATE(primary_r)
STAGE_ANNOTATE(tuple_r)
STAGE_ANNOTATE(call_r)
STAGE_ANNOTATE(arguments_r)
STAGE_ANNOTATE(argument_r)
STAGE_ANNOTATE(keyed_argument_r)
STAGE_ANNOTATE(positional_argument_r)
STAGE_ANNOTATE(title_r)
STAGE_ANNOTATE(let_r)
STAGE_ANNOTATE(include_r)
STAGE_ANNOTATE(temperature_r)
STAGE_ANNOTATE(solver_r)
STAGE_ANNOTATE(instance_r)
STAGE_ANNOTATE(model_r)
STAGE_ANNOTATE(model_body_r)
STAGE_ANNOTATE(analyze_r)
STAGE_ANNOTATE(block_r)
STAGE_ANNOTATE(ports_r)
STAGE_ANNOTATE(defaults_r)
STAGE_ANNOTATE(statement_r)
STAGE_ANNOTATE(statement_line_r)
STAGE_ANNOTATE(block_body_r)
#undef STAGE_ANNOTATE

}  // namespace grammar

namespace {

// What a parse failure at `offset` most likely means, beyond the rule that
// was expected: a prefix written in place of the decimal point (4k7), or a
// block left open. "" when nothing more can be said.
std::string parse_hint(const std::string& text, int offset, const std::string& expected) {
  const auto at = static_cast<std::size_t>(offset);
  const auto digit = [&](std::size_t i) {
    return i < text.size() && std::isdigit(static_cast<unsigned char>(text[i]));
  };
  std::size_t letters = at;
  while (letters > 0 && std::isalpha(static_cast<unsigned char>(text[letters - 1]))) --letters;
  if (digit(at) && letters < at && letters > 0 && digit(letters - 1)) {
    std::size_t whole = letters;
    while (whole > 0 && digit(whole - 1)) --whole;
    std::size_t fraction = at;
    while (digit(fraction)) ++fraction;
    return "; for " + text.substr(whole, fraction - whole) + " write " +
           text.substr(whole, letters - whole) + "." + text.substr(at, fraction - at) +
           text.substr(letters, at - letters) + " (a prefix does not stand for the decimal point)";
  }
  // Blocks do not nest: the last `block` line before the failure is the one
  // left open when the text ran out without its `end`.
  if (expected.find("'end'") == std::string::npos) return "";
  std::size_t open = std::string::npos;
  int open_line = 0, line = 1;
  for (std::size_t start = 0; start < at; start = text.find('\n', start) + 1, ++line) {
    const std::size_t first = text.find_first_not_of(" \t", start);
    if (first != std::string::npos && text.compare(first, 6, "block ") == 0) {
      open = first + 6;
      open_line = line;
    }
    if (text.find('\n', start) == std::string::npos) break;
  }
  if (open == std::string::npos) return "";
  const std::size_t name_end = text.find_first_of("( \t\n", open);
  return "; block '" + text.substr(open, name_end - open) + "' opened at line " +
         std::to_string(open_line) + " has no 'end'";
}

}  // namespace

StatementStream::StatementStream(const SourceText& source)
    : source_(source), first_(source.text().data()) {}

std::optional<ast::Statement> StatementStream::next() {
  namespace x3 = boost::spirit::x3;
  const std::string& text = source_.text();
  const char* const begin = text.data();
  const char* const last = begin + text.size();
  const auto skipper = x3::ascii::blank | x3::lit('\f');
  const auto fail_at = [&](const char* at, const std::string& expected) {
    // Point at what was found, not at the blanks before it.
    while (at < last && (*at == ' ' || *at == '\t' || *at == '\f')) ++at;
    const int offset = static_cast<int>(at - begin);
    source_.fail(offset, "expected " + expected + parse_hint(text, offset, expected));
  };
  // The blank lines before the first statement (statement_line eats those
  // after each one), then the end of the text or one statement.
  x3::phrase_parse(first_, last, *x3::eol, skipper);
  if (const char* end = first_; x3::phrase_parse(end, last, x3::eoi, skipper)) {
    first_ = end;
    return std::nullopt;
  }
  ast::Statement statement;
  try {
    if (!x3::parse(first_, last,
                   x3::with<grammar::begin_tag>(begin)[x3::skip(skipper)[grammar::statement_line]],
                   statement)) {
      fail_at(first_, grammar::kAnyStatement);
    }
  } catch (const x3::expectation_failure<const char*>& failure) {
    fail_at(failure.where(), failure.which());
  }
  return statement;
}

ast::File parse(const SourceText& source) {
  ast::File result;
  StatementStream stream(source);
  while (std::optional<ast::Statement> statement = stream.next()) {
    result.statements.push_back(std::move(*statement));
  }
  return result;
}

}  // namespace stage::reader
