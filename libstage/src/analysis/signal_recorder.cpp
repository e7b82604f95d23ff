// Signal probes of a transient. Currents come from each device's own
// report(), the same figures the bias report prints, so both analyses agree
// on names and signs (spec section 3).
#include "analysis/signal_recorder.hpp"

#include <array>

#include "analysis/integration.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

mna::Index node_index(const mna::System& system, const std::string& name) {
  if (name == kGround) return mna::kGroundIndex;
  const auto index = system.topology().find_node(name);
  if (!index) throw Error(ErrorKind::invalid_request, "no node named '" + name + "'", {name});
  return *index;
}

}  // namespace

SignalRecorder::SignalRecorder(const mna::System& system, const std::vector<SignalRef>& wanted,
                               double from, TransientResult& result)
    : system_(system),
      from_(from),
      result_(result),
      zero_(static_cast<std::size_t>(system.size()) + 1, 0.0) {
  if (wanted.empty()) {
    const auto& topology = system.topology();
    const auto add_unknown = [&](mna::Index i) {
      probes_.push_back({i, mna::kGroundIndex, nullptr});
      result_.signals.emplace_back().name = topology.name(i);
    };
    for (mna::Index i = 1; i <= system.size(); ++i) {
      if (topology.is_circuit_node(i)) add_unknown(i);
    }
    for (const auto& d : system.devices()) add_every_current(*d);
    for (mna::Index i = 1; i <= system.size(); ++i) {
      if (topology.kind(i) == mna::UnknownKind::temperature) add_unknown(i);
    }
  }
  for (const SignalRef& ref : wanted) {
    switch (ref.kind) {
      case SignalRef::Kind::node_voltage:
      case SignalRef::Kind::node_pair:
        probes_.push_back(
            {node_index(system, ref.a),
             ref.kind == SignalRef::Kind::node_pair ? node_index(system, ref.b) : mna::kGroundIndex,
             nullptr});
        result_.signals.emplace_back().name = ref.label();
        break;
      case SignalRef::Kind::element_current: {
        const mna::Device* device = system.find_device(ref.a);
        if (device == nullptr)
          throw Error(ErrorKind::invalid_request, "no element named '" + ref.a + "'", {ref.a});
        add_current(*device, ref.label());
        break;
      }
    }
  }
  for (auto* buffer : {&now_, &before_, &stage_, &newest_, &slope_start_, &slope_end_}) {
    buffer->assign(probes_.size(), 0.0);
  }
}

void SignalRecorder::add_every_current(const mna::Device& device) {
  if (!device.reported_current(system_.request(zero_.data()))) return;
  probes_.push_back({mna::kGroundIndex, mna::kGroundIndex, &device});
  result_.signals.emplace_back().name = device.name() + ".current";
}

void SignalRecorder::add_current(const mna::Device& device, const std::string& name) {
  if (!device.reported_current(system_.request(zero_.data()))) {
    throw Error(ErrorKind::invalid_request, "element '" + device.name() + "' reports no current",
                {device.name()});
  }
  probes_.push_back({mna::kGroundIndex, mna::kGroundIndex, &device});
  result_.signals.emplace_back().name = name;
}

void SignalRecorder::read(double t, const std::vector<double>& x, std::span<double> out) const {
  mna::EvalRequest at = system_.request(x.data());
  at.dc = false;
  at.time = t;
  for (std::size_t s = 0; s < probes_.size(); ++s) {
    const Probe& probe = probes_[s];
    out[s] =
        probe.device != nullptr ? *probe.device->reported_current(at) : x[probe.p] - x[probe.n];
  }
}

void SignalRecorder::append(double t, std::span<const double> values) {
  result_.time.push_back(t);
  for (std::size_t s = 0; s < probes_.size(); ++s) {
    TransientSignal& signal = result_.signals[s];
    signal.values.push_back(values[s]);
    // The slope leaving this sample is replaced when the next step is taken.
    signal.slope_in.push_back(slope_end_[s]);
    signal.slope_out.push_back(slope_end_[s]);
  }
}

void SignalRecorder::start(double t, const std::vector<double>& x) {
  read(t, x, now_);
  t_now_ = t;
  if (t >= from_) append(t, now_);
}

void SignalRecorder::advance(double t, const std::vector<double>& x, StepShape shape,
                             double t_stage, const std::vector<double>* x_stage) {
  read(t, x, newest_);
  if (shape == StepShape::line) {
    for (std::size_t s = 0; s < probes_.size(); ++s) {
      slope_start_[s] = slope_end_[s] = (newest_[s] - now_[s]) / (t - t_now_);
    }
  } else {
    const bool inner = shape == StepShape::through_inner_stage;
    if (inner) read(t_stage, *x_stage, stage_);
    const std::vector<double>& third = inner ? stage_ : before_;
    const std::array<double, 3> times{t_now_, inner ? t_stage : t_before_, t};
    std::array<double, 3> at_start{}, at_end{};
    derivative_weights(times, t_now_, at_start);
    derivative_weights(times, t, at_end);
    for (std::size_t s = 0; s < probes_.size(); ++s) {
      slope_start_[s] = at_start[0] * now_[s] + at_start[1] * third[s] + at_start[2] * newest_[s];
      slope_end_[s] = at_end[0] * now_[s] + at_end[1] * third[s] + at_end[2] * newest_[s];
    }
  }
  if (t_now_ >= from_) {
    for (std::size_t s = 0; s < probes_.size(); ++s) {
      result_.signals[s].slope_out.back() = slope_start_[s];
    }
  }
  if (t >= from_) append(t, newest_);
  std::swap(before_, now_);
  std::swap(now_, newest_);
  t_before_ = t_now_;
  t_now_ = t;
}

}  // namespace stage::analysis
