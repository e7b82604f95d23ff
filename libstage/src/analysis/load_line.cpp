// The textbook AC load line of a single-transistor stage. R'ac is measured,
// not guessed from the topology: the transistor is taken out, every source
// zeroed, and a unit AC current driven from emitter to collector; the voltage
// that builds between them is the AC load the transistor's output sees
// (RC || RL for a common-emitter stage, RE || RL for a follower, plus any
// unbypassed emitter resistance).
#include <cmath>
#include <complex>

#include "stage/errors.hpp"
#include "stage/frequency.hpp"
#include "stage/headroom.hpp"

namespace stage {
namespace {

constexpr const char* kProbe = "load_line_probe";

const Element* only_transistor(const Circuit& circuit) {
  const Element* found = nullptr;
  for (const Element& e : circuit.elements()) {
    if (!std::holds_alternative<Bipolar>(e.data)) continue;
    if (found != nullptr) return nullptr;
    found = &e;
  }
  return found;
}

// The circuit without `transistor`, every source at zero AC and with no wave,
// and the probe current source from emitter to collector.
Circuit probe_circuit(const Circuit& circuit, const Element& transistor) {
  const auto& q = std::get<Bipolar>(transistor.data);
  Circuit probe;
  probe.temperature = circuit.temperature;
  probe.solver = circuit.solver;
  for (const auto& [name, model] : circuit.bipolar_models()) probe.add_model(name, model);
  for (const auto& [name, model] : circuit.diode_models()) probe.add_model(name, model);
  for (const Element& e : circuit.elements()) {
    if (&e == &transistor) continue;
    ElementData data = e.data;
    std::visit(
        [](auto& d) {
          using T = std::decay_t<decltype(d)>;
          if constexpr (std::is_same_v<T, VoltageSource> || std::is_same_v<T, CurrentSource>) {
            d.ac_magnitude = 0;
            d.wave.reset();
          }
        },
        data);
    probe.add(e.name, std::move(data));
  }
  probe.add(kProbe, CurrentSource{q.emitter, q.collector, 0.0, 1.0});
  return probe;
}

}  // namespace

std::optional<LoadLineEstimate> estimate_load_line(const Circuit& circuit, const BiasResult& bias,
                                                   double frequency) {
  const Element* transistor = only_transistor(circuit);
  if (transistor == nullptr) return std::nullopt;
  const auto& q = std::get<Bipolar>(transistor->data);
  const BipolarOperatingPoint& op = bias.bipolar(transistor->name);

  FrequencyOptions options;
  options.from = frequency;
  options.to = frequency * 1.001;
  options.per_decade = 1;
  options.input = kProbe;
  options.output = SignalRef::pair(q.collector, q.emitter);
  options.at = frequency;
  double ac_load = 0;
  try {
    const FrequencyResult r = run_frequency(probe_circuit(circuit, *transistor), options);
    ac_load = std::pow(10.0, *r.figures.gain_at_dB / 20.0);
  } catch (const NumericalError&) {
    return std::nullopt;  // without the transistor a node floats: no load line to draw
  }

  LoadLineEstimate e;
  e.device = transistor->name;
  e.quiescent_current = std::abs(op.collector_current);
  e.quiescent_vce = std::abs(op.vce);
  e.ac_load = ac_load;
  e.saturation_current = e.quiescent_current + e.quiescent_vce / ac_load;
  e.cutoff_vce = e.quiescent_vce + e.quiescent_current * ac_load;
  e.compliance_peak_to_peak = 2 * std::min(e.quiescent_vce, e.quiescent_current * ac_load);
  return e;
}

}  // namespace stage
