// validate(const Circuit&): the rules of stage/validate.hpp for the circuit
// itself, one function per kind of thing checked.
#include <cmath>
#include <string>

#include "circuit/element_kinds.hpp"
#include "stage/validate.hpp"

namespace stage {
namespace {

std::string number(double value) { return std::to_string(value); }

std::optional<Problem> waveform_problem(const std::string& subject, const Waveform& wave) {
  const auto bad = [&](const std::string& why) {
    return std::optional<Problem>(Problem{subject, "'" + subject + "': its waveform " + why});
  };
  if (const auto* s = std::get_if<SineWave>(&wave)) {
    for (double v : {s->amplitude, s->frequency, s->offset, s->delay, s->phase_deg, s->damping}) {
      if (!std::isfinite(v)) return bad("needs finite values");
    }
    if (s->frequency < 0 || s->delay < 0) return bad("needs a frequency and delay of 0 or more");
  } else if (const auto* p = std::get_if<PulseWave>(&wave)) {
    if (std::string why = pulse_problem(*p); !why.empty()) return bad(why);
  } else {
    const auto& points = std::get<PiecewiseWave>(wave).points;
    if (points.empty()) return bad("needs at least one point");
    for (std::size_t k = 0; k < points.size(); ++k) {
      if (!std::isfinite(points[k].first) || !std::isfinite(points[k].second)) {
        return bad("needs finite times and values");
      }
      if (k > 0 && !(points[k].first > points[k - 1].first)) {
        return bad("needs increasing times");
      }
    }
  }
  return std::nullopt;
}

// The ratings that only make sense together (spec section 4, "Ratings"):
// the derating ends above the rated case temperature, and the
// second-breakdown segment runs from the power line to the voltage rating.
std::optional<Problem> ratings_problem(const std::string& name, const BipolarModel& m) {
  const auto problem = [&](const std::string& why) {
    return Problem{"model " + name, "model '" + name + "': " + why};
  };
  if (std::isfinite(m.max_junction_temperature) &&
      m.max_junction_temperature <= m.rated_case_temperature) {
    return problem("max_junction_temperature must lie above rated_case_temperature");
  }
  if (!std::isfinite(m.second_breakdown_voltage)) return std::nullopt;
  if (!std::isfinite(m.second_breakdown_current) || !std::isfinite(m.max_dissipation) ||
      !(m.second_breakdown_voltage < m.max_collector_emitter_voltage)) {
    return problem(
        "second_breakdown_voltage needs second_breakdown_current, max_dissipation and a "
        "larger max_collector_emitter_voltage");
  }
  return std::nullopt;
}

template <class Model>
std::optional<Problem> model_problem(const std::string& name, const Model& model,
                                     std::span<const ModelParameter<Model>> table) {
  for (const auto& parameter : table) {
    if (auto why = range_error(parameter.range, model.*parameter.field)) {
      const std::string subject = "model " + name;
      return Problem{subject, "model '" + name + "': " + std::string(parameter.name) + " " +
                                  std::string(*why) + ", not " + number(model.*parameter.field)};
    }
  }
  if constexpr (std::is_same_v<Model, BipolarModel>) return ratings_problem(name, model);
  return std::nullopt;
}

// What `sense =` names must be an element's current or a terminal of an
// element (spec section 3).
std::optional<Problem> sense_problem(const Circuit& circuit, const std::string& name,
                                     const std::string& sense) {
  const kinds::SensedCurrent sensed = kinds::sensed_current(circuit, sense);
  if (sensed.problem.empty()) return std::nullopt;
  return Problem{name, "'" + name + "' senses '" + sense + "': " + sensed.problem};
}

// True when the circuit has a model of the kind E's `model =` refers to.
template <class E>
bool model_exists(const Circuit& circuit, const std::string& model) {
  if constexpr (requires { typename kinds::KindOf<E>::model_type; }) {
    return circuit.models().of<typename kinds::KindOf<E>::model_type>().count(model) != 0;
  } else {
    return false;
  }
}

// One argument of an element against its field's rules.
template <class E>
std::optional<Problem> field_problem(const Circuit& circuit, const std::string& name, const E& e,
                                     const kinds::Descriptor<E>& kind,
                                     const kinds::Field<E>& field) {
  const auto out_of_range = [&](double v) -> std::optional<Problem> {
    const auto why = range_error(field.range, v);
    if (!why) return std::nullopt;
    return Problem{name, "'" + name + "': its " + std::string(field.name) + " " +
                             std::string(*why) + ", not " + number(v)};
  };
  switch (field.kind) {
    case kinds::FieldKind::value:
      return out_of_range(e.*field.number);
    case kinds::FieldKind::optional_value:
      if (const auto& v = e.*field.optional_number) return out_of_range(*v);
      return std::nullopt;
    case kinds::FieldKind::waveform:
      if (const auto& w = e.*field.wave) return waveform_problem(name, *w);
      return std::nullopt;
    case kinds::FieldKind::sensed_element:
      return sense_problem(circuit, name, e.*field.text);
    case kinds::FieldKind::model: {
      const std::string_view model_kind = kind.model_kind(e);
      if (model_exists<E>(circuit, e.*field.text)) return std::nullopt;
      return Problem{name, "'" + name + "' uses model '" + e.*field.text + "', which is not a " +
                               std::string(model_kind) + " model of the circuit"};
    }
    case kinds::FieldKind::terminal:
    case kinds::FieldKind::optional_terminal:
    case kinds::FieldKind::control_pair:
      return std::nullopt;
  }
  return std::nullopt;
}

// `:` joins a device and a part of it in the names of unknowns inside
// devices ("q1:base", and the node an ammeter inserts at "q1:collector"),
// so a circuit node named so could be taken for one of them.
std::optional<Problem> node_name_problem(const Element& element) {
  std::optional<Problem> found;
  kinds::for_each_node(element.data, [&](const std::string& node) {
    if (!found && node.find(':') != std::string::npos) {
      found = Problem{element.name, "'" + element.name + "' is connected to node '" + node +
                                        "': ':' is kept for the nodes inside devices "
                                        "(\"q1:base\"); choose a name without it"};
    }
  });
  return found;
}

std::optional<Problem> element_problem(const Circuit& circuit, const Element& element) {
  if (auto p = node_name_problem(element)) return p;
  return kinds::with_descriptor(
      element.data, [&](const auto& e, const auto& kind) -> std::optional<Problem> {
        for (const auto& field : kind.fields) {
          if (auto p = field_problem(circuit, element.name, e, kind, field)) return p;
        }
        return std::nullopt;
      });
}

}  // namespace

std::optional<Problem> validate(const Circuit& circuit) {
  if (!(std::isfinite(circuit.temperature) && circuit.temperature > 0)) {
    return Problem{"temperature",
                   "the circuit's temperature must be a finite number of kelvin "
                   "above zero, not " +
                       number(circuit.temperature)};
  }
  std::optional<Problem> found;
  circuit.models().for_each_kind([&](const auto& models) {
    for (const auto& [name, model] : models) {
      using Model = std::decay_t<decltype(model)>;
      if (!found)
        found = model_problem(name, model, kinds::ModelKindOf<Model>::descriptor.parameters());
    }
  });
  if (found) return found;
  for (const Element& e : circuit.elements()) {
    if (auto p = element_problem(circuit, e)) return p;
  }
  return std::nullopt;
}

}  // namespace stage
