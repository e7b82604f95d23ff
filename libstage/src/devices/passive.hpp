// Resistor, capacitor and inductor.
#pragma once

#include <memory>

#include "devices/stamp.hpp"
#include "stage/circuit.hpp"

namespace stage::mna {
class Topology;
}

namespace stage::devices {

class ResistorDevice final : public mna::Device {
 public:
  ResistorDevice(std::string name, mna::Index a, mna::Index b, double resistance);
  void declare(mna::PatternBuilder& pattern) override;
  bool set_value(double resistance) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  std::optional<double> reported_current(const mna::EvalRequest& at) const override;

 private:
  mna::Index a_, b_;
  double conductance_;
  PairSlots slots_;
};

// q = C (v(a) - v(b)); open at DC.
class CapacitorDevice final : public mna::Device {
 public:
  CapacitorDevice(std::string name, mna::Index a, mna::Index b, double capacitance,
                  std::optional<double> initial_voltage);
  void declare(mna::PatternBuilder& pattern) override;
  bool set_value(double capacitance) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  // Its initial voltage, v(a) - v(b), when one was given.
  std::optional<mna::InitialCondition> initial_condition() const override;

 private:
  mna::Index a_, b_;
  double capacitance_;
  std::optional<double> initial_voltage_;
  PairSlots slots_;
};

// Branch current i (a to b through it) is an unknown; its row holds
// v(a) - v(b) - d(L i)/dt = 0, so the flux -L i is the branch's "charge".
class InductorDevice final : public mna::Device {
 public:
  InductorDevice(std::string name, mna::Index a, mna::Index b, mna::Index branch, double inductance,
                 std::optional<double> initial_current);
  void declare(mna::PatternBuilder& pattern) override;
  bool set_value(double inductance) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void describe_topology(mna::TopologyCheck& check) const override;
  std::optional<double> reported_current(const mna::EvalRequest& at) const override;
  mna::Index branch() const override { return k_; }
  // Its initial current, a to b through it, on its branch row, when one was given.
  std::optional<mna::InitialCondition> initial_condition() const override;

 private:
  mna::Index a_, b_, k_;
  double inductance_;
  std::optional<double> initial_current_;
  BranchSlots slots_;
  mna::Slot kk_ = 0;
};

// Makes the device of one element: numbers its nodes and branch unknowns in
// `topology`. One overload per element kind; devices/factory.cpp picks it.
std::unique_ptr<mna::Device> make_device(const std::string& name, const Resistor& e,
                                         const Circuit& circuit, mna::Topology& topology);
std::unique_ptr<mna::Device> make_device(const std::string& name, const Capacitor& e,
                                         const Circuit& circuit, mna::Topology& topology);
std::unique_ptr<mna::Device> make_device(const std::string& name, const Inductor& e,
                                         const Circuit& circuit, mna::Topology& topology);

}  // namespace stage::devices
