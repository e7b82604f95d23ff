// Compression of declared entries into a compressed-column pattern.
#include "mna/pattern.hpp"

#include <algorithm>

namespace stage::mna {

int SparsePattern::find(Index r, Index c) const {
  if (r <= 0 || c <= 0) return -1;
  const auto begin = row.begin() + column_start[c - 1];
  const auto end = row.begin() + column_start[c];
  const auto it = std::lower_bound(begin, end, r - 1);
  return (it != end && *it == r - 1) ? static_cast<int>(it - row.begin()) : -1;
}

Slot PatternBuilder::entry(Index row, Index col) {
  if (row == kGroundIndex || col == kGroundIndex) {
    return resolving_ ? pattern_.trash() : 0;
  }
  if (!resolving_) {
    entries_.emplace_back(col - 1, row - 1);
    return 0;
  }
  return pattern_.find(row, col);
}

void PatternBuilder::compress() {
  std::sort(entries_.begin(), entries_.end());
  entries_.erase(std::unique(entries_.begin(), entries_.end()), entries_.end());
  const int n = topology_.size();
  pattern_.n = n;
  pattern_.column_start.assign(n + 1, 0);
  pattern_.row.clear();
  pattern_.row.reserve(entries_.size());
  for (const auto& [col, row] : entries_) {
    ++pattern_.column_start[col + 1];
    pattern_.row.push_back(row);
  }
  for (int c = 0; c < n; ++c) pattern_.column_start[c + 1] += pattern_.column_start[c];
  entries_.clear();
  entries_.shrink_to_fit();
  resolving_ = true;
}

}  // namespace stage::mna
