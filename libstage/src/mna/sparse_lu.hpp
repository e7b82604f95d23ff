// The sparse LU behind every analysis: SuiteSparse KLU, real or complex.
//
// Contract (after SUNDIALS' KLU wrapper and Eigen's KLUSupport):
// - the constructor runs the symbolic analysis of a pattern once;
// - factor(values) factors numerically; after the first success it reuses
//   the pivot order (klu_refactor) and falls back to a full factorisation
//   when the reciprocal pivot growth says the old pivots have gone bad;
// - solve(b) overwrites b with the solution;
// - rcond() is KLU's cheap reciprocal condition estimate of the last factor.
// factor() returns false if the matrix is numerically singular; the caller
// decides whether that is recoverable.
#pragma once

#include <complex>
#include <memory>

#include "mna/pattern.hpp"

namespace stage::mna {

template <class Scalar>
class SparseLu {
 public:
  explicit SparseLu(const SparsePattern& pattern);
  ~SparseLu();
  SparseLu(const SparseLu&) = delete;
  SparseLu& operator=(const SparseLu&) = delete;

  // values: nnz entries in the pattern's order (the trash slot is ignored).
  bool factor(const Scalar* values);
  void solve(Scalar* b);
  double rcond();
  // Index (0-based) of the column where the last failed factorisation broke.
  int singular_column() const;
  int full_factorizations() const { return full_factorizations_; }
  int refactorizations() const { return refactorizations_; }

 private:
  struct State;
  const SparsePattern& pattern_;
  std::unique_ptr<State> state_;
  int full_factorizations_ = 0;
  int refactorizations_ = 0;
};

extern template class SparseLu<double>;
extern template class SparseLu<std::complex<double>>;

}  // namespace stage::mna
