// Assembly of the MNA system from a circuit's devices.
#include "mna/system.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "mna/topology_check.hpp"
#include "stage/errors.hpp"

namespace stage::mna {

System::System(const Circuit& circuit, const ElementMaker& make,
               const std::vector<DeviceMaker>& extra)
    : temperature_(circuit.temperature) {
  for (const Element& element : circuit.elements()) {
    devices_.push_back(make(element, circuit, topology_));
  }
  for (const auto& make : extra) devices_.push_back(make(topology_));
  for (const auto& d : devices_) nonlinear_ = nonlinear_ || d->nonlinear();

  TopologyCheck check(topology_);
  for (const auto& d : devices_) d->describe_topology(check);
  const auto findings = check.findings();
  if (!findings.empty()) {
    std::string message = "the circuit has no unique DC solution: " + findings.front().message;
    for (std::size_t i = 1; i < findings.size(); ++i) message += "; " + findings[i].message;
    std::vector<std::string> involved;
    for (const auto& f : findings)
      involved.insert(involved.end(), f.involved.begin(), f.involved.end());
    throw NumericalError(ErrorKind::topology, message, involved);
  }

  PatternBuilder builder(topology_);
  const int n = topology_.size();
  diagonal_.assign(n + 1, 0);
  for (int pass = 0; pass < 2; ++pass) {
    for (Index i = 1; i <= n; ++i) diagonal_[i] = builder.entry(i, i);
    for (const auto& d : devices_) d->declare(builder);
    if (pass == 0) builder.compress();
  }
  pattern_ = builder.pattern();
  diagonal_[0] = pattern_.trash();
}

Device* System::find_device(const std::string& name) const {
  for (const auto& d : devices_) {
    if (d->name() == name) return d.get();
  }
  return nullptr;
}

Workspace System::make_workspace() const {
  const std::size_t n = static_cast<std::size_t>(size()) + 1;
  const std::size_t nnz = static_cast<std::size_t>(pattern_.nnz()) + 1;
  return {std::vector<double>(n), std::vector<double>(n), std::vector<double>(nnz),
          std::vector<double>(nnz)};
}

void System::evaluate(const EvalRequest& request, Workspace& w) const {
  std::fill(w.f.begin(), w.f.end(), 0.0);
  std::fill(w.q.begin(), w.q.end(), 0.0);
  std::fill(w.g.begin(), w.g.end(), 0.0);
  std::fill(w.c.begin(), w.c.end(), 0.0);
  EvalOutput out = w.output();
  for (const auto& d : devices_) d->evaluate(request, out);
  w.limited = out.limited;
  w.beyond_model_range = out.beyond_model_range;
}

EvalRequest System::request(const double* x) const {
  EvalRequest r;
  r.x = x;
  r.temperature = temperature_;
  return r;
}

std::vector<std::string> System::worst_unknowns(std::span<const double> values, int count) const {
  std::vector<Index> order(static_cast<std::size_t>(size()));
  std::iota(order.begin(), order.end(), 1);
  std::sort(order.begin(), order.end(),
            [&](Index a, Index b) { return std::abs(values[a]) > std::abs(values[b]); });
  std::vector<std::string> names;
  for (int k = 0; k < count && k < static_cast<int>(order.size()); ++k) {
    names.push_back(topology_.name(order[k]));
  }
  return names;
}

std::vector<std::string> System::elements_at(Index i) const {
  if (topology_.kind(i) != UnknownKind::voltage) return {topology_.owner(i)};
  TopologyCheck check(topology_);
  for (const auto& d : devices_) d->describe_topology(check);
  return check.elements_at(i);
}

}  // namespace stage::mna
