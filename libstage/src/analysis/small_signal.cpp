// Linearisation at the bias point and the complex solves built on it.
#include "analysis/small_signal.hpp"

#include <string>

#include "common/constants.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {

Complex Probe::value(const std::vector<Complex>& x, double omega) const {
  Complex sum = 0.0;
  for (const Term& t : terms) sum += Complex(t.g, omega * t.c) * x[t.unknown];
  return sum;
}

Probe Probe::scaled(double factor) const {
  Probe p = *this;
  for (Term& t : p.terms) {
    t.g *= factor;
    t.c *= factor;
  }
  return p;
}

Probe Probe::voltage(mna::Index p, mna::Index n) {
  Probe probe;
  if (p != mna::kGroundIndex) probe.terms.push_back({p, 1.0, 0.0});
  if (n != mna::kGroundIndex) probe.terms.push_back({n, -1.0, 0.0});
  return probe;
}

SmallSignalSystem::SmallSignalSystem(const mna::System& system, const std::vector<double>& x)
    : system_(system),
      x_(x),
      bias_(system.make_workspace()),
      values_(static_cast<std::size_t>(system.pattern().nnz())),
      lu_(system.pattern()) {
  system.evaluate(system.request(x_.data()), bias_);
}

std::vector<Complex> SmallSignalSystem::make_vector() const {
  return std::vector<Complex>(static_cast<std::size_t>(system_.size()) + 1);
}

void SmallSignalSystem::factor(double omega) {
  for (std::size_t s = 0; s < values_.size(); ++s) values_[s] = {bias_.g[s], omega * bias_.c[s]};
  if (lu_.factor(values_.data())) return;
  const std::string name = system_.topology().name(lu_.singular_column() + 1);
  throw NumericalError(ErrorKind::singular,
                       "the small-signal system is singular at " + std::to_string(omega / kTwoPi) +
                           " Hz near '" + name +
                           "' (a lossless resonance or a node held only by reactances)",
                       {name});
}

void SmallSignalSystem::solve(std::vector<Complex>& b) {
  lu_.solve(b.data() + 1);
  b[0] = 0.0;  // sources tied to ground wrote into the trash entry
}

Probe SmallSignalSystem::current_through(mna::Device& device, mna::Index from,
                                         mna::Index to) const {
  const bool through_ground = from == mna::kGroundIndex;
  const mna::Index node = through_ground ? to : from;
  Probe probe;
  if (node == mna::kGroundIndex) return probe;
  mna::Workspace own = system_.make_workspace();
  mna::EvalOutput out = own.output();
  device.evaluate(system_.request(x_.data()), out);
  const mna::SparsePattern& pattern = system_.pattern();
  for (mna::Index col = 1; col <= pattern.n; ++col) {
    const int slot = pattern.find(node, col);
    if (slot >= 0 && (own.g[slot] != 0.0 || own.c[slot] != 0.0)) {
      probe.terms.push_back({col, own.g[slot], own.c[slot]});
    }
  }
  return through_ground ? probe.scaled(-1.0) : probe;
}

}  // namespace stage::analysis
