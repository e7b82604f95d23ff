// The limit classifier: which device and which mechanism stop one side of a
// swing, read from the circuit's full state at the output's extreme and
// compared with the bias point. The headroom search asks it about every
// limit it reports; it knows nothing of the search.
#pragma once

#include <map>
#include <optional>
#include <set>
#include <string>
#include <utility>
#include <vector>

#include "large_signal/drive_setup.hpp"
#include "large_signal/sine_drive.hpp"
#include "mna/device.hpp"
#include "stage/circuit.hpp"
#include "stage/headroom.hpp"

namespace stage::mna {
class System;
}  // namespace stage::mna

namespace stage::analysis {

// One device's conduction at a solution.
struct Reading {
  std::string name;
  mna::Conduction at;
};
using Readings = std::vector<Reading>;

class LimitClassifier {
 public:
  // Reads the circuit once: its supply rails (every one but `input`'s), the
  // impedance each transistor's emitter sees at `frequency`, and the
  // complementary pairs; and every device's conduction at `bias_point`
  // (the unknowns of the bias point). `system` is the assembled system whose
  // solutions the extremes hold; it must outlive the classifier. The output is measured from
  // `output_reference` (node b of a node pair, else 0 V), so an extreme's value plus it is a node
  // voltage.
  LimitClassifier(const Circuit& circuit, const SolverOptions& solver, const mna::System& system,
                  const std::vector<double>& bias_point, const std::string& input, double frequency,
                  double output_reference);

  // What stops a side whose output peaks at `extreme`, in this order: a
  // transistor newly in saturation; the output at a supply rail; a diode
  // that conducted at the bias point now carrying less than a tenth of that
  // current (the network biasing the drive has run out: current_limit);
  // unless another transistor has taken over (more than twice its bias
  // current, as in a push-pull pair at a large swing, where the idle half
  // turning off is normal): a complementary pair handing over (one half
  // above its bias current while the other, still conducting, is below its
  // own: crossover), then a transistor newly in cutoff or carrying less than
  // half its bias current; otherwise smooth distortion, blamed on the
  // transistor that carries the side after a take-over, else on the one
  // whose incremental gain departs most from its small-signal value. (The
  // fractions are limit_classifier.cpp's named constants.)
  LimitCause classify(const Extreme& extreme) const;

  // Crossover of a complementary pair biased off: the transistors carrying
  // the output at its maximum and at its minimum (each the one whose current
  // rose furthest above its bias) when they form a pair; nothing otherwise.
  std::optional<LimitCause> pair_handing_over(const Extreme& maximum, const Extreme& minimum) const;

  // Every device's conduction at the bias point, by name.
  const std::map<std::string, mna::Conduction>& at_bias() const { return at_bias_; }

 private:
  struct Suspects;
  Suspects suspects(const Readings& readings) const;
  bool paired(const std::string& a, const std::string& b) const;
  const mna::Conduction& biased(const Reading& r) const;
  std::optional<LimitCause> newly_saturated(const Readings& readings,
                                            const std::string& detail) const;
  std::optional<LimitCause> at_rail(const Extreme& extreme, const std::string& detail) const;
  std::optional<LimitCause> starved(const Readings& readings) const;
  std::optional<LimitCause> turning_off(const Readings& readings, const Suspects& s) const;
  std::string currents(const Reading& r) const;
  double current_ratio(const Reading& r) const;
  double gain_departure(const Reading& r) const;

  const mna::System& system_;
  double output_reference_;
  std::vector<Rail> rails_;
  std::map<std::string, mna::Conduction> at_bias_;
  std::map<std::string, std::string_view> main_terminal_;  // "collector", per transistor
  std::map<std::string, double> common_impedance_;         // seen by each transistor's emitter, ohm
  // Push-pull pairs (npn, pnp): emitters that share a node or reach one
  // node through one resistor each (emitter resistors).
  std::set<std::pair<std::string, std::string>> pairs_;
};

}  // namespace stage::analysis
