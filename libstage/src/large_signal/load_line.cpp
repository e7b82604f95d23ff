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

const Element* only_transistor(const Circuit& circuit) {
  const Element* found = nullptr;
  for (const Element& e : circuit.elements()) {
    if (!kinds::amplifier(e.data)) continue;
    if (found != nullptr) return nullptr;
    found = &e;
  }
  return found;
}

}  // namespace

std::optional<LoadLineEstimate> estimate_load_line(
    const Circuit& circuit, const SolverOptions& solver,
    const std::map<std::string, mna::Conduction>& at_bias, double frequency) {
  const Element* transistor = only_transistor(circuit);
  if (transistor == nullptr) return std::nullopt;
  const kinds::Amplifier q = *kinds::amplifier(transistor->data);
  const mna::Conduction& op = at_bias.at(transistor->name);

  double ac_load = 0;
  try {
    ac_load =
        impedance_without(circuit, solver, transistor->name, q.main_node, q.common_node, frequency)
            .value_or(0.0);
  } catch (const NumericalError&) {
    return std::nullopt;  // without the transistor a node floats: no load line to draw
  }

  LoadLineEstimate e;
  e.device = transistor->name;
  e.quiescent_current = std::abs(op.current);
  e.quiescent_vce = std::abs(op.voltage);
  e.ac_load = ac_load;
  e.saturation_current = e.quiescent_current + e.quiescent_vce / ac_load;
  e.cutoff_vce = e.quiescent_vce + e.quiescent_current * ac_load;
  e.compliance_peak_to_peak = 2 * std::min(e.quiescent_vce, e.quiescent_current * ac_load);
  return e;
}

}  // namespace stage::analysis
