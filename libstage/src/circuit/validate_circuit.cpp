// validate(const Circuit&): the rules of stage/validate.hpp for the circuit
// itself, one function per kind of thing checked.
#include <cmath>
#include <string>

#include "stage/validate.hpp"

namespace stage {
namespace {

std::string number(double value) { return std::to_string(value); }

std::optional<Problem> finite(const std::string& subject, std::string_view what, double value) {
  if (std::isfinite(value)) return std::nullopt;
  return Problem{subject, "'" + subject + "': its " + std::string(what) + " must be finite, not " +
                              number(value)};
}

std::optional<Problem> positive(const std::string& subject, std::string_view what, double value) {
  if (std::isfinite(value) && value > 0) return std::nullopt;
  return Problem{subject, "'" + subject + "': its " + std::string(what) +
                              " must be positive and finite, not " + number(value)};
}

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
    for (double v : {p->low, p->high, p->delay, p->rise, p->fall, p->width, p->period}) {
      if (!std::isfinite(v)) return bad("needs finite values");
    }
    if (p->delay < 0 || p->rise < 0 || p->fall < 0 || p->width < 0) {
      return bad("needs a delay, rise, fall and width of 0 or more");
    }
    if (!(p->period > 0) || p->period < p->rise + p->width + p->fall) {
      return bad("needs a positive period of at least rise + width + fall");
    }
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

template <class Source>
std::optional<Problem> source_problem(const std::string& name, const Source& s) {
  if (auto p = finite(name, "DC value", s.dc)) return p;
  if (auto p = finite(name, "AC magnitude", s.ac_magnitude)) return p;
  if (auto p = finite(name, "AC phase", s.ac_phase_deg)) return p;
  if (s.wave) return waveform_problem(name, *s.wave);
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
  return std::nullopt;
}

// A sensed element must carry a branch current: a voltage source or an
// inductor (spec section 3).
std::optional<Problem> sense_problem(const Circuit& circuit, const std::string& name,
                                     const std::string& sense) {
  const Element* e = circuit.find(sense);
  if (e != nullptr && (std::holds_alternative<VoltageSource>(e->data) ||
                       std::holds_alternative<Inductor>(e->data))) {
    return std::nullopt;
  }
  return Problem{name, "'" + name + "' senses '" + sense +
                           "', which is not a voltage source or an inductor of the circuit"};
}

template <class Model>
std::optional<Problem> model_reference(const std::map<std::string, Model>& models,
                                       const std::string& name, const std::string& model,
                                       std::string_view kind) {
  if (models.count(model)) return std::nullopt;
  return Problem{name, "'" + name + "' uses model '" + model + "', which is not a " +
                           std::string(kind) + " model of the circuit"};
}

// A new element kind must bring its own rules here (and its terminals to
// analysis/element_nodes.cpp, which checks the same way).
static_assert(std::variant_size_v<ElementData> == 11,
              "a new element kind: add its rules to element_problem");

std::optional<Problem> element_problem(const Circuit& circuit, const Element& element) {
  const std::string& name = element.name;
  return std::visit(
      [&](const auto& e) -> std::optional<Problem> {
        using T = std::decay_t<decltype(e)>;
        if constexpr (std::is_same_v<T, Resistor>)
          return positive(name, "resistance", e.resistance);
        if constexpr (std::is_same_v<T, Capacitor>) {
          if (auto p = positive(name, "capacitance", e.capacitance)) return p;
          if (e.initial_voltage) return finite(name, "initial voltage", *e.initial_voltage);
        }
        if constexpr (std::is_same_v<T, Inductor>) {
          if (auto p = positive(name, "inductance", e.inductance)) return p;
          if (e.initial_current) return finite(name, "initial current", *e.initial_current);
        }
        if constexpr (std::is_same_v<T, VoltageSource> || std::is_same_v<T, CurrentSource>) {
          return source_problem(name, e);
        }
        if constexpr (std::is_same_v<T, VoltageControlledVoltageSource> ||
                      std::is_same_v<T, VoltageControlledCurrentSource>) {
          return finite(name, "gain", e.gain);
        }
        if constexpr (std::is_same_v<T, CurrentControlledCurrentSource> ||
                      std::is_same_v<T, CurrentControlledVoltageSource>) {
          if (auto p = finite(name, "gain", e.gain)) return p;
          return sense_problem(circuit, name, e.sense);
        }
        if constexpr (std::is_same_v<T, Diode>) {
          if (auto p = positive(name, "area", e.area)) return p;
          return model_reference(circuit.diode_models(), name, e.model, "diode");
        }
        if constexpr (std::is_same_v<T, Bipolar>) {
          if (auto p = positive(name, "area", e.area)) return p;
          return model_reference(circuit.bipolar_models(), name, e.model, "bipolar");
        }
        return std::nullopt;
      },
      element.data);
}

}  // namespace

std::optional<Problem> validate(const Circuit& circuit) {
  if (!(std::isfinite(circuit.temperature) && circuit.temperature > 0)) {
    return Problem{"temperature",
                   "the circuit's temperature must be a finite number of kelvin "
                   "above zero, not " +
                       number(circuit.temperature)};
  }
  for (const auto& [name, model] : circuit.bipolar_models()) {
    if (auto p = model_problem(name, model, bipolar_parameters())) return p;
  }
  for (const auto& [name, model] : circuit.diode_models()) {
    if (auto p = model_problem(name, model, diode_parameters())) return p;
  }
  for (const Element& e : circuit.elements()) {
    if (auto p = element_problem(circuit, e)) return p;
  }
  return std::nullopt;
}

}  // namespace stage
