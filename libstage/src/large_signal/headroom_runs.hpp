// The transient runs of one headroom search, by input amplitude, and how
// each criterion judges them: each side's shortfall from the small-signal
// prediction, its 1 dB compression, the THD; where each criterion's limit is
// first crossed, and where each side stops growing. Every run is shared by
// every criterion. The search that chooses the amplitudes is headroom.cpp.
#pragma once

#include <map>
#include <optional>
#include <utility>

#include "large_signal/sine_drive.hpp"
#include "stage/progress.hpp"

namespace stage::analysis {

enum Criterion { kPositive, kNegative, kThd, kPositive1dB, kNegative1dB, kCriteria };

bool positive_side(Criterion c);
// A side's peak excursion from the output's average.
double side_peak(bool positive, const DriveMeasurement& m);

// Two runs: (lower, upper) amplitude, either may be missing.
using RunPair = std::pair<const DriveMeasurement*, const DriveMeasurement*>;

class HeadroomRuns {
 public:
  // `limit` is the distortion limit, `gain` the small-signal gain at the
  // bias point; `progress` is told of every run. `drive` and `progress`
  // must outlive the runs.
  HeadroomRuns(const SineDrive& drive, double limit, double gain, int max_runs,
               const ProgressCallback& progress);

  // The run at `amplitude`, made on first use. Throws a search_exhausted
  // NumericalError when it would be run number max_runs + 1.
  const DriveMeasurement& at(double amplitude);

  // What a criterion measures in a run (a side's shortfall from the
  // prediction, or the THD) and the limit it is held to.
  double value(Criterion c, const DriveMeasurement& m) const;
  double limit(Criterion c) const;
  bool within(Criterion c, const DriveMeasurement& m) const;

  // The first upward crossing of the limit above the smallest amplitude
  // within it: (largest within below it, first beyond).
  RunPair bracket(Criterion c) const;
  bool all_bracketed() const;

  // Where a side stops growing: the first pair of neighbouring runs, above
  // the steepest pair, whose peaks rise by less than a fifth of that
  // steepest incremental gain. (Above the steepest, so that the dead zone of
  // a class-B pair, where the output has not yet started to grow, is not
  // taken for a plateau.) Both ends are present when found.
  std::optional<RunPair> plateau(bool positive) const;

  // The gain the peaks are compared with: the small-signal gain, unless the
  // stage has (almost) none at its bias point, as a class-B pair biased off,
  // whose largest large-signal gain seen so far stands in for it.
  double gain() const;
  bool judged_large_signal() const;

  const std::map<double, DriveMeasurement>& measured() const { return runs_; }
  const DriveMeasurement& smallest() const { return runs_.begin()->second; }
  const DriveMeasurement& largest() const { return runs_.rbegin()->second; }

 private:
  const SineDrive& drive_;
  double limit_;
  double small_signal_gain_;
  int max_runs_;
  double large_signal_gain_ = 0;
  const ProgressCallback& progress_;
  std::map<double, DriveMeasurement> runs_;
};

}  // namespace stage::analysis
