// The textbook AC load line of a single-transistor stage. R'ac is measured,
// not guessed from the topology: the transistor is taken out, every source
// zeroed, and a unit AC current driven from emitter to collector; the voltage
// that builds between them is the AC load the transistor's output sees
// (RC || RL for a common-emitter stage, RE || RL for a follower, plus any
// unbypassed emitter resistance).
#include "large_signal/load_line.hpp"

#include <cmath>
#include <complex>

#include "circuit/element_kinds.hpp"
#include "large_signal/drive_setup.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

// Capacitors are open for the DC load line: at this fraction of the drive's
// frequency a coupling capacitor's reactance is 1e9 times its reactance in
// the band (a 2200 uF capacitor at 1 kHz: 72 Mohm), far above the resistors
// beside it, and an inductor a short.
constexpr double kDcFrequencyFraction = 1e-9;

}  // namespace

const Element* only_transistor(const Circuit& circuit) {
  const Element* found = nullptr;
  for (const Element& e : circuit.elements()) {
    if (!kinds::amplifier(e.data)) continue;
    if (found != nullptr) return nullptr;
    found = &e;
  }
  return found;
}

std::optional<LoadLineEstimate> estimate_load_line(
    const Circuit& circuit, const SolverOptions& solver,
    const std::map<std::string, mna::Conduction>& at_bias, double frequency) {
  const Element* transistor = only_transistor(circuit);
  if (transistor == nullptr) return std::nullopt;
  const kinds::Amplifier q = *kinds::amplifier(transistor->data);
  const mna::Conduction& op = at_bias.at(transistor->name);

  // Without the transistor a node may float: no load line to draw then.
  const auto load_at = [&](double f) -> std::optional<double> {
    try {
      return impedance_without(circuit, solver, transistor->name, q.main_node, q.common_node, f)
          .value_or(0.0);
    } catch (const NumericalError&) {
      return std::nullopt;
    }
  };
  const std::optional<double> ac = load_at(frequency);
  if (!ac) return std::nullopt;
  const double ac_load = *ac;

  LoadLineEstimate e;
  e.device = transistor->name;
  e.quiescent_current = std::abs(op.current);
  e.quiescent_vce = std::abs(op.voltage);
  e.ac_load = ac_load;
  e.saturation_current = e.quiescent_current + e.quiescent_vce / ac_load;
  e.cutoff_vce = e.quiescent_vce + e.quiescent_current * ac_load;
  e.compliance_peak_to_peak = 2 * std::min(e.quiescent_vce, e.quiescent_current * ac_load);
  e.dc_load = load_at(frequency * kDcFrequencyFraction).value_or(0.0);
  return e;
}

}  // namespace stage::analysis
