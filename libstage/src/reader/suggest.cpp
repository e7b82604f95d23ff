// Nearest-name suggestions for unknown parameters, arguments, functions and
// names, ranked by Levenshtein edit distance.
#include "reader/suggest.hpp"

#include <algorithm>
#include <numeric>

namespace stage::reader {
namespace {

// Longer names are no typing slips a suggestion could mend, and the edit
// distance costs the product of the lengths: beyond this, none is offered.
constexpr std::size_t kLongestSuggested = 64;

std::size_t edit_distance(std::string_view a, std::string_view b) {
  std::vector<std::size_t> row(b.size() + 1);
  std::iota(row.begin(), row.end(), 0);
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diagonal = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t above = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] != b[j - 1] ? 1 : 0)});
      diagonal = above;
    }
  }
  return row[b.size()];
}

}  // namespace

std::vector<std::string> nearest_names(std::string_view written,
                                       const std::vector<std::string>& candidates) {
  if (written.size() > kLongestSuggested) return {};
  const std::size_t limit = std::max<std::size_t>(2, (written.size() + 1) / 2);
  std::vector<std::pair<std::size_t, std::size_t>> ranked;  // (distance, index)
  for (std::size_t i = 0; i < candidates.size(); ++i) {
    const std::size_t size = candidates[i].size();
    // The distance is at least the difference of the lengths.
    if (size > written.size() + limit || size + limit < written.size()) continue;
    const std::size_t d = edit_distance(written, candidates[i]);
    if (d <= limit) ranked.emplace_back(d, i);
  }
  std::stable_sort(ranked.begin(), ranked.end(),
                   [](const auto& x, const auto& y) { return x.first < y.first; });
  std::vector<std::string> names;
  for (std::size_t k = 0; k < ranked.size() && k < 3; ++k) {
    names.push_back(candidates[ranked[k].second]);
  }
  return names;
}

std::string suggestion(std::string_view written, const std::vector<std::string>& candidates) {
  const std::vector<std::string> names = nearest_names(written, candidates);
  if (names.empty()) return {};
  std::string text = " (nearest: ";
  for (std::size_t i = 0; i < names.size(); ++i) text += (i ? ", " : "") + names[i];
  return text + ")";
}

}  // namespace stage::reader
