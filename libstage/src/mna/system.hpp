// A circuit turned into its MNA system: the devices, the numbering of the
// unknowns, the sparse pattern, and evaluation of f, q, G and C at a point.
#pragma once

#include <functional>
#include <memory>
#include <span>
#include <string>
#include <vector>

#include "mna/device.hpp"
#include "mna/pattern.hpp"
#include "mna/topology.hpp"
#include "stage/circuit.hpp"

namespace stage::mna {

// Values of one evaluation, laid out as described in device.hpp.
struct Workspace {
  std::vector<double> f, q;         // n + 1
  std::vector<double> g, c;         // nnz + 1
  bool limited = false;             // some device evaluated at a limited junction voltage
  bool beyond_model_range = false;  // some device evaluated outside its model's range
  // For a system without nonlinear devices: the constant stamp g and c hold
  // unchanged (System::stamp_version), so that an evaluation need not copy
  // them again and a solver may keep a factorisation built from them; -1
  // when they hold anything else.
  int stamp_version = -1;
  EvalOutput output() { return {f.data(), q.data(), g.data(), c.data()}; }
};

class System {
 public:
  // Makes the device of one element, numbering its nodes in the topology.
  using ElementMaker =
      std::function<std::unique_ptr<Device>(const Element&, const Circuit&, Topology&)>;
  // Makes a device that no element describes (tests add model devices this
  // way), numbering its nodes in the topology it is given.
  using DeviceMaker = std::function<std::unique_ptr<Device>(Topology&)>;
  // One device per element from `make`, then the extra ones; throws a
  // topology Error if the graph is singular at DC (floating node, voltage
  // loop, current cut-set). The element factory lives above this layer:
  // stage::assemble (simulation/assemble.hpp) passes it in.
  System(const Circuit& circuit, const ElementMaker& make,
         const std::vector<DeviceMaker>& extra = {});

  int size() const { return topology_.size(); }
  const Topology& topology() const { return topology_; }
  const SparsePattern& pattern() const { return pattern_; }
  std::span<const std::unique_ptr<Device>> devices() const { return devices_; }
  Device* find_device(const std::string& name) const;
  bool nonlinear() const { return nonlinear_; }
  double temperature() const { return temperature_; }
  void set_temperature(double kelvin) { temperature_ = kelvin; }

  // Slot of the diagonal entry of unknown i (present for every unknown).
  Slot diagonal(Index i) const { return diagonal_[i]; }

  Workspace make_workspace() const;
  // Fills `w` at request.x: the linear devices' constant G and C and their
  // products with x, their excitations, then every nonlinear device's share.
  void evaluate(const EvalRequest& request, Workspace& w) const;

  // Change a device's own value (Device::set_value), keeping the constant
  // stamp in step. (A waveform is no part of it: Device::set_waveform
  // directly.)
  bool set_value(Device& device, double value);
  // request with this system's temperature filled in.
  EvalRequest request(const double* x) const;

  // Nodes and elements behind the largest entries of a residual, for messages.
  std::vector<std::string> worst_unknowns(std::span<const double> values, int count) const;
  // The elements connected to unknown i (a node) or owning it (a branch
  // current, a temperature), for messages.
  std::vector<std::string> elements_at(Index i) const;

 private:
  Topology topology_;
  std::vector<std::unique_ptr<Device>> devices_;
  SparsePattern pattern_;
  std::vector<Slot> diagonal_;
  bool nonlinear_ = false;
  // The devices evaluate() calls: the linear ones with an excitation, and
  // the nonlinear ones. The other linear devices live in the constant stamp.
  std::vector<Device*> excited_, nonlinear_devices_;
  // G and C of every linear device, summed; made again by the first
  // evaluation after a set_value (a System serves one thread at a time).
  mutable std::vector<double> constant_g_, constant_c_;
  mutable bool constant_stale_ = true;
  mutable int stamp_version_ = 0;
  void make_constant_stamp() const;
  double temperature_ = kRoomTemperature;
};

}  // namespace stage::mna
