// KLU calls for real and complex matrices. Complex values are laid out as
// interleaved (re, im) pairs, which std::complex<double> guarantees.
#include "mna/sparse_lu.hpp"

#include <klu.h>

#include <stdexcept>
#include <type_traits>

namespace stage::mna {
namespace {

// Pivot growth below this means the reused pivots amplify rounding badly.
constexpr double kMinimumPivotGrowth = 1e-8;

template <class Scalar>
constexpr bool kComplex = !std::is_same_v<Scalar, double>;

template <class Scalar>
double* raw(Scalar* p) {
  return reinterpret_cast<double*>(p);
}
template <class Scalar>
double* raw(const Scalar* p) {
  return const_cast<double*>(reinterpret_cast<const double*>(p));
}

}  // namespace

template <class Scalar>
struct SparseLu<Scalar>::State {
  klu_common common{};
  klu_symbolic* symbolic = nullptr;
  klu_numeric* numeric = nullptr;
  std::vector<int> column_start, row;

  void free_numeric() {
    if (numeric == nullptr) return;
    if constexpr (kComplex<Scalar>) {
      klu_z_free_numeric(&numeric, &common);
    } else {
      klu_free_numeric(&numeric, &common);
    }
  }
};

template <class Scalar>
SparseLu<Scalar>::SparseLu(const SparsePattern& pattern)
    : pattern_(pattern), state_(std::make_unique<State>()) {
  klu_defaults(&state_->common);
  state_->column_start = pattern.column_start;
  state_->row = pattern.row;
  if (pattern.n > 0) {
    state_->symbolic =
        klu_analyze(pattern.n, state_->column_start.data(), state_->row.data(), &state_->common);
    if (state_->symbolic == nullptr) throw std::runtime_error("KLU symbolic analysis failed");
  }
}

template <class Scalar>
SparseLu<Scalar>::~SparseLu() {
  state_->free_numeric();
  if (state_->symbolic != nullptr) klu_free_symbolic(&state_->symbolic, &state_->common);
}

template <class Scalar>
bool SparseLu<Scalar>::factor(const Scalar* values) {
  if (pattern_.n == 0) return true;
  State& s = *state_;
  double* v = raw(values);
  if (s.numeric != nullptr) {
    int ok;
    if constexpr (kComplex<Scalar>) {
      ok = klu_z_refactor(s.column_start.data(), s.row.data(), v, s.symbolic, s.numeric, &s.common);
      if (ok)
        ok =
            klu_z_rgrowth(s.column_start.data(), s.row.data(), v, s.symbolic, s.numeric, &s.common);
    } else {
      ok = klu_refactor(s.column_start.data(), s.row.data(), v, s.symbolic, s.numeric, &s.common);
      if (ok)
        ok = klu_rgrowth(s.column_start.data(), s.row.data(), v, s.symbolic, s.numeric, &s.common);
    }
    if (ok && s.common.status == KLU_OK && s.common.rgrowth > kMinimumPivotGrowth) {
      ++refactorizations_;
      return true;
    }
    s.free_numeric();
  }
  if constexpr (kComplex<Scalar>) {
    s.numeric = klu_z_factor(s.column_start.data(), s.row.data(), v, s.symbolic, &s.common);
  } else {
    s.numeric = klu_factor(s.column_start.data(), s.row.data(), v, s.symbolic, &s.common);
  }
  ++full_factorizations_;
  if (s.numeric == nullptr || s.common.status != KLU_OK) {
    s.free_numeric();
    return false;
  }
  return true;
}

template <class Scalar>
void SparseLu<Scalar>::solve(Scalar* b) {
  if (pattern_.n == 0) return;
  State& s = *state_;
  if constexpr (kComplex<Scalar>) {
    klu_z_solve(s.symbolic, s.numeric, pattern_.n, 1, raw(b), &s.common);
  } else {
    klu_solve(s.symbolic, s.numeric, pattern_.n, 1, raw(b), &s.common);
  }
}

template <class Scalar>
double SparseLu<Scalar>::rcond() {
  State& s = *state_;
  if (s.numeric == nullptr) return 0.0;
  if constexpr (kComplex<Scalar>) {
    klu_z_rcond(s.symbolic, s.numeric, &s.common);
  } else {
    klu_rcond(s.symbolic, s.numeric, &s.common);
  }
  return s.common.rcond;
}

template <class Scalar>
int SparseLu<Scalar>::singular_column() const {
  return state_->common.singular_col;
}

template class SparseLu<double>;
template class SparseLu<std::complex<double>>;

}  // namespace stage::mna
