// Small-signal drive and supply rails of a stage.
#include "large_signal/drive_setup.hpp"

#include <cmath>

#include "stage/errors.hpp"
#include "stage/frequency.hpp"

namespace stage::analysis {
namespace {

template <class Visitor>
void visit_sources(Circuit& circuit, Visitor&& visit) {
  for (const Element& e : circuit.elements()) {
    std::visit(
        [&](auto& d) {
          using T = std::decay_t<decltype(d)>;
          if constexpr (std::is_same_v<T, VoltageSource> || std::is_same_v<T, CurrentSource>) {
            visit(e.name, d);
          }
        },
        circuit.find(e.name)->data);
  }
}

}  // namespace

Circuit with_only_ac_input(const Circuit& circuit, const std::string& input) {
  Circuit c = circuit;
  bool found = false;
  visit_sources(c, [&](const std::string& name, auto& source) {
    const bool is_input = name == input;
    found = found || is_input;
    source.ac_magnitude = is_input ? 1.0 : 0.0;
    source.ac_phase_deg = 0.0;
  });
  if (!found) {
    throw Error(ErrorKind::invalid_request,
                "'" + input + "' is not an independent voltage or current source", {input});
  }
  return c;
}

double small_signal_gain(const Circuit& circuit, const SolverOptions& solver,
                         const std::string& input, const SignalRef& output, double frequency) {
  Simulation simulation(with_only_ac_input(circuit, input), solver);
  return small_signal_gain(simulation, input, output, frequency);
}

double small_signal_gain(Simulation& simulation, const std::string& input, const SignalRef& output,
                         double frequency) {
  FrequencyOptions f;
  f.from = frequency;
  f.to = frequency * 1.001;  // a grid of its own; the figure is solved at `at`
  f.per_decade = 1;
  f.input = input;
  f.output = output;
  f.at = frequency;
  const FrequencyResult r = simulation.frequency(f);
  return std::pow(10.0, *r.figures.gain_at_dB / 20.0);
}

std::optional<double> impedance_without(const Circuit& circuit, const SolverOptions& solver,
                                        const std::string& removed, const std::string& a,
                                        const std::string& b, double frequency) {
  if (a == b) return std::nullopt;
  constexpr const char* kProbe = "impedance_probe";
  // A unit AC current driven from b to a: the voltage that builds between
  // them is the impedance (small_signal_gain zeroes every other AC source).
  Circuit probe;
  probe.temperature = circuit.temperature;
  for (const auto& [name, model] : circuit.bipolar_models()) probe.add_model(name, model);
  for (const auto& [name, model] : circuit.diode_models()) probe.add_model(name, model);
  for (const Element& e : circuit.elements()) {
    if (e.name != removed) probe.add(e.name, e.data);
  }
  probe.add(kProbe, CurrentSource{b, a, 0.0, 1.0});
  return small_signal_gain(probe, solver, kProbe, SignalRef::pair(a, b), frequency);
}

std::vector<Rail> supply_rails(const Circuit& circuit, const std::string& input) {
  std::vector<Rail> rails;
  for (const Element& e : circuit.elements()) {
    const auto* v = std::get_if<VoltageSource>(&e.data);
    if (v == nullptr || v->wave || e.name == input) continue;
    if (v->n == kGround) rails.push_back({e.name, v->p, v->dc, v->dc});
    if (v->p == kGround) rails.push_back({e.name, v->n, -v->dc, v->dc});
  }
  return rails;
}

}  // namespace stage::analysis
