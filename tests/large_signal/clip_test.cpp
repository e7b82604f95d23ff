// Clip levels, 1 dB compression, the cause named for a limit, and the stage
// report's power figures: against the textbook AC load line and class-B
// efficiency, Tellegen's theorem, and the defects of issue 10.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <numbers>

#include "stage/characterize.hpp"
#include "stage/headroom.hpp"
#include "stage/reader.hpp"
#include "stages.hpp"

namespace {

using stage::SignalRef;

stage::HeadroomOptions headroom_options() {
  stage::HeadroomOptions o;
  o.input = "vin";
  o.output = SignalRef::node("out");
  o.frequency = 1e3;
  o.distortion_limit = 0.01;
  o.load = "rl";
  return o;
}

stage::CharacterizeResult characterize(const stage::Circuit& circuit) {
  return stage::run_characterize(circuit, {"vin", SignalRef::node("out"), 1e3, "rl"});
}

// A follower into a low load clips on its negative side where its
// transistor cuts off: ICQ x R'ac below the bias point (the AC load line;
// Malvino and Bates, "Electronic Principles", AC load lines; Sedra and
// Smith, emitter follower). The exponential junction rounds the knee: the
// incremental gain falls to a fifth of its largest VT/4 (6 mV) short of the
// cutoff swing, and the coupling capacitor's charge drifts the output a
// little; within 5 %.
TEST(ClipLevel, FollowerNegativeSideClipsAtIcqTimesRac) {
  const auto h = stage::run_headroom(stage::testing::follower_into_low_load(), headroom_options());
  ASSERT_TRUE(h.load_line);
  const double cutoff_swing = h.load_line->quiescent_current * h.load_line->ac_load;
  EXPECT_TRUE(h.negative.clip.plateau);
  EXPECT_EQ(h.negative.clip.cause.mechanism, stage::Mechanism::cutoff);
  EXPECT_EQ(h.negative.clip.cause.device, "q1");
  EXPECT_NEAR(h.negative.clip.peak, cutoff_swing, 0.05 * cutoff_swing);  // ICQ·R'ac, textbook
  // The clip level lies beyond the 1 % shortfall and the 1 dB compression
  // point: the order the definitions give (a side compresses before it
  // stops growing).
  ASSERT_TRUE(h.negative.compression_1dB_peak);
  EXPECT_LT(h.negative.peak, *h.negative.compression_1dB_peak);
  EXPECT_LT(*h.negative.compression_1dB_peak, h.negative.clip.peak);
  // The symmetric clip level is the smaller side's.
  EXPECT_EQ(h.symmetric_clip_peak, std::min(h.positive.clip.peak, h.negative.clip.peak));
}

// A common-emitter stage clips up where its transistor cuts off and down
// where it saturates. On the AC load line (Malvino and Bates) VCE can rise
// by ICQ R'ac and fall by VCEQ - VCE(sat), VCE(sat) about 0.2 V (common
// practice); the output, across RC || RL, sees the share (RC || RL) / R'ac
// of that swing, the rest falling across the 270 ohm left unbypassed.
// Tolerance 10 %: the output is AC-coupled, so its average follows the
// asymmetric clipping (the coupling capacitor recharges) and shifts both
// peaks by a few per cent, and saturation sets in gradually over the last
// tenths of a volt of VCE.
TEST(ClipLevel, CommonEmitterClipsAtItsLoadLineSwings) {
  const auto h = stage::run_headroom(stage::testing::common_emitter(), headroom_options());
  ASSERT_TRUE(h.load_line);
  const auto& line = *h.load_line;
  const double share = (4.7e3 / 2) / line.ac_load;
  const double cutoff_swing = line.quiescent_current * line.ac_load * share;
  const double saturation_swing = (line.quiescent_vce - 0.2) * share;
  EXPECT_TRUE(h.positive.clip.plateau);
  EXPECT_TRUE(h.negative.clip.plateau);
  EXPECT_EQ(h.positive.clip.cause.mechanism, stage::Mechanism::cutoff);
  EXPECT_EQ(h.negative.clip.cause.mechanism, stage::Mechanism::saturation);
  EXPECT_NEAR(h.positive.clip.peak, cutoff_swing, 0.10 * cutoff_swing);  // ICQ·R'ac
  EXPECT_NEAR(h.negative.clip.peak, saturation_swing,
              0.10 * saturation_swing);  // VCEQ − VCE(sat)
}

// Class-B efficiency for a sine of peak Vp on rails of VCC is (pi/4)(Vp/VCC)
// (Sedra and Smith, class B output stage). At the clip level the peaks are
// slightly flattened (THD a few per cent), which raises the efficiency above
// the sine figure for the fundamental (a square wave would reach 100 %):
// within 5 % of the formula at the fundamental's amplitude.
TEST(ClipLevel, ClassBEfficiencyAtTheClipLevelIsQuarterPiTimesVpOverVcc) {
  const auto r = characterize(stage::testing::class_b_pair());
  ASSERT_TRUE(r.full_swing);
  const auto& full = *r.full_swing;
  const double expected = std::numbers::pi / 4 * full.output_amplitude / 12.0;
  EXPECT_NEAR(full.efficiency, expected, 0.05 * expected);  // π/4·Vp/VCC, Sedra and Smith
  // Full swing is the clip level, not the microvolts where the dead zone's
  // THD passes 1 %: most of the rail (a driver on ±12 V rails reaches the
  // bases at most 12 V from ground, one VBE and the drop in 100 ohm short).
  EXPECT_GT(full.output_amplitude, 0.85 * 12.0);
  ASSERT_TRUE(r.half_swing);
  EXPECT_NEAR(r.half_swing->input_amplitude, 0.5 * full.input_amplitude,
              1e-12 * full.input_amplitude);  // half swing is half the drive, by definition
}

// supply + drive = load + dissipation + stored on every row: each term is
// summed from its own elements' terminal voltages and currents, and they
// must agree (Tellegen's theorem: the terminal powers of a circuit sum to
// zero at every instant). What is left is the quadrature of the capacitors'
// share, second order in the step (400 steps a period: (1/400)^2 = 6e-6),
// within 1e-5. Measured at most 4.4e-9 (class B; the others below 2e-10)
// since the ledger's period starts on a step; 1.6e-6 while its first step
// was interpolated. Supplies never absorb power.
void expect_balanced(const stage::CharacterizeResult& r, const std::string& name) {
  int rows = 0;
  for (const auto* row : {&r.half_swing, &r.full_swing, &r.limit_swing}) {
    if (!*row) continue;
    ++rows;
    const auto& s = **row;
    const double delivered = s.supply_power + s.drive_power;
    const double used = s.load_power + s.dissipation + s.stored_power;
    EXPECT_GT(s.supply_power, 0) << name;
    EXPECT_NEAR(delivered, used, 1e-5 * delivered) << name;  // Tellegen's theorem
    EXPECT_GE(s.efficiency, 0) << name;
    EXPECT_LT(s.efficiency, 1) << name;
  }
  EXPECT_GE(rows, 2) << name;  // full and half swing at least
}

TEST(EnergyBalance, EveryRowOfTheTestStages) {
  expect_balanced(characterize(stage::testing::follower_into_low_load()), "follower");
  expect_balanced(characterize(stage::testing::common_emitter()), "common emitter");
  expect_balanced(characterize(stage::testing::class_b_pair()), "class B");
  expect_balanced(characterize(stage::testing::class_ab_pair()), "class AB");
  expect_balanced(characterize(stage::testing::class_a_emitter_load()), "class A");
}

// Every example circuit, with a characterize statement where it has none.
TEST(EnergyBalance, EveryRowOfTheExamples) {
  const std::filesystem::path examples = std::string(STAGE_SOURCE_DIR) + "/apps/examples";
  int files = 0;
  for (const auto& entry : std::filesystem::directory_iterator(examples)) {
    if (entry.path().extension() != ".stage") continue;
    ++files;
    const stage::Deck deck = stage::read_file(entry.path());
    expect_balanced(characterize(deck.circuit), entry.path().filename().string());
  }
  EXPECT_EQ(files, 3);  // follower, class AB, class B
}

// Issue 10, defect 4: a bare pair driven from an ideal source on ±15 V into
// 8 ohm reported 15.13 V out of ±15 V rails, −6.6 MW of supply power and
// 0 % efficiency. The drive is now bounded by what a driver on the rails can
// deliver (15 V), and the result says so.
TEST(StageReportRegression, BarePairIdealSourceStaysWithinTheRails) {
  const auto r = characterize(stage::testing::bare_pair_8ohm());
  EXPECT_EQ(r.headroom.largest_drive_allowed, 15.0);  // half the span of ±15 V, exact
  ASSERT_TRUE(r.full_swing);
  const auto& full = *r.full_swing;
  EXPECT_LE(full.input_amplitude, 15.0);
  EXPECT_LT(full.output_amplitude, 15.0);
  EXPECT_GT(full.output_amplitude, 12.0);  // one VBE (about 0.9 V at 1.7 A) below the drive
  EXPECT_GT(full.supply_power, 0);
  // π/4·Vp/VCC with a 5 % margin for the flattened peaks (Sedra and Smith).
  const double expected = std::numbers::pi / 4 * full.output_amplitude / 15.0;
  EXPECT_NEAR(full.efficiency, expected, 0.05 * expected);
  EXPECT_EQ(r.headroom.positive.clip.cause.mechanism, stage::Mechanism::drive_limit);
  bool noted = false;
  for (const auto& note : r.headroom.notes) {
    noted = noted || note.find("what a driver on these rails can deliver") != std::string::npos;
  }
  EXPECT_TRUE(noted);
}

// Issue 10, defect 4: the class-B example with a characterize statement
// reported a "full swing" of 16 µV and 0.018 % efficiency.
TEST(StageReportRegression, ClassBExampleFullSwingIsTheClipLevel) {
  const stage::Deck deck =
      stage::read_file(std::string(STAGE_SOURCE_DIR) + "/apps/examples/push_pull_class_b.stage");
  const auto r = characterize(deck.circuit);
  ASSERT_TRUE(r.full_swing);
  EXPECT_GT(r.full_swing->output_amplitude, 10.0);  // most of the 12 V rail
  const double expected = std::numbers::pi / 4 * r.full_swing->output_amplitude / 12.0;
  EXPECT_NEAR(r.full_swing->efficiency, expected, 0.05 * expected);  // π/4·Vp/VCC
  EXPECT_FALSE(r.limit_swing);  // its sides never reach the 1 % limit
}

// A class-B pair's distortion is crossover: the halves hand the output over
// through a dead zone (Sedra and Smith, class B output stage).
TEST(LimitCause, ClassBDistortionIsCrossover) {
  const auto h = stage::run_headroom(stage::testing::class_b_pair(), headroom_options());
  ASSERT_TRUE(h.thd_limit_cause);
  EXPECT_EQ(h.thd_limit_cause->mechanism, stage::Mechanism::crossover);
}

// A class-AB pair with 10 ohm emitter resistors (about 7 mA each) held to
// 0.1 %: each side falls short while one half hands the output to the other,
// both still conducting (crossover distortion of class AB: the pair's gain
// changes as one half takes over; Sedra and Smith, class AB output stage).
// Named crossover, not cutoff of a device that still carries mA.
TEST(LimitCause, ClassAbHandOverIsCrossover) {
  auto o = headroom_options();
  o.distortion_limit = 0.001;
  const auto h = stage::run_headroom(stage::testing::class_ab_pair(0, 10.0), o);
  ASSERT_TRUE(h.positive.found);
  ASSERT_TRUE(h.negative.found);
  EXPECT_EQ(h.positive.cause.mechanism, stage::Mechanism::crossover);
  EXPECT_EQ(h.positive.cause.device, "qp");  // the half handing over on the positive peak
  EXPECT_EQ(h.negative.cause.mechanism, stage::Mechanism::crossover);
  EXPECT_EQ(h.negative.cause.device, "qn");
}

// In a common-emitter stage driving a follower, the common-emitter stage
// makes the distortion: its gain is gm RC, which follows its current, while
// the follower's is gm R / (1 + gm R) with gm R near 20, which hardly moves
// even though its current swings further (Sedra and Smith, emitter follower).
TEST(LimitCause, DistortionIsBlamedOnTheCommonEmitterStage) {
  const auto h =
      stage::run_headroom(stage::testing::common_emitter_into_follower(), headroom_options());
  ASSERT_TRUE(h.positive.found);
  EXPECT_EQ(h.positive.cause.mechanism, stage::Mechanism::distortion);
  EXPECT_EQ(h.positive.cause.device, "q1");
}

}  // namespace
