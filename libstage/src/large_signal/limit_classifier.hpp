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
#include "stage/bias.hpp"
#include "stage/circuit.hpp"
#include "stage/headroom.hpp"

namespace stage::mna {
class System;
struct OperatingPointReport;
}  // namespace stage::mna

namespace stage::analysis {

class LimitClassifier {
 public:
  // Reads the circuit once: its supply rails (every one but `input`'s), the
  // impedance each bipolar's emitter sees at `frequency`, and the
  // complementary pairs. `system` is the assembled system whose solutions
  // the extremes hold and `bias` its bias point; both must outlive the
  // classifier. The output is measured from `output_reference` (node b of a
  // node pair, else 0 V), so an extreme's value plus it is a node voltage.
  LimitClassifier(const Circuit& circuit, const mna::System& system, const BiasResult& bias,
                  const std::string& input, double frequency, double output_reference);

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

 private:
  struct Suspects;
  Suspects suspects(const mna::OperatingPointReport& report) const;
  bool paired(const std::string& a, const std::string& b) const;
  std::optional<LimitCause> at_rail(const Extreme& extreme, const std::string& detail) const;
  std::optional<LimitCause> turning_off(const mna::OperatingPointReport& report,
                                        const Suspects& s) const;
  std::string currents(const BipolarOperatingPoint& q) const;
  double current_ratio(const BipolarOperatingPoint& q) const;
  double gain_departure(const BipolarOperatingPoint& q) const;

  const mna::System& system_;
  const BiasResult& bias_;
  double output_reference_;
  std::vector<Rail> rails_;
  std::map<std::string, double> emitter_impedance_;  // per transistor, ohm
  // Push-pull pairs (npn, pnp): emitters that share a node or reach one
  // node through one resistor each (emitter resistors).
  std::set<std::pair<std::string, std::string>> pairs_;
};

}  // namespace stage::analysis
