// Assembly of the MNA system from a circuit's devices.
#include "mna/system.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <stdexcept>

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
  for (const auto& d : devices_) {
    nonlinear_ = nonlinear_ || d->nonlinear();
    if (d->nonlinear()) {
      nonlinear_devices_.push_back(d.get());
    } else if (d->has_excitation()) {
      excited_.push_back(d.get());
    }
  }

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

namespace {

// f = G x, and q = C x when `charges`, over unknowns 1..n in one pass (f[0]
// and q[0], ground's row, stay 0), G and C in the compressed-column values
// of `pattern`.
void multiply(const SparsePattern& pattern, const std::vector<double>& g,
              const std::vector<double>& c, const double* x, bool charges, std::vector<double>& f,
              std::vector<double>& q) {
  std::fill(f.begin(), f.end(), 0.0);
  if (charges) std::fill(q.begin(), q.end(), 0.0);
  for (int col = 0; col < pattern.n; ++col) {
    const double xc = x[col + 1];
    if (xc == 0.0) continue;
    for (int s = pattern.column_start[col]; s < pattern.column_start[col + 1]; ++s) {
      const int r = pattern.row[s] + 1;
      f[r] += g[s] * xc;
      if (charges) q[r] += c[s] * xc;
    }
  }
}

}  // namespace

// Every linear device evaluated at x = 0: its G and C are the same at every
// x, and the f it leaves there is its excitation, which is not kept. A
// device that leaves an f there without saying it has an excitation breaks
// the contract of device.hpp, and the evaluations would lose its f.
void System::make_constant_stamp() const {
  Workspace w = make_workspace();
  const std::vector<double> zero(w.f.size(), 0.0);
  EvalOutput out = w.output();
  const EvalRequest at = request(zero.data());
  const auto leaves_f = [&] {
    return std::any_of(w.f.begin() + 1, w.f.end(), [](double v) { return v != 0.0; });
  };
  for (const auto& d : devices_) {
    if (!d->nonlinear() && !d->has_excitation()) d->evaluate(at, out);
  }
  if (leaves_f()) {
    for (const auto& d : devices_) {  // which one: only on this failure
      if (d->nonlinear() || d->has_excitation()) continue;
      std::fill(w.f.begin(), w.f.end(), 0.0);
      d->evaluate(at, out);
      if (leaves_f()) throw std::logic_error("device '" + d->name() + "' hides an excitation");
    }
  }
  for (Device* d : excited_) d->evaluate(at, out);
  constant_g_ = std::move(w.g);
  constant_c_ = std::move(w.c);
  constant_stale_ = false;
  ++stamp_version_;
}

void System::evaluate(const EvalRequest& request, Workspace& w) const {
  if (constant_stale_) make_constant_stamp();
  const bool linear = nonlinear_devices_.empty();
  // A linear system's workspace keeps the whole constant stamp; otherwise C
  // is written only when charges are asked for.
  const bool charges = linear || request.charges;
  if (!linear || w.stamp_version != stamp_version_) {
    std::copy(constant_g_.begin(), constant_g_.end(), w.g.begin());
    if (charges) std::copy(constant_c_.begin(), constant_c_.end(), w.c.begin());
  }
  w.stamp_version = linear ? stamp_version_ : -1;
  multiply(pattern_, constant_g_, constant_c_, request.x, charges, w.f, w.q);
  for (const Device* d : excited_) d->add_excitation(request, w.f.data());
  EvalOutput out = w.output();
  for (Device* d : nonlinear_devices_) d->evaluate(request, out);
  w.limited = out.limited;
  w.beyond_model_range = out.beyond_model_range;
}

bool System::set_value(Device& device, double value) {
  if (!device.set_value(value)) return false;
  if (!device.nonlinear()) constant_stale_ = true;
  return true;
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
