// Min/max-per-bucket decimation (see decimate.hpp).
#include "report/decimate.hpp"

#include <algorithm>
#include <numeric>

namespace stage::report {

std::vector<std::size_t> display_samples(std::size_t count,
                                         const std::vector<const std::vector<double>*>& series,
                                         std::size_t buckets) {
  std::vector<std::size_t> kept;
  if (count <= kKeepWhole || count <= 2 * buckets) {
    kept.resize(count);
    std::iota(kept.begin(), kept.end(), std::size_t{0});
    return kept;
  }
  kept.push_back(0);
  for (std::size_t b = 0; b < buckets; ++b) {
    const std::size_t begin = b * count / buckets, end = (b + 1) * count / buckets;
    const std::size_t first_new = kept.size();
    for (const auto* values : series) {
      const auto from = values->begin() + static_cast<std::ptrdiff_t>(begin);
      const auto to = values->begin() + static_cast<std::ptrdiff_t>(end);
      const auto [low, high] = std::minmax_element(from, to);
      kept.push_back(static_cast<std::size_t>(low - values->begin()));
      kept.push_back(static_cast<std::size_t>(high - values->begin()));
    }
    std::sort(kept.begin() + static_cast<std::ptrdiff_t>(first_new), kept.end());
  }
  kept.push_back(count - 1);
  kept.erase(std::unique(kept.begin(), kept.end()), kept.end());
  return kept;
}

}  // namespace stage::report
