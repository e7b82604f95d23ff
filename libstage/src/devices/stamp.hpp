// Slot groups that recur in device stamps: the 2 x 2 block of a branch
// between two nodes, and the 2 x 2 block of a controlled pair (output nodes
// by controlling nodes).
#pragma once

#include "mna/device.hpp"
#include "mna/pattern.hpp"

namespace stage::devices {

// Entries (r, c), (r, cn), (rn, c), (rn, cn) for output rows r/rn and
// controlling columns c/cn. For a two-terminal element r = c = a, rn = cn = b.
struct PairSlots {
  mna::Slot pp = 0, pn = 0, np = 0, nn = 0;

  void declare(mna::PatternBuilder& pattern, mna::Index r, mna::Index rn, mna::Index c,
               mna::Index cn) {
    pp = pattern.entry(r, c);
    pn = pattern.entry(r, cn);
    np = pattern.entry(rn, c);
    nn = pattern.entry(rn, cn);
  }
  // Adds value * [[1, -1], [-1, 1]].
  void add(double* matrix, double value) const {
    matrix[pp] += value;
    matrix[pn] -= value;
    matrix[np] -= value;
    matrix[nn] += value;
  }
};

// Entries coupling a branch current k with nodes p and n: (p, k), (n, k)
// for KCL and (k, p), (k, n) for the branch equation.
struct BranchSlots {
  mna::Slot p_k = 0, n_k = 0, k_p = 0, k_n = 0;

  void declare(mna::PatternBuilder& pattern, mna::Index p, mna::Index n, mna::Index k) {
    p_k = pattern.entry(p, k);
    n_k = pattern.entry(n, k);
    k_p = pattern.entry(k, p);
    k_n = pattern.entry(k, n);
  }
  // KCL: the branch current leaves p and enters n (sign +1) or the reverse
  // (sign -1); the branch equation holds v(p) - v(n).
  void add(double* g, double kcl_sign) const {
    g[p_k] += kcl_sign;
    g[n_k] -= kcl_sign;
    g[k_p] += 1.0;
    g[k_n] -= 1.0;
  }
};

}  // namespace stage::devices
