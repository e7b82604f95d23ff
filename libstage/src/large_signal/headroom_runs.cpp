// The headroom search's runs and their criteria: see headroom_runs.hpp.
#include "large_signal/headroom_runs.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <string>

#include "common/constants.hpp"
#include "common/si_format.hpp"
#include "stage/errors.hpp"

namespace stage::analysis {
namespace {

// A side has clipped where its peak's incremental gain against the drive
// falls below this fraction of its largest (-14 dB): a common-emitter stage
// that saturates keeps following its input through the emitter at about a
// tenth of its gain, which is clipping to a designer.
constexpr double kPlateauFraction = 0.2;
// 1 dB compression: the peak falls short of the prediction by 10^(-1/20).
const double kOneDbShortfall = 1.0 - amplitude_ratio_from_db(-1.0);
// A stage whose small-signal gain is below this fraction of its largest
// large-signal gain is biased off (class B): a biased stage compresses as
// it is driven harder, so its large-signal gain does not reach twice it.
constexpr double kBiasedOffGainFraction = 0.5;

}  // namespace

bool positive_side(Criterion c) { return c == kPositive || c == kPositive1dB; }

double side_peak(bool positive, const DriveMeasurement& m) {
  return positive ? m.positive_peak : m.negative_peak;
}

HeadroomRuns::HeadroomRuns(const SineDrive& drive, double limit, double gain, int max_runs,
                           const ProgressCallback& progress)
    : drive_(drive),
      limit_(limit),
      small_signal_gain_(gain),
      max_runs_(max_runs),
      progress_(progress) {}

const DriveMeasurement& HeadroomRuns::at(double amplitude) {
  auto it = runs_.find(amplitude);
  if (it != runs_.end()) return it->second;
  if (progress_) {
    progress_("headroom: run " + std::to_string(runs_.size() + 1) + ", input amplitude " +
              text::si(amplitude, "V"));
  }
  if (static_cast<int>(runs_.size()) >= max_runs_) {
    throw NumericalError(
        ErrorKind::search_exhausted,
        "the headroom search did not converge in " + std::to_string(max_runs_) + " transient runs",
        {});
  }
  const auto& m = runs_.emplace(amplitude, drive_.measure(amplitude)).first->second;
  large_signal_gain_ = std::max(large_signal_gain_, m.fundamental / amplitude);
  return m;
}

double HeadroomRuns::value(Criterion c, const DriveMeasurement& m) const {
  const double predicted = gain() * m.amplitude;
  // Clipping is a shortfall: a peak that overshoots the prediction is
  // distortion, which the THD limit judges, not a limit of that side.
  return c == kThd ? m.thd : 1.0 - side_peak(positive_side(c), m) / predicted;
}

double HeadroomRuns::limit(Criterion c) const {
  return c == kPositive1dB || c == kNegative1dB ? kOneDbShortfall : limit_;
}

bool HeadroomRuns::within(Criterion c, const DriveMeasurement& m) const {
  return value(c, m) <= limit(c);
}

RunPair HeadroomRuns::bracket(Criterion c) const {
  const DriveMeasurement* ok = nullptr;
  for (const auto& [a, m] : runs_) {
    if (within(c, m)) {
      ok = &m;
    } else if (ok != nullptr) {
      return {ok, &m};
    }
  }
  return {ok, nullptr};
}

bool HeadroomRuns::all_bracketed() const {
  for (int c = 0; c < kCriteria; ++c) {
    if (bracket(Criterion(c)).second == nullptr) return false;
  }
  return true;
}

std::optional<RunPair> HeadroomRuns::plateau(bool positive) const {
  const auto slope = [&](const auto& lo, const auto& hi) {
    return (side_peak(positive, hi) - side_peak(positive, lo)) / (hi.amplitude - lo.amplitude);
  };
  double steepest = 0;
  auto steepest_at = runs_.end();
  for (auto lo = runs_.begin(), hi = std::next(lo); hi != runs_.end(); ++lo, ++hi) {
    if (const double g = slope(lo->second, hi->second); g > steepest) {
      steepest = g;
      steepest_at = hi;
    }
  }
  if (steepest_at == runs_.end()) return std::nullopt;
  for (auto lo = std::prev(steepest_at), hi = steepest_at; hi != runs_.end(); ++lo, ++hi) {
    if (slope(lo->second, hi->second) < kPlateauFraction * steepest) {
      return RunPair{&lo->second, &hi->second};
    }
  }
  return std::nullopt;
}

double HeadroomRuns::gain() const {
  return judged_large_signal() ? large_signal_gain_ : small_signal_gain_;
}

bool HeadroomRuns::judged_large_signal() const {
  return small_signal_gain_ < kBiasedOffGainFraction * large_signal_gain_;
}

}  // namespace stage::analysis
