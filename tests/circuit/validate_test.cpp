// One validation path: the same rules hold for a circuit read from text and
// one built in C++, every non-finite value is named before anything runs,
// and what `stage check` passes does not fail later for a reason validation
// could have known (a distortion limit of 150 %, a negative saturation
// current).
#include "stage/validate.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <limits>
#include <string>

#include "large_signal/stages.hpp"
#include "stage/errors.hpp"
#include "stage/headroom.hpp"
#include "stage/reader.hpp"
#include "stage/run.hpp"
#include "stage/simulation.hpp"

namespace {

using stage::Circuit;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kInf = std::numeric_limits<double>::infinity();

// The problem validate(circuit) finds, or "" when it finds none.
std::string subject_of(const Circuit& c) {
  const auto p = stage::validate(c);
  return p ? p->subject : "";
}

TEST(Validate, NonFiniteElementValuesAreNamed) {
  const Circuit good = stage::testing::follower_into_low_load();
  EXPECT_EQ(subject_of(good), "");
  for (double bad : {kNaN, kInf, -1.0, 0.0}) {
    Circuit c = good;
    c.find("re")->data = stage::Resistor{"emitter", "gnd", bad};
    EXPECT_EQ(subject_of(c), "re") << bad;
  }
  Circuit source = good;
  source.find("vcc")->data = stage::VoltageSource{"vcc", "gnd", kNaN};
  EXPECT_EQ(subject_of(source), "vcc");
  Circuit wave = good;
  wave.find("vin")->data =
      stage::VoltageSource{"in", "gnd", 0.0, 1.0, 0.0, stage::SineWave{1.0, kInf}};
  EXPECT_EQ(subject_of(wave), "vin");
}

// The same pulse rule as the reader's: 1 ns edges (10-90 %) leave no room
// for a 1 ns high time (it needs 0.625 * (rise + fall) = 1.25 ns).
TEST(Validate, ImpossiblePulseIsNamed) {
  Circuit c = stage::testing::follower_into_low_load();
  const stage::PulseWave pulse{.period = 1e-6, .high_time = 1e-9, .rise = 1e-9, .fall = 1e-9};
  c.find("vin")->data = stage::VoltageSource{"in", "gnd", 0.0, 1.0, 0.0, pulse};
  const auto p = stage::validate(c);
  ASSERT_TRUE(p.has_value());
  EXPECT_EQ(p->subject, "vin");
  EXPECT_NE(p->message.find("high_time"), std::string::npos) << p->message;
}

// A node built in C++ named like the node an ammeter inserts for sensing
// q1's collector current ("q1:collector") is refused, naming the element.
TEST(Validate, NodeNamesWithAColonAreRefused) {
  Circuit c = stage::testing::follower_into_low_load();
  c.add("rx", stage::Resistor{"q1:collector", "gnd", 1e3});
  const auto p = stage::validate(c);
  ASSERT_TRUE(p.has_value());
  EXPECT_EQ(p->subject, "rx");
  EXPECT_NE(p->message.find("q1:collector"), std::string::npos) << p->message;
}

TEST(Validate, ModelParametersOutsideTheirRangeAreNamed) {
  Circuit c = stage::testing::follower_into_low_load();
  stage::BipolarModel m = stage::testing::generic_npn();
  m.saturation_current = -1e-14;
  c.add_model("npn", m);  // replaces the model of the same name
  const auto p = stage::validate(c);
  ASSERT_TRUE(p.has_value());
  EXPECT_EQ(p->subject, "model npn");
  EXPECT_NE(p->message.find("saturation_current"), std::string::npos) << p->message;
  m = stage::testing::generic_npn();
  m.early_voltage_forward = kInf;  // infinity switches the Early effect off: allowed
  c.add_model("npn", m);
  EXPECT_EQ(subject_of(c), "");
}

TEST(Validate, ACircuitBuiltInCodeIsCheckedBeforeAnythingRuns) {
  Circuit c = stage::testing::follower_into_low_load();
  c.find("re")->data = stage::Resistor{"emitter", "gnd", kNaN};
  EXPECT_THROW(stage::Simulation{c}, stage::Error);
  EXPECT_THROW(stage::run_bias(c), stage::Error);
}

// Solver settings travel beside the circuit, held to their own rules by the
// same path: a prepared simulation and a one-shot run refuse them before
// anything runs, naming "solver".
TEST(Validate, SolverSettingsAreCheckedBeforeAnythingRuns) {
  EXPECT_FALSE(stage::validate(stage::SolverOptions{}).has_value());
  const Circuit c = stage::testing::follower_into_low_load();
  using Options = stage::SolverOptions;
  for (double Options::*tolerance :
       {&Options::relative_tolerance, &Options::voltage_tolerance, &Options::current_tolerance,
        &Options::temperature_tolerance, &Options::heat_flow_tolerance}) {
    for (double bad : {kNaN, kInf, -1.0, 0.0}) {
      Options s;
      s.*tolerance = bad;
      const auto p = stage::validate(s);
      ASSERT_TRUE(p.has_value()) << bad;
      EXPECT_EQ(p->subject, "solver");
      EXPECT_EQ(p->message, "solver: every tolerance must be positive and finite");
    }
  }
  stage::SolverOptions negative;
  negative.current_tolerance = -1.0;
  EXPECT_THROW(stage::Simulation(c, negative), stage::Error);
  EXPECT_THROW(stage::run_bias(c, negative), stage::Error);
  stage::SolverOptions s;
  s.max_newton_iterations = 0;
  EXPECT_EQ(stage::validate(s)->message, "solver: max_newton_iterations must be at least 1");
  s = {};
  s.minimum_conductance = kInf;
  EXPECT_EQ(stage::validate(s)->subject, "solver");
}

// The reader refuses such values at the statement; settings changed in a
// deck after reading are refused by the check before anything runs, in the
// file (they have no single line).
TEST(Validate, DeckSolverSettingsAreCheckedWithTheDeck) {
  stage::Deck deck = stage::read_text(
      "vin = voltage(in, gnd, 1 V)\nr1 = resistor(in, gnd, 1k)\nanalyze bias()\n", "solver.stage");
  deck.solver.relative_tolerance = kNaN;
  try {
    stage::check_deck(deck);
    ADD_FAILURE() << "a relative tolerance that is not a number passed the check";
  } catch (const stage::InputError& e) {
    EXPECT_EQ(e.message(), "solver: every tolerance must be positive and finite");
    EXPECT_EQ(e.where().file, "solver.stage");
    EXPECT_EQ(e.where().line, 0);
  }
  EXPECT_THROW(stage::run_deck(deck), stage::InputError);
}

TEST(Validate, AnalysisOptionsAreCheckedForEveryRun) {
  const Circuit c = stage::testing::follower_into_low_load();
  stage::HeadroomOptions h;
  h.input = "vin";
  h.output = stage::SignalRef::node("out");
  h.distortion_limit = 1.5;
  EXPECT_EQ(stage::validate(c, h)->subject, "distortion_limit");
  EXPECT_THROW(stage::run_headroom(c, h), stage::Error);
  h.distortion_limit = 0.01;
  h.frequency = kNaN;
  EXPECT_EQ(stage::validate(c, h)->subject, "frequency");
  stage::TransientOptions t;
  t.stop = kInf;
  EXPECT_EQ(stage::validate(c, t)->subject, "stop");
  t.stop = 1.0;
  t.max_step = 1e-12;  // 1e12 steps: bounded before it runs for days
  EXPECT_EQ(stage::validate(c, t)->subject, "max_step");
  t.max_step = 1e-6;
  EXPECT_FALSE(stage::validate(c, t).has_value());
  t.stop = kInf;
  EXPECT_THROW(stage::Simulation(c).transient(t), stage::Error);
  stage::FrequencyOptions f;
  f.input = "vin";
  f.output = stage::SignalRef::node("out");
  f.per_decade = 1000000;  // 5 decades (10 Hz to 1 MHz): 5e6 points, past the bound
  EXPECT_EQ(stage::validate(c, f)->subject, "per_decade");
  f.per_decade = 20;
  EXPECT_FALSE(stage::validate(c, f).has_value());
  stage::SpectrumOptions s;
  s.harmonics = 100000;  // bounded: every harmonic costs a pass over the waveform
  EXPECT_EQ(stage::validate(c, s)->subject, "harmonics");
}

// From text, the same rules give input errors at the statement or the
// model's line, found by the check that runs before anything else.
TEST(Validate, TextGetsTheSameRulesWithPlaces) {
  const std::string circuit =
      "model d = diode { saturation_current = -1 fA }\n"
      "vin = voltage(in, gnd, dc = 0 V, ac = 1 V)\n"
      "r1 = resistor(in, out, 1k)\n"
      "d1 = diode(out, gnd, model = d)\n";
  try {
    stage::check_deck(stage::read_text(circuit + "analyze bias()\n", "negative.stage"));
    ADD_FAILURE() << "a negative saturation current passed the check";
  } catch (const stage::InputError& e) {
    EXPECT_EQ(e.where().line, 1) << e.what();
  }
  const std::string fixed =
      "model d = diode { saturation_current = 1 fA }\n" + circuit.substr(circuit.find('\n') + 1);
  try {
    stage::check_deck(stage::read_text(
        fixed + "analyze headroom(input = vin, output = out, distortion_limit = 150 %)\n",
        "limit.stage"));
    ADD_FAILURE() << "a distortion limit of 150 % passed the check";
  } catch (const stage::InputError& e) {
    EXPECT_EQ(e.where().line, 5) << e.what();
    EXPECT_NE(e.message().find("distortion limit"), std::string::npos) << e.what();
  }
}

// A problem found after reading still shows its line with a caret, taken
// from the text the reader kept: the file is gone from disk by then.
TEST(Validate, CaretLineComesFromTheTextKeptNotTheDisk) {
  const auto path = std::filesystem::temp_directory_path() / "stage_validate_deleted.stage";
  std::ofstream(path) << "vin = voltage(in, gnd, 1 V)\n"
                         "model d = diode { saturation_current = -1 fA }\n"
                         "d1 = diode(in, gnd, model = d)\nanalyze bias()\n";
  const stage::Deck deck = stage::read_file(path);
  std::filesystem::remove(path);
  try {
    stage::check_deck(deck);
    ADD_FAILURE() << "a negative saturation current passed the check";
  } catch (const stage::InputError& e) {
    EXPECT_EQ(e.kind(), stage::ErrorKind::input);
    EXPECT_EQ(e.where().line, 2) << e.what();
    const std::string shown = e.what();
    EXPECT_NE(shown.find("\nmodel d = diode { saturation_current = -1 fA }\n"), std::string::npos)
        << shown;
    EXPECT_NE(shown.find("\n^"), std::string::npos) << shown;
  }
}

}  // namespace
