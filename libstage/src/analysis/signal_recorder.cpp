// Signal probes of a transient. Currents come from each device's own
// report(), the same figures the bias report prints, so both analyses agree
// on names and signs (spec section 3).
#include "analysis/signal_recorder.hpp"

#include <stdexcept>

namespace stage::analysis {
namespace {

mna::Index node_index(const mna::System& system, const std::string& name) {
  if (name == kGround) return mna::kGroundIndex;
  const auto index = system.topology().find_node(name);
  if (!index) throw std::invalid_argument("no node named '" + name + "'");
  return *index;
}

}  // namespace

SignalRecorder::SignalRecorder(const mna::System& system, const std::vector<SignalRef>& wanted,
                               TransientResult& result)
    : system_(system), result_(result), zero_(static_cast<std::size_t>(system.size()) + 1, 0.0) {
  if (wanted.empty()) {
    const auto& topology = system.topology();
    for (mna::Index i = 1; i <= system.size(); ++i) {
      if (topology.kind(i) != mna::Topology::Kind::node) continue;
      probes_.push_back({i, mna::kGroundIndex, nullptr});
      result_.signals.push_back({topology.name(i), {}});
    }
    for (const auto& d : system.devices()) add_every_current(*d);
    return;
  }
  for (const SignalRef& ref : wanted) {
    switch (ref.kind) {
      case SignalRef::Kind::node_voltage:
      case SignalRef::Kind::node_pair:
        probes_.push_back(
            {node_index(system, ref.a),
             ref.kind == SignalRef::Kind::node_pair ? node_index(system, ref.b) : mna::kGroundIndex,
             nullptr});
        result_.signals.push_back({ref.label(), {}});
        break;
      case SignalRef::Kind::element_current: {
        const mna::Device* device = system.find_device(ref.a);
        if (device == nullptr) throw std::invalid_argument("no element named '" + ref.a + "'");
        add_current(*device, ref.label());
        break;
      }
    }
  }
}

void SignalRecorder::add_every_current(const mna::Device& device) {
  if (!device.reported_current(system_.request(zero_.data()))) return;
  probes_.push_back({mna::kGroundIndex, mna::kGroundIndex, &device});
  result_.signals.push_back({device.name() + ".current", {}});
}

void SignalRecorder::add_current(const mna::Device& device, const std::string& name) {
  if (!device.reported_current(system_.request(zero_.data()))) {
    throw std::invalid_argument("element '" + device.name() + "' reports no current");
  }
  probes_.push_back({mna::kGroundIndex, mna::kGroundIndex, &device});
  result_.signals.push_back({name, {}});
}

void SignalRecorder::record(double t, const std::vector<double>& x) {
  result_.time.push_back(t);
  mna::EvalRequest at = system_.request(x.data());
  at.dc = false;
  at.time = t;
  for (std::size_t s = 0; s < probes_.size(); ++s) {
    const Probe& probe = probes_[s];
    const double value =
        probe.device != nullptr ? *probe.device->reported_current(at) : x[probe.p] - x[probe.n];
    result_.signals[s].values.push_back(value);
  }
}

}  // namespace stage::analysis
