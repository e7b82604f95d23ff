// Energy taken by each element over a window of a transient.
#include "large_signal/energy_ledger.hpp"

#include <algorithm>

#include "circuit/element_kinds.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {

EnergyLedger::EnergyLedger(const Circuit& circuit, const mna::System& system)
    : system_(system), scratch_(system.make_workspace()) {
  const auto& topology = system.topology();
  offsets_.push_back(0);
  for (const auto& device : system.devices()) {
    const Element* element = circuit.find(device->name());
    const std::size_t first = terminals_.size();
    // A terminal shared with another of the same device (base tied to
    // collector) is one row: counting it twice would double its power.
    const auto add_terminal = [&](mna::Index index) {
      if (std::find(terminals_.begin() + first, terminals_.end(), index) == terminals_.end()) {
        terminals_.push_back(index);
      }
    };
    for (const std::string& name :
         element == nullptr ? std::vector<std::string>{} : kinds::nodes(element->data)) {
      const auto index = name == kGround ? std::optional<mna::Index>(0) : topology.find_node(name);
      if (!index) throw Error(ErrorKind::invalid_request, "no node named '" + name + "'", {name});
      add_terminal(*index);
    }
    // A sensed terminal sits on its own node behind an ammeter.
    for (const mna::Index index : topology.terminal_nodes(device->name())) add_terminal(index);
    offsets_.push_back(terminals_.size());
  }
  const std::size_t devices = offsets_.size() - 1;
  power_.assign(devices, 0);
  last_power_.assign(devices, 0);
  energy_.assign(devices, 0);
  charge_.assign(terminals_.size(), 0);
  last_charge_.assign(terminals_.size(), 0);
  last_x_.assign(scratch_.f.size(), 0);
}

void EnergyLedger::start(double from) {
  from_ = from;
  has_last_ = false;
  std::fill(energy_.begin(), energy_.end(), 0.0);
}

void EnergyLedger::evaluate(double time, const double* x, std::vector<double>& power,
                            std::vector<double>& charge) {
  mna::EvalRequest at = system_.request(x);
  at.dc = false;
  at.time = time;
  // Every device adds into its own slots and rows; only the terminal rows of
  // the device being read must start from zero.
  std::fill(scratch_.f.begin(), scratch_.f.end(), 0.0);
  std::fill(scratch_.q.begin(), scratch_.q.end(), 0.0);
  std::fill(scratch_.g.begin(), scratch_.g.end(), 0.0);
  std::fill(scratch_.c.begin(), scratch_.c.end(), 0.0);
  mna::EvalOutput out = scratch_.output();
  const auto devices = system_.devices();
  for (std::size_t d = 0; d < devices.size(); ++d) {
    for (std::size_t k = offsets_[d]; k < offsets_[d + 1]; ++k) {
      scratch_.f[terminals_[k]] = scratch_.q[terminals_[k]] = 0;
    }
    devices[d]->evaluate(at, out);
    power[d] = 0;
    for (std::size_t k = offsets_[d]; k < offsets_[d + 1]; ++k) {
      power[d] += x[terminals_[k]] * scratch_.f[terminals_[k]];
      charge[k] = scratch_.q[terminals_[k]];
    }
  }
}

void EnergyLedger::step(double time, const std::vector<double>& x) {
  if (time < from_) return;
  if (!has_last_ && time > from_) {
    throw std::logic_error("the energy ledger's window does not start on a transient step");
  }
  evaluate(time, x.data(), power_, charge_);
  if (has_last_) {
    for (std::size_t d = 0; d + 1 < offsets_.size(); ++d) {
      double moved = 0;  // ∫ v dq over the step, trapezoidal in v
      for (std::size_t k = offsets_[d]; k < offsets_[d + 1]; ++k) {
        const mna::Index row = terminals_[k];
        moved += 0.5 * (last_x_[row] + x[row]) * (charge_[k] - last_charge_[k]);
      }
      energy_[d] += 0.5 * (last_power_[d] + power_[d]) * (time - last_time_) + moved;
    }
  }
  std::swap(power_, last_power_);
  std::swap(charge_, last_charge_);
  std::copy(x.begin(), x.end(), last_x_.begin());
  last_time_ = time;
  has_last_ = true;
}

std::vector<double> EnergyLedger::mean_power() const {
  std::vector<double> mean(energy_.size(), 0.0);
  const double span = last_time_ - from_;
  if (!(span > 0)) return mean;
  for (std::size_t d = 0; d < mean.size(); ++d) mean[d] = energy_[d] / span;
  return mean;
}

}  // namespace stage::analysis
