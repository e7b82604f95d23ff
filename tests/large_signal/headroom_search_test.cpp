// The headroom search against a fine reference search: every limit's drive
// bisected to 0.1 % on runs of its own, on the follower and on the class-AB
// push-pull pair (tests/large_signal/stages.hpp), and the runs each search
// takes.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <optional>

#include "large_signal/drive_setup.hpp"
#include "large_signal/headroom_runs.hpp"
#include "large_signal/sine_drive.hpp"
#include "stage/headroom.hpp"
#include "stages.hpp"

namespace {

using stage::analysis::Criterion;

// The reference's bracket, as a ratio of drives: ten times finer than the
// search's 1 % (spec, "The search").
constexpr double kReferenceRatio = 1.001;
// How far from the search's answer the reference looks for its bracket.
constexpr double kReferenceReach = 1.05;

stage::HeadroomOptions options() {
  stage::HeadroomOptions o;
  o.input = "vin";
  o.output = stage::SignalRef::node("out");
  o.frequency = 1e3;
  o.distortion_limit = 0.01;
  o.load = "rl";
  return o;
}

// A fine search of its own: runs on a drive of its own, first at the
// largest drive the search tried (so that its runs simulate as many periods
// as the search's narrowing runs did), then bisection on the logarithm of
// the drive from kReferenceReach either side of the search's answer until
// the bracket is within kReferenceRatio. Returns the largest drive within
// the limit.
class ReferenceSearch {
 public:
  ReferenceSearch(const stage::Circuit& circuit, const stage::HeadroomResult& h)
      : drive_(stage::analysis::with_only_ac_input(circuit, h.options.input), {}, h.options.input,
               h.options.output, h.options.frequency, h.options.settle_periods),
        runs_(drive_, h.options.distortion_limit, h.small_signal_gain, 1000, progress_) {
    const double largest = std::max(h.positive.largest_drive, h.negative.largest_drive);
    if (largest > 0) runs_.at(largest);
  }

  double crossing(Criterion c, double around) {
    double within = around / kReferenceReach, beyond = around * kReferenceReach;
    EXPECT_TRUE(runs_.within(c, runs_.at(within))) << "criterion " << c << " at " << within;
    EXPECT_FALSE(runs_.within(c, runs_.at(beyond))) << "criterion " << c << " at " << beyond;
    while (beyond > kReferenceRatio * within) {
      const double middle = std::sqrt(within * beyond);
      (runs_.within(c, runs_.at(middle)) ? within : beyond) = middle;
    }
    return within;
  }

 private:
  stage::ProgressCallback progress_;
  stage::analysis::SineDrive drive_;
  stage::analysis::HeadroomRuns runs_;
};

// Each of the search's limits lies within its 1 % bracket: the reference's
// answer, itself within 0.1 %, is at most 1 % + 0.1 % away.
void expect_near_reference(double search, double reference, const char* what) {
  EXPECT_NEAR(search, reference, (0.01 + (kReferenceRatio - 1)) * reference) << what;
}

void compare_with_reference(const stage::Circuit& circuit, const stage::HeadroomResult& h) {
  ReferenceSearch reference(circuit, h);
  using namespace stage::analysis;
  expect_near_reference(h.positive.input_amplitude,
                        reference.crossing(kPositive, h.positive.input_amplitude), "positive");
  expect_near_reference(h.negative.input_amplitude,
                        reference.crossing(kNegative, h.negative.input_amplitude), "negative");
  if (h.thd_limit_input_amplitude) {
    expect_near_reference(*h.thd_limit_input_amplitude,
                          reference.crossing(kThd, *h.thd_limit_input_amplitude), "THD");
  }
  if (h.positive.compression_1dB_input_amplitude) {
    const double a = *h.positive.compression_1dB_input_amplitude;
    expect_near_reference(a, reference.crossing(kPositive1dB, a), "positive 1 dB");
  }
  if (h.negative.compression_1dB_input_amplitude) {
    const double a = *h.negative.compression_1dB_input_amplitude;
    expect_near_reference(a, reference.crossing(kNegative1dB, a), "negative 1 dB");
  }
}

// The runs a search takes, against those the search before this one took on
// the same stage (bracketing by doubling, false position on the logarithm
// of the shortfall): 29 on the follower, 20 on the class-AB pair, counted
// when this search replaced it (each restart of a run to settle longer
// counted then as a run; such a run is now continued).
TEST(HeadroomSearch, FollowerMatchesAFineReferenceSearch) {
  const auto circuit = stage::testing::follower_into_low_load();
  const auto h = stage::run_headroom(circuit, options());
  ASSERT_TRUE(h.positive.found && h.negative.found);
  compare_with_reference(circuit, h);
  EXPECT_LT(h.transient_runs, 29);
}

TEST(HeadroomSearch, ClassAbPairMatchesAFineReferenceSearch) {
  const auto circuit = stage::testing::class_ab_pair();
  const auto h = stage::run_headroom(circuit, options());
  ASSERT_TRUE(h.positive.found && h.negative.found);
  compare_with_reference(circuit, h);
  EXPECT_LT(h.transient_runs, 20);
}

}  // namespace
