// Where a semiconductor's equations over its own nodes (terminals first,
// then internal nodes) are written: a small dense system (for report() and
// the pattern) or straight into the global arrays (for evaluate()). The
// diode and the bipolar transistor write their branches once, as templates
// over the sink, so that both destinations get the same numbers.
#pragma once

#include <array>
#include <initializer_list>
#include <type_traits>
#include <vector>

#include "mna/device.hpp"
#include "mna/pattern.hpp"

namespace stage::devices {

template <int N>
using LocalMatrix = std::array<std::array<double, N>, N>;

// What a branch carries: a current (into f and G) or a charge (into q and C).
enum class Quantity { current, charge };

// A device's equations written densely over its own nodes: what report()
// reduces to the terminals, and, from one structural evaluation, which
// entries the device ever writes.
template <int N>
struct LocalSystem {
  std::array<double, N> f{}, q{};
  LocalMatrix<N> g{}, c{};
  std::array<std::array<bool, N>, N> used{};

  void add_value(Quantity kind, int i, double v) { (kind == Quantity::current ? f : q)[i] += v; }
  void add_slope(Quantity kind, int i, int j, double v) {
    (kind == Quantity::current ? g : c)[i][j] += v;
    used[i][j] = true;
  }
};

// Global indices of the local nodes and the slots of the entries a device
// writes, handed out by the pattern.
template <int N>
class LocalScatter {
 public:
  explicit LocalScatter(std::array<mna::Index, N> nodes) : nodes_(nodes) {}

  const std::array<mna::Index, N>& nodes() const { return nodes_; }
  mna::Index node(int i) const { return nodes_[i]; }
  // Slot of local entry (i, j); only entries declared as used have one.
  mna::Slot slot(int i, int j) const { return slots_[i][j]; }

  void declare(mna::PatternBuilder& pattern, const std::array<std::array<bool, N>, N>& used) {
    for (int i = 0; i < N; ++i) {
      for (int j = 0; j < N; ++j)
        slots_[i][j] = used[i][j] ? pattern.entry(nodes_[i], nodes_[j]) : -1;
    }
  }

  std::array<double, N> gather(const double* x) const {
    std::array<double, N> local;
    for (int i = 0; i < N; ++i) local[i] = x[nodes_[i]];
    return local;
  }

 private:
  std::array<mna::Index, N> nodes_;
  std::array<std::array<mna::Slot, N>, N> slots_{};
};

// The same equations written straight into the global f, q, G and C
// (device.hpp's layout) through a device's scatter: what evaluate() uses,
// with no dense system to clear and copy.
template <int N>
class DirectStamp {
 public:
  DirectStamp(const LocalScatter<N>& at, mna::EvalOutput& out) : at_(at), out_(out) {}

  void add_value(Quantity kind, int i, double v) const {
    (kind == Quantity::current ? out_.f : out_.q)[at_.node(i)] += v;
  }
  void add_slope(Quantity kind, int i, int j, double v) const {
    (kind == Quantity::current ? out_.g : out_.c)[at_.slot(i, j)] += v;
  }

 private:
  const LocalScatter<N>& at_;
  mna::EvalOutput& out_;
};

// One controlling voltage of a branch, v = polarity * (x[p] - x[n]), with the
// branch's slope dI/dv (or dQ/dv).
struct Control {
  int p, n;
  double slope;
};

// Adds a branch carrying `value` (a current or a charge) into the device at
// local node a and out at b, controlled by `controls`, into any sink above.
// For a pnp (polarity -1) both the controlling voltages and the value are
// mirrored, so the slopes enter with polarity^2 = 1.
template <class Sink>
void add_branch(Sink& s, Quantity kind, double polarity, int a, int b, double value,
                std::initializer_list<Control> controls) {
  s.add_value(kind, a, polarity * value);
  s.add_value(kind, b, -polarity * value);
  for (const Control& k : controls) {
    s.add_slope(kind, a, k.p, k.slope);
    s.add_slope(kind, a, k.n, -k.slope);
    s.add_slope(kind, b, k.p, -k.slope);
    s.add_slope(kind, b, k.n, k.slope);
  }
}

template <class Sink>
void add_current(Sink& s, double polarity, int a, int b, double value,
                 std::initializer_list<Control> controls) {
  add_branch(s, Quantity::current, polarity, a, b, value, controls);
}

template <class Sink>
void add_charge(Sink& s, double polarity, int a, int b, double value,
                std::initializer_list<Control> controls) {
  add_branch(s, Quantity::charge, polarity, a, b, value, controls);
}

// Terminal view of a local system: internal nodes that coincide with a
// terminal (alias[i] != i) are folded into it, the remaining internal nodes
// are eliminated (Schur complement), leaving the conductance matrix seen at
// the `terminals` first local nodes and the currents into them.
struct TerminalView {
  std::vector<double> current;                   // into the device at each terminal
  std::vector<std::vector<double>> conductance;  // d current[i] / d v[j]
};

TerminalView reduce_to_terminals(int size, int terminals, const double* f, const double* g,
                                 const int* alias);

template <int N>
TerminalView reduce_to_terminals(const LocalSystem<N>& s, int terminals,
                                 const std::type_identity_t<std::array<int, N>>& alias) {
  return reduce_to_terminals(N, terminals, s.f.data(), &s.g[0][0], alias.data());
}

}  // namespace stage::devices
