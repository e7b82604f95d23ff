// Statements, element kinds, models and analyses read into the Deck.
#include <cmath>

#include "reader_test_support.hpp"

namespace stage::testing {
namespace {

TEST(Statements, TitleTemperatureSolver) {
  const Deck deck = read(
      "title \"Headphone driver\"\ntemperature 50 °C\n"
      "solver(relative_tolerance = 1e-5, voltage_tolerance = 2 uV,\n"
      "       current_tolerance = 1 pA, max_newton_iterations = 80, integration = bdf2)\n");
  EXPECT_EQ(deck.circuit.title, "Headphone driver");
  EXPECT_DOUBLE_EQ(deck.circuit.temperature, 323.15);  // 50 + 273.15
  EXPECT_DOUBLE_EQ(deck.solver.relative_tolerance, 1e-5);
  EXPECT_DOUBLE_EQ(deck.solver.voltage_tolerance, 2e-6);
  EXPECT_DOUBLE_EQ(deck.solver.current_tolerance, 1e-12);
  EXPECT_EQ(deck.solver.max_newton_iterations, 80);
  EXPECT_EQ(deck.solver.integration, Integration::bdf2);
}

TEST(Statements, SourcesAndWaves) {
  const Deck deck = read(
      "v1 = voltage(in, gnd, dc = 1 V, ac = 0.5, ac_phase = 90 deg,\n"
      "             wave = sine(amplitude = 0.2 V, frequency = 1 kHz, offset = 1 V))\n"
      "v2 = voltage(p, gnd, wave = pulse(low = 0 V, high = 5 V, high_time = 1 us, period = 2 us))\n"
      "i1 = current(a, gnd, wave = piecewise((0 s, 0 A), (1 ms, 2 mA), repeat = true))\n"
      "r = resistor(in, p, 1k)  # comment\n");
  const auto& v1 = element<VoltageSource>(deck, "v1");
  EXPECT_DOUBLE_EQ(v1.dc, 1);
  EXPECT_DOUBLE_EQ(v1.ac_magnitude, 0.5);
  EXPECT_DOUBLE_EQ(v1.ac_phase_deg, 90);
  const auto& sine = std::get<SineWave>(*v1.wave);
  EXPECT_DOUBLE_EQ(sine.amplitude, 0.2);
  EXPECT_DOUBLE_EQ(sine.frequency, 1e3);
  EXPECT_DOUBLE_EQ(sine.offset, 1);
  const auto& pulse = std::get<PulseWave>(*element<VoltageSource>(deck, "v2").wave);
  EXPECT_DOUBLE_EQ(pulse.high, 5);
  EXPECT_DOUBLE_EQ(pulse.high_time, 1e-6);
  const auto& pw = std::get<PiecewiseWave>(*element<CurrentSource>(deck, "i1").wave);
  ASSERT_EQ(pw.points.size(), 2u);
  EXPECT_DOUBLE_EQ(pw.points[1].first, 1e-3);
  EXPECT_DOUBLE_EQ(pw.points[1].second, 2e-3);
  EXPECT_TRUE(pw.repeat);
}

TEST(Statements, ControlledSourcesAndSemiconductors) {
  const Deck deck = read(
      "vs = voltage(a, gnd, 1)\n"
      "e1 = vcvs(o1, gnd, control = (a, gnd), gain = 10)\n"
      "g1 = vccs(o2, gnd, control = (a, o1), gain = 2 mS)\n"
      "f1 = cccs(o3, gnd, sense = vs, gain = 50)\n"
      "h1 = ccvs(o4, gnd, sense = vs, gain = 1 kΩ)\n"
      "f2 = cccs(o5, gnd, sense = d1, gain = 2)\n"
      "h2 = ccvs(o6, gnd, sense = q1.collector, gain = 1 kΩ)\n"
      "d1 = diode(a, o1, model = dm, area = 2)\n"
      "q1 = pnp(collector = c, base = b, emitter = e, substrate = s, model = qp)\n"
      "model dm = diode { saturation_current = 1 fA }\nmodel qp = pnp { beta_forward = 150 }\n");
  const auto& e1 = element<VoltageControlledVoltageSource>(deck, "e1");
  EXPECT_EQ(e1.control_p, "a");
  EXPECT_DOUBLE_EQ(e1.gain, 10);
  EXPECT_DOUBLE_EQ(element<VoltageControlledCurrentSource>(deck, "g1").gain, 2e-3);
  EXPECT_EQ(element<CurrentControlledCurrentSource>(deck, "f1").sense, "vs");
  EXPECT_DOUBLE_EQ(element<CurrentControlledVoltageSource>(deck, "h1").gain, 1e3);
  EXPECT_EQ(element<CurrentControlledCurrentSource>(deck, "f2").sense, "d1");
  EXPECT_EQ(element<CurrentControlledVoltageSource>(deck, "h2").sense, "q1.collector");
  EXPECT_DOUBLE_EQ(element<Diode>(deck, "d1").area, 2);
  const auto& q1 = element<Bipolar>(deck, "q1");
  EXPECT_EQ(q1.polarity, Polarity::pnp);
  EXPECT_EQ(q1.base, "b");
  EXPECT_EQ(q1.substrate, "s");
  EXPECT_DOUBLE_EQ(deck.circuit.diode_models().at("dm").saturation_current, 1e-15);
}

TEST(Models, DerivationCopiesThenOverrides) {
  const Deck deck = read(
      "model small = npn {\n  saturation_current = 12 fA\n  beta_forward = 180,"
      " base_resistance = 50\n}\nmodel hot = small { beta_forward = 260 }\n");
  const BipolarModel& hot = deck.circuit.bipolar_models().at("hot");
  EXPECT_DOUBLE_EQ(hot.saturation_current, 12e-15);
  EXPECT_DOUBLE_EQ(hot.beta_forward, 260);
  EXPECT_DOUBLE_EQ(hot.base_resistance_min, 50);  // follows base_resistance
  EXPECT_DOUBLE_EQ(deck.circuit.bipolar_models().at("small").beta_forward, 180);
}

TEST(Models, EbersMollRejectsGummelPoonParameters) {
  expect_error("model m = npn { form = ebers_moll, early_voltage_forward = 80 V }\n", 1, 36,
               "Gummel–Poon parameter");
  expect_error("model a = npn { knee_current_forward = 1 A }\nmodel b = a { form = ebers_moll }\n",
               2, 15, "set in the base model 'a'");
  const Deck deck = read("model m = npn { form = ebers_moll, beta_forward = 50 }\n");
  EXPECT_EQ(deck.circuit.bipolar_models().at("m").form, BipolarForm::ebers_moll);
}

TEST(Models, UnknownParameterListsNearest) {
  expect_error("model m = npn { beta_forwrd = 50 }\n", 1, 17, "nearest: beta_forward");
  expect_error("model d = diode { emission = 2 }\n", 1, 19, "no parameter 'emission'");
}

TEST(Models, TablesCoverTheSpec) {
  EXPECT_EQ(bipolar_parameters().size(), 41u + 9u);  // the device's, then its ratings
  EXPECT_EQ(diode_parameters().size(), 13u);
  for (const auto& row : bipolar_parameters()) {
    if (row.name == "beta_forward") {
      EXPECT_FALSE(row.gummel_poon_only);
    } else if (row.name == "early_voltage_forward") {
      EXPECT_TRUE(row.gummel_poon_only);
    } else if (row.name.starts_with("max_") || row.name.starts_with("second_breakdown")) {
      EXPECT_FALSE(row.gummel_poon_only) << row.name;  // ratings suit either form
    } else if (row.name == "reference_temperature") {
      EXPECT_EQ(row.quantity, Quantity::temperature);
    } else if (row.name == "excess_phase_delay") {
      EXPECT_EQ(row.quantity, Quantity::time);  // a delay in seconds, not degrees
      EXPECT_TRUE(row.gummel_poon_only);
    }
  }
}

TEST(Analyses, EveryKind) {
  const Deck deck = read(
      "let rl = 32 Ω\nvin = voltage(in, gnd, 0, ac = 1)\nr1 = resistor(in, out, 1k)\n"
      "rload = resistor(out, gnd, rl)\n"
      "analyze bias()\n"
      "analyze sweep(source = vin, from = 0 V, to = 1 V, step = 0.25 V)\n"
      "analyze sweep(parameter = rl, values = (8 Ω, 16 Ω, 32 Ω))\n"
      "analyze sweep(temperature, from = -40 °C, to = 0 °C, step = 15 K)\n"
      "analyze frequency(from = 10 Hz, to = 1 MHz, per_decade = 10, input = vin,\n"
      "                  output = out, load = rload, at = 1 kHz)\n"
      "analyze transient(stop = 5 ms, max_step = 2 us, start = zero,\n"
      "                  signals = (out, r1.current, (in, out)), uniform_step = 1 us)\n"
      "analyze spectrum(signal = out, fundamental = 1 kHz, harmonics = 5, include_noise = true)\n"
      "analyze headroom(input = vin, output = out, frequency = 2 kHz, load = rload,\n"
      "                 settle_periods = 128)\n"
      "analyze characterize(input = vin, output = (out, gnd), settle_periods = 8)\n");
  ASSERT_EQ(deck.analyses.size(), 9u);
  EXPECT_EQ(analysis_kind(deck.analyses[0].options), "bias");
  const auto& s1 = std::get<SweepOptions>(deck.analyses[1].options);
  EXPECT_EQ(s1.values, (std::vector<double>{0, 0.25, 0.5, 0.75, 1}));
  const auto& s2 = std::get<SweepOptions>(deck.analyses[2].options);
  EXPECT_EQ(s2.target, SweepOptions::Target::parameter);
  EXPECT_EQ(s2.values, (std::vector<double>{8, 16, 32}));
  const auto& s3 = std::get<SweepOptions>(deck.analyses[3].options);
  EXPECT_EQ(s3.target, SweepOptions::Target::temperature);
  // 233.15, 248.15, 263.15, then `to` = 273.15 appended (15 K does not divide 40 K).
  ASSERT_EQ(s3.values.size(), 4u);
  EXPECT_NEAR(s3.values[2], 263.15, 1e-12);
  EXPECT_DOUBLE_EQ(s3.values[3], 273.15);
  const auto& f = std::get<FrequencyOptions>(deck.analyses[4].options);
  EXPECT_EQ(f.per_decade, 10);
  EXPECT_EQ(f.output.label(), "out");
  EXPECT_EQ(f.load, "rload");
  EXPECT_DOUBLE_EQ(*f.at, 1e3);
  const auto& t = std::get<TransientOptions>(deck.analyses[5].options);
  EXPECT_EQ(t.start, TransientStart::zero);
  ASSERT_EQ(t.signals.size(), 3u);
  EXPECT_EQ(t.signals[1].label(), "r1.current");
  EXPECT_EQ(t.signals[2].label(), "(in, out)");
  EXPECT_DOUBLE_EQ(*t.resample_step, 1e-6);
  EXPECT_TRUE(std::get<SpectrumOptions>(deck.analyses[6].options).with_noise);
  EXPECT_DOUBLE_EQ(std::get<HeadroomOptions>(deck.analyses[7].options).frequency, 2e3);
  EXPECT_EQ(std::get<HeadroomOptions>(deck.analyses[7].options).settle_periods, 128);
  const auto& c = std::get<CharacterizeOptions>(deck.analyses[8].options);
  EXPECT_EQ(c.output.kind, SignalRef::Kind::node_pair);
  EXPECT_EQ(c.settle_periods, 8);
  EXPECT_EQ(deck.analyses[8].where.line, 16);
}

// A frequency analysis from = to is the one frequency; to below from is an
// error at `to`. A sweep's values carry their quantity for the reports' unit.
TEST(Analyses, SingleFrequencyAndSweptQuantity) {
  const std::string circuit =
      "let rl = 32 Ω\nvin = voltage(in, gnd, 0, ac = 1)\nr1 = resistor(in, out, rl)\n";
  const Deck deck = read(circuit +
                         "analyze frequency(from = 1 kHz, to = 1 kHz, input = vin, output = out)\n"
                         "analyze sweep(parameter = rl, values = (8 Ω, 16 Ω))\n");
  const auto& f = std::get<FrequencyOptions>(deck.analyses[0].options);
  EXPECT_DOUBLE_EQ(f.from, 1e3);
  EXPECT_DOUBLE_EQ(f.to, 1e3);
  EXPECT_EQ(std::get<SweepOptions>(deck.analyses[1].options).quantity, Quantity::resistance);
  expect_error(circuit + "analyze frequency(from = 2 kHz, to = 1 kHz, input = vin, output = out)\n",
               4, 33, "to must not be below from");
}

TEST(Overrides, ReplaceLetValues) {
  ReadOptions options;
  options.overrides["rl"] = 8;
  const Deck deck = read("let rl = 32 Ω\nr = resistor(a, gnd, rl * 2)\n", options);
  EXPECT_DOUBLE_EQ(element<Resistor>(deck, "r").resistance, 16);  // 8 * 2
  const Circuit again = deck.with_parameter("rl", 100);
  EXPECT_DOUBLE_EQ(std::get<Resistor>(again.find("r")->data).resistance, 200);
  EXPECT_THROW(deck.with_parameter("nothing", 1), InputError);
}

// Deck::places answers like the map of subjects to locations it stands for,
// for elements (block instances' too) and models, in any file of the deck.
TEST(Statements, PlacesOfElementsAndModels) {
  const Deck deck = read(
      "# a comment with é, then a list over two lines\n"
      "r1 = resistor(a,\n   b, 1k)\n"
      "block pair(p)\n  r = resistor(p, gnd, 1k)\nend\n"
      "  x1 = pair(n)\n"
      "model qa = npn { beta_forward = 50 }\n");
  const auto r1 = deck.places.find("r1");
  ASSERT_NE(r1, deck.places.end());
  EXPECT_EQ(r1->first, "r1");
  EXPECT_EQ(r1->second.line, 2);
  EXPECT_EQ(r1->second.column, 1);
  const auto inner = deck.places.find("x1/r");
  ASSERT_NE(inner, deck.places.end());
  EXPECT_EQ(inner->second.line, 5);  // where the block writes it
  EXPECT_EQ(inner->second.column, 3);
  ASSERT_EQ(deck.places.count("model qa"), 1u);
  EXPECT_EQ(deck.places.find("model qa")->second.line, 8);
  EXPECT_EQ(deck.places.find("x1"), deck.places.end());  // an instance, not an element
  EXPECT_EQ(deck.places.count("r2"), 0u);
  EXPECT_EQ(deck.line_text(r1->second), "r1 = resistor(a,");
}

// The grammar reads comments as blanks and newlines inside brackets as form
// feeds; messages still count and show the lines as written.
TEST(Statements, MessagesShowTheLinesAsWritten) {
  for (const std::string text :
       {"r1 = resistor(a,  # é\n  b, 1 kx)\n", "# é\nr1 = resistor(a,\n  b, 1 kx)  # é\n"}) {
    try {
      read(text);
      ADD_FAILURE() << text;
    } catch (const InputError& e) {
      const bool commented_first = text.front() == '#';
      EXPECT_EQ(e.where().line, commented_first ? 3 : 2) << e.what();
      EXPECT_EQ(e.where().column, 8) << e.what();
      const std::string written = commented_first ? "  b, 1 kx)  # é" : "  b, 1 kx)";
      EXPECT_NE(std::string(e.what()).find(written + "\n"), std::string::npos) << e.what();
    }
  }
}

}  // namespace
}  // namespace stage::testing
