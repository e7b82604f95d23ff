// `model` statements (spec section 4): a fresh model of a kind, or a copy of
// an earlier model with some parameters overridden. Parameter names, choices
// and what a choice refuses come from the model kind's descriptor
// (circuit/kinds/models.hpp), so this file names no kind.
#include <algorithm>

#include "common/si_format.hpp"
#include "reader/elaborator.hpp"
#include "reader/suggest.hpp"

namespace stage::elaborate {

namespace {

template <class Model>
const ModelParameter<Model>* find_parameter(std::span<const ModelParameter<Model>> table,
                                            std::string_view name) {
  for (const auto& row : table) {
    if (row.name == name) return &row;
  }
  return nullptr;
}

// A fresh model of the kind the language calls `keyword`, if it is one.
std::optional<AnyModel> fresh_model(std::string_view keyword) {
  std::optional<AnyModel> fresh;
  kinds::for_each_model_kind([&](const auto& kind) {
    using Model = typename std::decay_t<decltype(kind)>::model_type;
    for (std::string_view k : kind.keywords) {
      if (k == keyword) fresh = Model{};
    }
  });
  return fresh;
}

std::vector<std::string> model_keywords() {
  std::vector<std::string> out;
  kinds::for_each_model_kind([&](const auto& kind) {
    for (std::string_view k : kind.keywords) out.emplace_back(k);
  });
  return out;
}

}  // namespace

void Elaborator::model(const ast::Model& m, const Frame& frame) {
  const reader::SourceText& source = frame.file->source;
  if (models_.count(m.name)) source.fail(m.offset, "a model named '" + m.name + "' already exists");
  ModelEntry entry;
  if (auto fresh = fresh_model(m.base)) {
    entry = {m.base, *fresh, {}};
  } else if (const auto base = models_.find(m.base); base != models_.end()) {
    entry = base->second;
  } else {
    const std::vector<std::string> keywords = model_keywords();
    std::vector<std::string> names = keywords;
    for (const auto& [name, e] : models_) names.push_back(name);
    source.fail(m.offset, "'" + m.base + "' is neither a model kind (" + text::joined(keywords) +
                              ") nor a model defined above" + reader::suggestion(m.base, names));
  }
  std::visit(
      [&](auto& parameters) {
        using Model = std::decay_t<decltype(parameters)>;
        read_parameters(kinds::ModelKindOf<Model>::descriptor, m, entry, frame);
      },
      entry.parameters);
  deck_.places.add("model " + m.name, frame.file->index, m.offset);
  // The circuit gets the model settled; a model derived from it later starts
  // from the parameters as written.
  AnyModel settled = entry.parameters;
  std::visit(
      [](auto& parameters) {
        using Model = std::decay_t<decltype(parameters)>;
        if (const auto settle = kinds::ModelKindOf<Model>::descriptor.settle) settle(parameters);
      },
      settled);
  deck_.circuit.add_model(m.name, settled);
  models_.emplace(m.name, std::move(entry));
}

// Reads `m`'s parameters into entry.parameters (a Model), then checks what
// the model's choices refuse.
template <class Model>
void Elaborator::read_parameters(const kinds::ModelDescriptor<Model>& kind, const ast::Model& m,
                                 ModelEntry& entry, const Frame& frame) {
  const reader::SourceText& source = frame.file->source;
  Model& model = std::get<Model>(entry.parameters);
  std::set<std::string> here;
  std::map<std::string, int> choice_offsets;
  for (const ast::Argument& parameter : m.parameters) {
    if (!parameter.key) source.fail(parameter.offset, "expected parameter = value");
    const std::string& key = *parameter.key;
    if (!here.insert(key).second) source.fail(parameter.offset, "'" + key + "' is given twice");
    const auto choice = std::find_if(kind.choices.begin(), kind.choices.end(),
                                     [&](const auto& c) { return c.name == key; });
    if (choice != kind.choices.end()) {
      const std::vector<std::string> words(choice->words.begin(), choice->words.end());
      const std::string word = require_choice(parameter.value, words, source);
      choice->set(model, std::find(words.begin(), words.end(), word) - words.begin());
      choice_offsets[key] = parameter.offset;
      continue;
    }
    const auto* row = find_parameter(kind.parameters(), key);
    if (row == nullptr) {
      std::vector<std::string> names;
      for (const auto& r : kind.parameters()) names.emplace_back(r.name);
      for (const auto& c : kind.choices) names.emplace_back(c.name);
      source.fail(parameter.offset, "a " + entry.kind + " model has no parameter '" + key + "'" +
                                        reader::suggestion(key, names));
    }
    model.*(row->field) =
        reader::evaluate_as(parameter.value, row->quantity, *frame.scope, source, true);
    entry.set[key] = {frame.file, parameter.offset};
  }
  if (kind.refuses != nullptr) {
    for (const auto& [key, where] : entry.set) {
      const auto why = kind.refuses(model, *find_parameter(kind.parameters(), key));
      if (!why) continue;
      // A parameter inherited from the base model is blamed on the choice.
      const bool own = here.count(key) != 0;
      const int blamed =
          own || choice_offsets.empty() ? where.second : choice_offsets.begin()->second;
      source.fail(blamed, "'" + key + "' " + std::string(*why) +
                              (own ? "" : " (it is set in the base model '" + m.base + "')"));
    }
  }
}

}  // namespace stage::elaborate
