// Argument binding and name reading shared by elements, waveforms, models,
// blocks, solver settings and analyses.
#include "reader/arguments.hpp"

#include "reader/suggest.hpp"

namespace stage::elaborate {

namespace x3 = boost::spirit::x3;

BoundArguments::BoundArguments(const ast::Call& call, std::span<const Slot> slots,
                               std::string_view what, const reader::SourceText& source)
    : slots_(slots), given_(slots.size(), nullptr), call_offset_(call.offset) {
  std::size_t position = 0;
  bool seen_key = false;
  for (const ast::Argument& argument : call.arguments) {
    std::size_t index = slots.size();
    if (!argument.key) {
      if (seen_key) {
        source.fail(argument.offset, "positional arguments must come before name = value ones");
      }
      while (position < slots.size() && !slots[position].positional) ++position;
      if (position == slots.size()) {
        std::string names;
        for (const Slot& s : slots) {
          if (s.positional) names += (names.empty() ? "" : ", ") + std::string(s.name);
        }
        source.fail(argument.offset, std::string(what) + " takes no more positional arguments" +
                                         (names.empty() ? "" : " (they are: " + names + ")") +
                                         "; write name = value");
      }
      index = position++;
    } else {
      seen_key = true;
      for (std::size_t i = 0; i < slots.size(); ++i) {
        if (slots[i].name == *argument.key) index = i;
      }
      if (index == slots.size()) {
        std::vector<std::string> names;
        for (const Slot& s : slots) names.emplace_back(s.name);
        source.fail(argument.offset, std::string(what) + " has no argument '" + *argument.key +
                                         "'" + reader::suggestion(*argument.key, names));
      }
    }
    if (given_[index]) {
      source.fail(argument.offset, "'" + std::string(slots[index].name) + "' is given twice");
    }
    given_[index] = &argument;
  }
  for (std::size_t i = 0; i < slots.size(); ++i) {
    if (slots[i].required && !given_[i]) {
      source.fail(call.offset,
                  std::string(what) + " needs a value for '" + std::string(slots[i].name) + "'");
    }
  }
}

const ast::Expr* BoundArguments::get(std::string_view name) const {
  for (std::size_t i = 0; i < slots_.size(); ++i) {
    if (slots_[i].name == name && given_[i]) return &given_[i]->value;
  }
  return nullptr;
}

int BoundArguments::offset(std::string_view name) const {
  for (std::size_t i = 0; i < slots_.size(); ++i) {
    if (slots_[i].name == name && given_[i]) return given_[i]->offset;
  }
  return call_offset_;
}

std::optional<std::string> name_of(const ast::Expr& e) {
  const ast::Expr& inner = ast::unwrap(e);
  if (const auto* name = boost::get<ast::Name>(&inner)) return name->text;
  // `x1/mid` parses as a division of names.
  if (const auto* chain = boost::get<x3::forward_ast<ast::Chain>>(&inner)) {
    std::optional<std::string> text = name_of(chain->get().first);
    for (const ast::Operation& operation : chain->get().rest) {
      const std::optional<std::string> part = name_of(operation.operand);
      if (!text || !part || operation.op != '/') return std::nullopt;
      *text += "/" + *part;
    }
    return text;
  }
  return std::nullopt;
}

std::string require_name(const ast::Expr& e, std::string_view expected,
                         const reader::SourceText& source) {
  std::optional<std::string> name = name_of(e);
  if (!name) source.fail(ast::offset_of(e), "expected " + std::string(expected));
  return *name;
}

std::string require_choice(const ast::Expr& e, const std::vector<std::string>& choices,
                           const reader::SourceText& source) {
  const std::optional<std::string> name = name_of(e);
  std::string list;
  for (const std::string& c : choices) list += (list.empty() ? "" : " or ") + c;
  if (!name) source.fail(ast::offset_of(e), "expected " + list);
  for (const std::string& c : choices) {
    if (*name == c) return c;
  }
  source.fail(ast::offset_of(e),
              "expected " + list + ", not '" + *name + "'" + reader::suggestion(*name, choices));
}

}  // namespace stage::elaborate
