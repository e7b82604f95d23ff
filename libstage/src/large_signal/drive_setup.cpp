// Small-signal drive and supply rails of a stage.
#include "large_signal/drive_setup.hpp"

#include <cmath>

#include "circuit/element_kinds.hpp"
#include "common/constants.hpp"
#include "stage/errors.hpp"
#include "stage/frequency.hpp"

namespace stage::analysis {
namespace {

// The language's names of a source's small-signal value and phase.
constexpr std::string_view kSmallSignal = "ac", kSmallSignalPhase = "ac_phase";

}  // namespace

Circuit with_only_ac_input(const Circuit& circuit, const std::string& input) {
  Circuit c = circuit;
  bool found = false;
  for (const Element& e : circuit.elements()) {
    if (!kinds::has_role(e.data, kinds::Role::independent_source)) continue;
    const bool is_input = e.name == input;
    found = found || is_input;
    ElementData& data = c.find(e.name)->data;
    kinds::set_field_value(data, kSmallSignal, is_input ? 1.0 : 0.0);
    kinds::set_field_value(data, kSmallSignalPhase, 0.0);
  }
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
  return amplitude_ratio_from_db(*r.figures.gain_at_dB);
}

std::optional<double> impedance_without(const Circuit& circuit, const SolverOptions& solver,
                                        const std::string& removed, const std::string& a,
                                        const std::string& b, double frequency) {
  if (a == b) return std::nullopt;
  constexpr const char* kProbe = "impedance_probe";
  // A unit AC current driven from b to a: the voltage that builds between
  // them is the impedance (small_signal_gain zeroes every other AC source).
  Circuit probe = circuit;
  probe.remove(removed);
  probe.add(kProbe, CurrentSource{b, a, 0.0, 1.0});
  return small_signal_gain(probe, solver, kProbe, SignalRef::pair(a, b), frequency);
}

std::vector<Rail> supply_rails(const Circuit& circuit, const std::string& input) {
  std::vector<Rail> rails;
  for (const Element& e : circuit.elements()) {
    const bool fixed_supply = kinds::has_role(e.data, kinds::Role::independent_source) &&
                              kinds::has_role(e.data, kinds::Role::holds_voltage) &&
                              !kinds::has_waveform(e.data);
    if (!fixed_supply || e.name == input) continue;
    const std::vector<std::string> ends = kinds::nodes(e.data);  // positive, negative
    const double dc = *kinds::own_value(e.data);
    if (ends[1] == kGround) rails.push_back({e.name, ends[0], dc, dc});
    if (ends[0] == kGround) rails.push_back({e.name, ends[1], -dc, dc});
  }
  return rails;
}

}  // namespace stage::analysis
