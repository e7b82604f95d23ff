// Waveform arguments of spec section 3: given by name only, a pulse's high
// time or duty ratio, and impossible pulses reported where they are written.
#include "reader_test_support.hpp"

namespace stage::testing {
namespace {

// Column (1-based) of `part` in a one-line `text`.
int column_of(const std::string& text, const std::string& part) {
  return static_cast<int>(text.find(part)) + 1;
}

PulseWave pulse_of(const std::string& arguments) {
  const Deck deck = read("v = voltage(a, gnd, wave = pulse(" + arguments + "))\n");
  return std::get<PulseWave>(*element<VoltageSource>(deck, "v").wave);
}

void expect_pulse_error(const std::string& arguments, const std::string& at,
                        const std::string& phrase) {
  const std::string text = "v = voltage(a, gnd, wave = pulse(" + arguments + "))\n";
  expect_error(text, 1, column_of(text, at), phrase);
}

TEST(Waveforms, PositionalArgumentsAreRejectedWithTheKeywordForm) {
  const std::string pulse = "v = voltage(a, gnd, wave = pulse(0 V, 5 V, period = 2 us))\n";
  expect_error(pulse, 1, column_of(pulse, "0 V"),
               "waveform arguments are given by name: pulse(low = …, high = …, period = …, "
               "high_time = … or duty = …");
  const std::string sine = "v = voltage(a, gnd, wave = sine(amplitude = 1 V, 1 kHz))\n";
  expect_error(sine, 1, column_of(sine, "1 kHz"),
               "waveform arguments are given by name: sine(amplitude = …, frequency = …");
}

// 50 % of 2 us is 1 us exactly (a multiplication by one half).
TEST(Waveforms, DutyAndHighTimeDescribeTheSamePulse) {
  const PulseWave by_time = pulse_of("low = 1 V, high = 4 V, period = 2 us, high_time = 1 us");
  const PulseWave by_duty = pulse_of("low = 1 V, high = 4 V, period = 2 us, duty = 50 %");
  EXPECT_EQ(by_time, by_duty);
  EXPECT_EQ(by_duty.high_time, 1e-6);
  // Neither given: half the period.
  EXPECT_EQ(pulse_of("low = 1 V, high = 4 V, period = 2 us"), by_duty);
}

// The spec's defaults: 0 V to 5 V, 2 us period, 50 % duty, 1 ns edges, no delay.
TEST(Waveforms, PulseDefaults) {
  const PulseWave w = pulse_of("");
  EXPECT_EQ(w, (PulseWave{.low = 0,
                          .high = 5,
                          .period = 2e-6,
                          .high_time = 1e-6,
                          .rise = 1e-9,
                          .fall = 1e-9,
                          .delay = 0}));
}

TEST(Waveforms, ImpossiblePulsesAreRejectedWhereTheyAreWritten) {
  expect_pulse_error("period = 2 us, high_time = 1 us, duty = 50 %", "duty", "not both");
  expect_pulse_error("period = 2 us, duty = 150 %", "duty", "from 0 % to 100 %");
  expect_pulse_error("period = 0 s", "period", "period must be positive");
  expect_pulse_error("rise = -1 ns", "rise", "rise cannot be negative");
  // 1 us edges (10-90 %) span 1.25 us each, half of which lies above half
  // amplitude: the high time needs at least 1.25 us.
  expect_pulse_error("period = 10 us, high_time = 1 us, rise = 1 us, fall = 1 us", "high_time",
                     "0.625 × (rise + fall)");
  expect_pulse_error("period = 10 us, duty = 10 %, rise = 1 us, fall = 1 us", "duty",
                     "0.625 × (rise + fall)");
  // 1.5 us high plus half of each 1.25 us edge is 2.75 us, longer than 2 us.
  expect_pulse_error("period = 2 us, high_time = 1.5 us, rise = 1 us, fall = 1 us", "period",
                     "shorter than the pulse");
  expect_pulse_error("period = 2 us, duty = 100 %", "period", "shorter than the pulse");
}

TEST(Waveforms, PiecewiseKeepsItsPositionalPoints) {
  const Deck deck =
      read("i = current(a, gnd, wave = piecewise((0 s, 0 A), (1 ms, 2 mA), repeat = false))\n");
  const auto& w = std::get<PiecewiseWave>(*element<CurrentSource>(deck, "i").wave);
  ASSERT_EQ(w.points.size(), 2u);
  EXPECT_EQ(w.points[1].first, 1e-3);
  EXPECT_FALSE(w.repeat);
}

}  // namespace
}  // namespace stage::testing
