// The sparsity pattern of G and C, built from the entries devices declare,
// kept in compressed-column form (the layout KLU reads).
#pragma once

#include <utility>
#include <vector>

#include "mna/topology.hpp"
#include "mna/types.hpp"

namespace stage::mna {

// Compressed-column pattern of an n x n matrix over the unknowns 1..n, stored
// 0-based for KLU (unknown k is row/column k - 1). Value arrays laid on it
// have nnz() + 1 entries; the last is the trash slot for ground entries.
struct SparsePattern {
  int n = 0;
  std::vector<int> column_start;  // n + 1
  std::vector<int> row;           // nnz
  int nnz() const { return static_cast<int>(row.size()); }
  int trash() const { return nnz(); }
  // Slot of (row, col) in unknown numbering (1..n), or -1 if absent.
  int find(Index r, Index c) const;
};

// Collects entries in a first pass, then hands out final slots in a second.
class PatternBuilder {
 public:
  explicit PatternBuilder(Topology& topology) : topology_(topology) {}

  Topology& topology() { return topology_; }

  // Slot for (row, col). In the collecting pass the return value is a
  // placeholder; in the resolving pass it is the final slot.
  Slot entry(Index row, Index col);

  // Ends the collecting pass and compresses the pattern.
  void compress();
  bool resolving() const { return resolving_; }
  const SparsePattern& pattern() const { return pattern_; }

 private:
  Topology& topology_;
  bool resolving_ = false;
  std::vector<std::pair<int, int>> entries_;  // (col, row), 0-based
  SparsePattern pattern_;
};

}  // namespace stage::mna
