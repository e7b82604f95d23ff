// `model` statements (spec section 4): a fresh model of a kind, or a copy of
// an earlier model with some parameters overridden; parameter names come from
// the tables in model_parameters.cpp, `form = ebers_moll` rejects the
// Gummel–Poon extras, and `base_resistance_min` left unset follows
// `base_resistance` of the final model.
#include "reader/elaborator.hpp"
#include "reader/suggest.hpp"

namespace stage::elaborate {

namespace {

template <class Model>
const ModelParameter<Model>* find_parameter(std::span<const ModelParameter<Model>> table,
                                            const std::string& name) {
  for (const auto& row : table) {
    if (row.name == name) return &row;
  }
  return nullptr;
}

template <class Model>
std::vector<std::string> parameter_names(std::span<const ModelParameter<Model>> table) {
  std::vector<std::string> names;
  for (const auto& row : table) names.emplace_back(row.name);
  return names;
}

}  // namespace

void Elaborator::model(const ast::Model& m, const Frame& frame) {
  const reader::SourceText& source = frame.file->source;
  if (models_.count(m.name)) source.fail(m.offset, "a model named '" + m.name + "' already exists");
  ModelEntry entry;
  if (m.base == "npn" || m.base == "pnp" || m.base == "diode") {
    entry.kind = m.base;
  } else if (const auto base = models_.find(m.base); base != models_.end()) {
    entry = base->second;
  } else {
    std::vector<std::string> names{"npn", "pnp", "diode"};
    for (const auto& [name, e] : models_) names.push_back(name);
    source.fail(m.offset, "'" + m.base +
                              "' is neither a model kind (npn, pnp, diode) nor a model "
                              "defined above" +
                              reader::suggestion(m.base, names));
  }
  const bool bipolar = entry.kind != "diode";
  std::set<std::string> here;
  int form_offset = -1;
  for (const ast::Argument& parameter : m.parameters) {
    if (!parameter.key) source.fail(parameter.offset, "expected parameter = value");
    const std::string& key = *parameter.key;
    if (!here.insert(key).second) source.fail(parameter.offset, "'" + key + "' is given twice");
    if (bipolar && key == "form") {
      entry.bipolar.form =
          require_choice(parameter.value, {"gummel_poon", "ebers_moll"}, source) == "ebers_moll"
              ? BipolarForm::ebers_moll
              : BipolarForm::gummel_poon;
      form_offset = parameter.offset;
      continue;
    }
    Quantity quantity;
    double* field = nullptr;
    if (bipolar) {
      const auto* row = find_parameter(bipolar_parameters(), key);
      if (row) quantity = row->quantity, field = &(entry.bipolar.*(row->field));
    } else {
      const auto* row = find_parameter(diode_parameters(), key);
      if (row) quantity = row->quantity, field = &(entry.diode.*(row->field));
    }
    if (!field) {
      std::vector<std::string> names =
          bipolar ? parameter_names(bipolar_parameters()) : parameter_names(diode_parameters());
      if (bipolar) names.push_back("form");
      source.fail(parameter.offset, "a " + entry.kind + " model has no parameter '" + key + "'" +
                                        reader::suggestion(key, names));
    }
    *field = reader::evaluate_as(parameter.value, quantity, *frame.scope, source, true);
    entry.set[key] = {frame.file, parameter.offset};
  }
  if (bipolar && entry.bipolar.form == BipolarForm::ebers_moll) {
    for (const auto& [key, where] : entry.set) {
      const auto* row = find_parameter(bipolar_parameters(), key);
      if (!row->gummel_poon_only) continue;
      // A parameter inherited from the base model is blamed on `form`.
      const bool own = here.count(key) != 0;
      source.fail(own ? where.second : form_offset,
                  "'" + key + "' is a Gummel–Poon parameter; form = ebers_moll does not take it" +
                      (own ? "" : " (it is set in the base model '" + m.base + "')"));
    }
  }
  deck_.places["model " + m.name] = source.location(m.offset);
  if (bipolar) {
    BipolarModel resolved = entry.bipolar;
    if (resolved.base_resistance_min < 0) resolved.base_resistance_min = resolved.base_resistance;
    deck_.circuit.add_model(m.name, resolved);
  } else {
    deck_.circuit.add_model(m.name, entry.diode);
  }
  models_.emplace(m.name, std::move(entry));
}

}  // namespace stage::elaborate
