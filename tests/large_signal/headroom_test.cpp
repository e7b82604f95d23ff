// The headroom search and the load-line estimate on stages of our own values
// (tests/headroom/stages.hpp), against the textbook AC load line.
#include "stage/headroom.hpp"

#include <gtest/gtest.h>

#include <cmath>

#include "stages.hpp"

namespace {

using stage::HeadroomOptions;
using stage::SignalRef;

HeadroomOptions options(double limit, std::optional<double> first = std::nullopt) {
  HeadroomOptions o;
  o.input = "vin";
  o.output = SignalRef::node("out");
  o.frequency = 1e3;
  o.distortion_limit = limit;
  o.load = "rl";
  o.first_input_amplitude = first;
  return o;
}

// The AC load of the follower is RE || RL = 1k || 100 = 90.91 ohm (Malvino and
// Bates, AC load lines); the 100 uF coupling capacitor adds 1.6 ohm of
// reactance in series with RL at 1 kHz, which moves |R'ac| by under 1e-3.
TEST(FollowerHeadroom, LoadLineFigures) {
  const auto h = stage::run_headroom(stage::testing::follower_into_low_load(), options(0.01));
  ASSERT_TRUE(h.load_line);
  const auto& line = *h.load_line;
  EXPECT_EQ(line.device, "q1");
  EXPECT_NEAR(line.ac_load, 1e3 * 100 / 1100, 1e-3 * 90.91);
  // The textbook relations between the figures (Malvino and Bates).
  EXPECT_DOUBLE_EQ(line.saturation_current,
                   line.quiescent_current + line.quiescent_vce / line.ac_load);
  EXPECT_DOUBLE_EQ(line.cutoff_vce, line.quiescent_vce + line.quiescent_current * line.ac_load);
  EXPECT_DOUBLE_EQ(line.compliance_peak_to_peak,
                   2 * std::min(line.quiescent_vce, line.quiescent_current * line.ac_load));
  // Hand analysis of the bias: VB = 6 V from the divider less IB * 11k,
  // VE = VB - 0.7 V, IE = VE / 1k: about 5 mA (within the 10 % that the
  // 0.7 V rule and the base current leave).
  EXPECT_NEAR(line.quiescent_current, 5.0e-3, 0.5e-3);
}

// The follower loses its negative half first: the transistor's current
// falls toward zero at ICQ x R'ac of negative swing, while the positive half
// could rise several volts. It clips softly (the exponential junction lowers
// the gain as the current falls), so how close the simulated limit comes to
// ICQ x R'ac depends on the limit: for an ideal exponential follower
// vin = vout + VT ln(1 - vout/(ICQ R'ac)) (large-signal emitter follower,
// Sedra and Smith), whose negative peak falls 1 % short of the small-signal
// prediction at 0.30 ICQ R'ac and 10 % short at 0.94 ICQ R'ac. The AC
// coupling lets the output's average follow the distortion, which relaxes
// the 1 % figure (0.43 here); the bands below hold both.
TEST(FollowerHeadroom, NegativeSideClipsFirstNearTheLoadLineCompliance) {
  const auto tight = stage::run_headroom(stage::testing::follower_into_low_load(), options(0.01));
  const double compliance = tight.load_line->quiescent_current * tight.load_line->ac_load;
  EXPECT_LT(tight.negative.input_amplitude, tight.positive.input_amplitude);
  EXPECT_LT(tight.negative.peak, tight.positive.peak);
  EXPECT_GT(tight.negative.peak, 0.30 * compliance);
  EXPECT_LT(tight.negative.peak, 0.60 * compliance);
  EXPECT_NEAR(tight.symmetric_peak_to_peak, 2 * tight.negative.peak, 1e-12);
  // Past the limit the negative side ends in cutoff of q1.
  ASSERT_TRUE(tight.negative.at_largest_drive);
  EXPECT_EQ(tight.negative.at_largest_drive->mechanism, stage::Mechanism::cutoff);
  EXPECT_EQ(tight.negative.at_largest_drive->device, "q1");

  const auto loose = stage::run_headroom(stage::testing::follower_into_low_load(), options(0.10));
  EXPECT_GT(loose.negative.peak, 0.90 * compliance);
  EXPECT_LT(loose.negative.peak, 1.02 * compliance);
}

// Each limit is converged to 1 % of the input amplitude, so two searches
// started a factor of 50 apart must agree to within 1 %.
TEST(FollowerHeadroom, IndependentOfTheStartingAmplitude) {
  const auto low =
      stage::run_headroom(stage::testing::follower_into_low_load(), options(0.01, 0.01));
  const auto high =
      stage::run_headroom(stage::testing::follower_into_low_load(), options(0.01, 0.5));
  for (auto side : {&stage::HeadroomResult::positive, &stage::HeadroomResult::negative}) {
    const double a = (low.*side).input_amplitude, b = (high.*side).input_amplitude;
    EXPECT_NEAR(a, b, 0.01 * std::max(a, b));
  }
  EXPECT_LT(low.transient_runs, 40);
  EXPECT_LT(high.transient_runs, 40);
}

// The follower's output capacitor charges through the 100 ohm load with a
// time constant of about 100 uF x 100 ohm = 10 ms, ten periods at 1 kHz
// (first-order RC, any circuits text): four periods leave e^-0.4, two
// thirds, of its start-up drift, so a search held to four periods marks its
// clip levels approximate and names the option that lifts the bound; 256
// periods leave e^-25.6, and nothing is marked.
bool names_settle_periods(const stage::HeadroomResult& h) {
  for (const auto& note : h.notes)
    if (note.find("settle_periods") != std::string::npos) return true;
  return false;
}

TEST(FollowerHeadroom, AnUnsettledClipLevelNamesSettlePeriods) {
  auto held = options(0.01);
  held.settle_periods = 4;
  EXPECT_TRUE(
      names_settle_periods(stage::run_headroom(stage::testing::follower_into_low_load(), held)));
  auto raised = options(0.01);
  raised.settle_periods = 256;
  EXPECT_FALSE(
      names_settle_periods(stage::run_headroom(stage::testing::follower_into_low_load(), raised)));
  held.settle_periods = 1;
  EXPECT_THROW(stage::run_headroom(stage::testing::follower_into_low_load(), held), stage::Error);
}

// A common-emitter stage: its collector rises until the transistor cuts off,
// at most ICQ (RC || RL) above the quiescent point, and falls until it
// saturates, at most VCEQ (RC || RL) / R'ac below it (the share of the VCE
// swing that appears across RC || RL; Malvino and Bates, AC load line).
// With a 10 % limit the side limits lie within the last tenth of those.
TEST(CommonEmitterHeadroom, CutoffOnOneSideSaturationOnTheOther) {
  const auto h = stage::run_headroom(stage::testing::common_emitter(), options(0.10));
  ASSERT_TRUE(h.load_line);
  const auto& line = *h.load_line;
  const double rc_rl = 4.7e3 / 2;
  // R'ac measured between collector and emitter: RC || RL plus the 270 ohm
  // left unbypassed (the 470 uF bypass is 0.34 ohm at 1 kHz).
  EXPECT_NEAR(line.ac_load, rc_rl + 270, 1.0);

  EXPECT_EQ(h.positive.cause.mechanism, stage::Mechanism::cutoff);
  EXPECT_EQ(h.negative.cause.mechanism, stage::Mechanism::saturation);
  const double cutoff_swing = line.quiescent_current * rc_rl;
  const double saturation_swing = line.quiescent_vce * rc_rl / line.ac_load;
  EXPECT_LT(h.positive.peak, cutoff_swing);
  EXPECT_GT(h.positive.peak, 0.90 * cutoff_swing);
  EXPECT_LT(h.negative.peak, saturation_swing);
  EXPECT_GT(h.negative.peak, 0.85 * saturation_swing);
}

}  // namespace
