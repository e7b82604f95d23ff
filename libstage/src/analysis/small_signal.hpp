// The circuit linearised at its bias point, shared by the small-signal
// analyses: G and C from one evaluation at the operating point, and the
// complex MNA matrix G + jwC on the same compressed-column pattern, factored
// by complex KLU with the symbolic analysis done once for every frequency.
//
// Vectors follow the layout of mna/device.hpp: n + 1 entries, index 0 is
// ground (kept at zero), unknowns 1..n.
#pragma once

#include <complex>
#include <vector>

#include "mna/sparse_lu.hpp"
#include "mna/system.hpp"

namespace stage::analysis {

using Complex = std::complex<double>;

// A linear read-out of a small-signal solution X at angular frequency w:
//   value = sum over terms of (g + jw c) X[unknown].
// A node voltage is one term of g = 1; an element's current is the row of
// that element's own G and C stamp at the terminal it flows in from.
struct Probe {
  struct Term {
    mna::Index unknown = mna::kGroundIndex;
    double g = 0, c = 0;
  };
  std::vector<Term> terms;

  Complex value(const std::vector<Complex>& x, double omega) const;
  Probe scaled(double factor) const;
  // v(p) - v(n); ground contributes nothing.
  static Probe voltage(mna::Index p, mna::Index n = mna::kGroundIndex);
};

class SmallSignalSystem {
 public:
  // x: the bias solution (n + 1 entries). Evaluates G and C there once.
  SmallSignalSystem(const mna::System& system, const std::vector<double>& x);

  const mna::System& system() const { return system_; }
  // G and C at the bias point: nnz + 1 entries, the last is trash.
  const std::vector<double>& conductance() const { return bias_.g; }
  const std::vector<double>& capacitance() const { return bias_.c; }

  // A zeroed right-hand side / solution vector of n + 1 entries.
  std::vector<Complex> make_vector() const;

  // Factors G + jwC (numeric refactorisation after the first call). Throws
  // NumericalError naming the frequency and the unknown when it is singular.
  void factor(double omega);
  // Overwrites b with the solution X of (G + jwC) X = b for the last factor().
  void solve(std::vector<Complex>& b);

  // The small-signal current entering `device` at node `from` and leaving it
  // at `to` (a two-terminal view), read from the device's own stamp at the
  // bias point: the row of `from`, or minus the row of `to` when `from` is
  // ground.
  Probe current_through(mna::Device& device, mna::Index from, mna::Index to) const;

 private:
  const mna::System& system_;
  std::vector<double> x_;
  mna::Workspace bias_;
  std::vector<Complex> values_;  // G + jwC, nnz entries
  mna::SparseLu<Complex> lu_;
};

}  // namespace stage::analysis
