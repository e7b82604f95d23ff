// A device's equations written on a small dense system over its own nodes
// (terminals first, then internal nodes), and the scatter of that system into
// the global slots. The diode and the bipolar transistor compute their
// currents, charges and derivatives here once, so that evaluate() (scatter)
// and report() (reduction to the terminals) share the same numbers.
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

template <int N>
struct LocalSystem {
  std::array<double, N> f{}, q{};
  LocalMatrix<N> g{}, c{};
  // Entries ever written; read once, from a structural evaluation, to declare
  // the pattern.
  std::array<std::array<bool, N>, N> used{};
};

// One controlling voltage of a branch, v = polarity * (x[p] - x[n]), with the
// branch's slope dI/dv (or dQ/dv).
struct Control {
  int p, n;
  double slope;
};

// Adds a branch carrying `value` (a current or a charge) into the device at
// local node a and out at b, controlled by `controls`. For a pnp (polarity
// -1) both the controlling voltages and the value are mirrored, so the
// slopes enter with polarity^2 = 1.
template <int N>
void add_branch(std::array<double, N>& values, LocalMatrix<N>& slopes,
                std::array<std::array<bool, N>, N>& used, double polarity, int a, int b,
                double value, std::initializer_list<Control> controls) {
  values[a] += polarity * value;
  values[b] -= polarity * value;
  for (const Control& k : controls) {
    slopes[a][k.p] += k.slope;
    slopes[a][k.n] -= k.slope;
    slopes[b][k.p] -= k.slope;
    slopes[b][k.n] += k.slope;
    used[a][k.p] = used[a][k.n] = used[b][k.p] = used[b][k.n] = true;
  }
}

template <int N>
void add_current(LocalSystem<N>& s, double polarity, int a, int b, double value,
                 std::initializer_list<Control> controls) {
  add_branch<N>(s.f, s.g, s.used, polarity, a, b, value, controls);
}

template <int N>
void add_charge(LocalSystem<N>& s, double polarity, int a, int b, double value,
                std::initializer_list<Control> controls) {
  add_branch<N>(s.q, s.c, s.used, polarity, a, b, value, controls);
}

// Global indices of the local nodes and the slots of the used entries.
template <int N>
class LocalScatter {
 public:
  explicit LocalScatter(std::array<mna::Index, N> nodes) : nodes_(nodes) {}

  const std::array<mna::Index, N>& nodes() const { return nodes_; }

  void declare(mna::PatternBuilder& pattern, const std::array<std::array<bool, N>, N>& used) {
    entries_.clear();
    for (int i = 0; i < N; ++i) {
      for (int j = 0; j < N; ++j) {
        if (used[i][j]) entries_.push_back({i, j, pattern.entry(nodes_[i], nodes_[j])});
      }
    }
  }

  std::array<double, N> gather(const double* x) const {
    std::array<double, N> local;
    for (int i = 0; i < N; ++i) local[i] = x[nodes_[i]];
    return local;
  }

  void scatter(const LocalSystem<N>& s, mna::EvalOutput& out) const {
    for (int i = 0; i < N; ++i) {
      out.f[nodes_[i]] += s.f[i];
      out.q[nodes_[i]] += s.q[i];
    }
    for (const Entry& e : entries_) {
      out.g[e.slot] += s.g[e.row][e.col];
      out.c[e.slot] += s.c[e.row][e.col];
    }
  }

 private:
  struct Entry {
    int row, col;
    mna::Slot slot;
  };
  std::array<mna::Index, N> nodes_;
  std::vector<Entry> entries_;
};

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
