// Peak-keeping decimation of long records for display: the samples of each
// of a fixed number of consecutive time buckets are reduced to those where
// some signal is largest or smallest within the bucket (min/max per bucket),
// so no peak, dip or spike is lost, whatever its width; between the kept
// samples the plotted line is straight. Short records are kept whole.
#pragma once

#include <cstddef>
#include <vector>

namespace stage::report {

// Buckets of a decimated record; a record of at most kKeepWhole samples is
// drawn whole.
inline constexpr std::size_t kDisplayBuckets = 1000;
inline constexpr std::size_t kKeepWhole = 4 * kDisplayBuckets;

// The indices, ascending, of the samples to draw of `count` samples of each
// of `series` (each `count` long): every index when count <= kKeepWhole,
// else the first and the last and, in each of `buckets` consecutive runs of
// samples, the index of each series' largest and smallest value.
std::vector<std::size_t> display_samples(std::size_t count,
                                         const std::vector<const std::vector<double>*>& series,
                                         std::size_t buckets = kDisplayBuckets);

}  // namespace stage::report
