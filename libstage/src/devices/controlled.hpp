// The four linear controlled sources. Voltage-output kinds own a branch
// current (delivered out of p, like an independent voltage source);
// current-controlled kinds read the branch current of their sensed element
// (its own, or its ammeter's: devices/ammeter.hpp), which is resolved in
// declare() once every device exists.
#pragma once

#include <memory>

#include "devices/stamp.hpp"
#include "stage/circuit.hpp"

namespace stage::mna {
class Topology;
}

namespace stage::devices {

// v(p) - v(n) = gain * (v(cp) - v(cn))
class VcvsDevice final : public mna::Device {
 public:
  VcvsDevice(std::string name, mna::Index p, mna::Index n, mna::Index cp, mna::Index cn,
             mna::Index branch, double gain);
  void declare(mna::PatternBuilder& pattern) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  std::optional<double> reported_current(const mna::EvalRequest& at) const override;
  mna::Index branch() const override { return k_; }

 private:
  mna::Index p_, n_, cp_, cn_, k_;
  double gain_;
  BranchSlots output_;
  mna::Slot k_cp_ = 0, k_cn_ = 0;
};

// gain * (v(cp) - v(cn)) from a through it to b
class VccsDevice final : public mna::Device {
 public:
  VccsDevice(std::string name, mna::Index a, mna::Index b, mna::Index cp, mna::Index cn,
             double gain);
  void declare(mna::PatternBuilder& pattern) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  std::optional<double> reported_current(const mna::EvalRequest& at) const override;

 private:
  mna::Index a_, b_, cp_, cn_;
  double gain_;
  PairSlots slots_;
};

// gain * i(sense) from a through it to b
class CccsDevice final : public mna::Device {
 public:
  CccsDevice(std::string name, mna::Index a, mna::Index b, std::string sense, double gain);
  void declare(mna::PatternBuilder& pattern) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  std::optional<double> reported_current(const mna::EvalRequest& at) const override;

 private:
  mna::Index a_, b_, s_ = 0;
  std::string sense_;
  double gain_;
  mna::Slot a_s_ = 0, b_s_ = 0;
};

// v(p) - v(n) = gain * i(sense)
class CcvsDevice final : public mna::Device {
 public:
  CcvsDevice(std::string name, mna::Index p, mna::Index n, mna::Index branch, std::string sense,
             double gain);
  void declare(mna::PatternBuilder& pattern) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  std::optional<double> reported_current(const mna::EvalRequest& at) const override;
  mna::Index branch() const override { return k_; }

 private:
  mna::Index p_, n_, k_, s_ = 0;
  std::string sense_;
  double gain_;
  BranchSlots output_;
  mna::Slot k_s_ = 0;
};

// The branch unknown owned by `sense` (sensed_branch_owner), which a
// current-controlled source reads.
mna::Index sensed_branch(mna::PatternBuilder& pattern, const std::string& device,
                         const std::string& sense);

// The factory's overloads (see devices/passive.hpp).
std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const VoltageControlledVoltageSource& e,
                                         const Circuit& circuit, mna::Topology& topology);
std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const VoltageControlledCurrentSource& e,
                                         const Circuit& circuit, mna::Topology& topology);
std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const CurrentControlledCurrentSource& e,
                                         const Circuit& circuit, mna::Topology& topology);
std::unique_ptr<mna::Device> make_device(const std::string& name,
                                         const CurrentControlledVoltageSource& e,
                                         const Circuit& circuit, mna::Topology& topology);

}  // namespace stage::devices
