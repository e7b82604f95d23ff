// The `stage` command as a user runs it: exit statuses, error messages with
// file, line and column, JSON and CSV output, and golden figures of an
// example circuit (compared with a tolerance, so that an unintended change in
// any figure shows up).
#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <nlohmann/json.hpp>
#include <sstream>

#include "app/run_command.hpp"

namespace {

namespace fs = std::filesystem;

using stage::testing::run;
using stage::testing::Stderr;
using stage::testing::write_temp;

std::string example(const std::string& name) {
  return std::string(STAGE_SOURCE_DIR) + "/apps/examples/" + name;
}

TEST(Command, VersionAndHelp) {
  EXPECT_EQ(run("--version").status, 0);
  const auto help = run("--help");
  EXPECT_EQ(help.status, 0);
  EXPECT_NE(help.out.find("Examples:"), std::string::npos);
  EXPECT_NE(help.out.find("Exit status"), std::string::npos);
  // The folders `include` searches, ending with the source tree's models/.
  EXPECT_NE(help.out.find("Model search path here:"), std::string::npos) << help.out;
  EXPECT_NE(help.out.find(std::string(STAGE_SOURCE_DIR) + "/models"), std::string::npos)
      << help.out;
}

TEST(Command, InputErrorNamesLineAndColumnAndExitsTwo) {
  const auto file =
      write_temp("bad.stage", "v1 = voltage(a, gnd, 5 V)\nr1 = resistor(a, gnd, 10 nF)\n");
  const auto o = run("run " + file.string());
  EXPECT_EQ(o.status, 2);
  EXPECT_NE(o.out.find(file.string() + ":2:"), std::string::npos) << o.out;
  EXPECT_NE(o.out.find("^"), std::string::npos) << o.out;
}

TEST(Command, NumericalFailureNamesTheNodeAndExitsThree) {
  const auto file = write_temp("float.stage",
                               "v1 = voltage(a, gnd, 5 V)\nc1 = capacitor(a, island, 1 nF)\n"
                               "r1 = resistor(island, far, 1 kΩ)\nanalyze bias()\n");
  const auto o = run("run " + file.string());
  EXPECT_EQ(o.status, 3);
  EXPECT_NE(o.out.find("island"), std::string::npos) << o.out;
}

// An analysis that cannot run as written stops the file before anything
// runs: the bias statement above it prints nothing.
TEST(Command, BadAnalysisStopsEverythingBeforeItRuns) {
  const auto file =
      write_temp("bad_output.stage",
                 "vin = voltage(in, gnd, dc = 0 V, ac = 1 V)\nr1 = resistor(in, out, 1 kΩ)\n"
                 "rl = resistor(out, gnd, 1 kΩ)\nanalyze bias()\n"
                 "analyze headroom(input = vin, output = rl.current, frequency = 1 kHz)\n");
  const auto o = run("run " + file.string());
  EXPECT_EQ(o.status, 2);
  EXPECT_NE(o.out.find(file.string() + ":5:1:"), std::string::npos) << o.out;
  EXPECT_NE(o.out.find("analyze headroom(input = vin"), std::string::npos) << o.out;
  EXPECT_EQ(o.out.find("Bias point"), std::string::npos) << o.out;
}

TEST(Command, CheckRunsNothing) {
  const auto o = run("check " + example("follower_32ohm.stage"));
  EXPECT_EQ(o.status, 0);
  EXPECT_NE(o.out.find("no errors"), std::string::npos);
}

// `check` finds without solving what would stop every analysis: the graph's
// faults (exit 3, naming the elements), and a file with nothing to run
// (exit 2). A file of models alone is a library and checks clean.
TEST(Command, CheckFindsTopologyFaultsAndEmptyFiles) {
  const auto check = [](const std::string& name, const std::string& text) {
    return run("check " + write_temp(name, text).string());
  };
  const auto floating = check("floating.stage",
                              "v1 = voltage(c, gnd, 1 V)\nr1 = resistor(a, b, 1 kΩ)\n"
                              "analyze bias()\n");
  EXPECT_EQ(floating.status, 3) << floating.out;
  EXPECT_NE(floating.out.find("no DC path to ground"), std::string::npos) << floating.out;
  EXPECT_NE(floating.out.find(" a"), std::string::npos) << floating.out;
  const auto loop =
      check("loop.stage", "v1 = voltage(a, gnd, 1 V)\nv2 = voltage(a, gnd, 2 V)\nanalyze bias()\n");
  EXPECT_EQ(loop.status, 3) << loop.out;
  EXPECT_NE(loop.out.find("v2"), std::string::npos) << loop.out;
  const auto cut_set = check("cut_set.stage",
                             "i1 = current(gnd, a, 1 mA)\nc1 = capacitor(a, gnd, 1 uF)\n"
                             "analyze bias()\n");
  EXPECT_EQ(cut_set.status, 3) << cut_set.out;
  EXPECT_NE(cut_set.out.find("i1"), std::string::npos) << cut_set.out;
  const auto shorted = check("shorted.stage",
                             "v1 = voltage(a, a, 1 V)\nr1 = resistor(a, gnd, 1 kΩ)\n"
                             "analyze bias()\n");
  // A voltage source shorted on itself is caught while reading, at its line.
  EXPECT_EQ(shorted.status, 2) << shorted.out;
  EXPECT_NE(shorted.out.find("shorted.stage:1:1: 'v1' holds a voltage between 'a' and itself"),
            std::string::npos)
      << shorted.out;
  const auto empty = check("empty.stage", "");
  EXPECT_EQ(empty.status, 2) << empty.out;
  EXPECT_NE(empty.out.find("defines nothing"), std::string::npos) << empty.out;
  const auto nothing_to_run =
      check("no_analysis.stage", "v1 = voltage(a, gnd, 1 V)\nr1 = resistor(a, gnd, 1 kΩ)\n");
  EXPECT_EQ(nothing_to_run.status, 2) << nothing_to_run.out;
  EXPECT_NE(nothing_to_run.out.find("no `analyze` statement"), std::string::npos)
      << nothing_to_run.out;
  const auto library = run("check " + std::string(STAGE_SOURCE_DIR) + "/models/transistors.stage");
  EXPECT_EQ(library.status, 0) << library.out;
  EXPECT_NE(library.out.find("model library"), std::string::npos) << library.out;
}

// A sweep whose second point has no solution (1 mA forced backwards through
// a diode) fails; the bias point solved before it is still printed, in the
// tables, the JSON and the CSV files, and the status is 3. The bias point
// itself is checked against the Shockley equation V = n VT ln(I/IS + 1)
// (Sedra and Smith, "Microelectronic Circuits", ch. 4).
TEST(Command, FailedAnalysisKeepsTheResultsBeforeIt) {
  const auto file =
      write_temp("sweep_fails.stage",
                 "model d = diode { saturation_current = 10 fA }\n"
                 "i1 = current(gnd, a, 1 mA)\nd1 = diode(a, gnd, model = d)\n"
                 "analyze bias()\n"
                 "analyze sweep(source = i1, from = 1 mA, to = -1 mA, step = 2 mA)\n");
  const auto tables = run("run " + file.string());
  EXPECT_EQ(tables.status, 3) << tables.out;
  EXPECT_NE(tables.out.find("Bias point"), std::string::npos) << tables.out;
  // The failure names its statement by file, line and column.
  EXPECT_NE(tables.out.find("Failed: analyze sweep at " + file.string() + ":5:1"),
            std::string::npos)
      << tables.out;

  const auto json = run("run " + file.string() + " --json", Stderr::dropped);
  EXPECT_EQ(json.status, 3);
  const auto document = nlohmann::json::parse(json.out);
  const auto& bias = document["analyses"][0];
  ASSERT_EQ(bias["kind"], "bias");
  const double vt = 1.380649e-23 * 300.15 / 1.602176634e-19;  // kT/q at 27 °C (SI 2019 constants)
  const double shockley = vt * std::log(1e-3 / 1e-14 + 1);
  EXPECT_NEAR(bias["node_voltages"]["a"].get<double>(), shockley, 1e-6);
  const auto& sweep = document["analyses"][1];
  EXPECT_EQ(sweep["kind"], "sweep");
  ASSERT_TRUE(sweep.contains("error"));
  const auto involved = sweep["involved"].get<std::vector<std::string>>();
  for (const char* name : {"a", "i1", "d1"}) {
    EXPECT_NE(std::find(involved.begin(), involved.end(), name), involved.end()) << name;
  }

  const fs::path dir = fs::temp_directory_path() / "stage_command_test_partial_csv";
  fs::remove_all(dir);
  EXPECT_EQ(run("run " + file.string() + " --csv " + dir.string()).status, 3);
  EXPECT_TRUE(fs::exists(dir / "1_bias.csv"));
  EXPECT_TRUE(fs::exists(dir / "2_sweep_failed.csv"));
}

TEST(Command, CsvWritesOneFilePerAnalysis) {
  const fs::path dir = fs::temp_directory_path() / "stage_command_test_csv";
  fs::remove_all(dir);
  const auto o = run("run " + example("follower_32ohm.stage") + " --csv " + dir.string());
  EXPECT_EQ(o.status, 0) << o.out;
  EXPECT_TRUE(fs::exists(dir / "1_bias.csv"));
  EXPECT_TRUE(fs::exists(dir / "2_frequency.csv"));
  EXPECT_TRUE(fs::exists(dir / "3_headroom.csv"));
}

std::string read_file(const fs::path& path) {
  std::ifstream in(path);
  return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

// The CSV files name every quantity as the JSON does (spec section 7): node
// names as they are, "<element>.current", "<device>.<key>"; a sweep's
// columns carry the transistor's figures too, and the spectrum its DC and
// THD. `check` counts in the right number.
TEST(Command, CsvNamesAreTheJsonNames) {
  const auto file = write_temp(
      "csv_names.stage",
      "model plain = npn { }\nvcc = voltage(vcc, gnd, 10 V)\n"
      "vin = voltage(in, gnd, wave = sine(amplitude = 1 mV, frequency = 1 kHz, offset = 0.7 V))\n"
      "rb = resistor(in, b, 1 kΩ)\nq1 = npn(c, b, gnd, model = plain)\n"
      "rc = resistor(vcc, c, 1 kΩ)\n"
      "analyze bias()\nanalyze sweep(source = vin, from = 0.6 V, to = 0.7 V, step = 0.1 V)\n"
      "analyze transient(stop = 3 ms, max_step = 10 us)\n"
      "analyze spectrum(signal = c, fundamental = 1 kHz, harmonics = 3)\n");
  const auto checked = run("check " + file.string());
  EXPECT_NE(checked.out.find("5 elements, 4 analyses"), std::string::npos) << checked.out;
  const fs::path dir = fs::temp_directory_path() / "stage_command_test_csv_names";
  fs::remove_all(dir);
  const auto o = run("run " + file.string() + " --csv " + dir.string());
  ASSERT_EQ(o.status, 0) << o.out;
  const std::string bias = read_file(dir / "1_bias.csv");
  EXPECT_EQ(bias.find("v("), std::string::npos) << bias;
  for (const char* row : {"\nc,", "\nrc.current,", "\nq1.collector_current,", "\nq1.region,"}) {
    EXPECT_NE(bias.find(row), std::string::npos) << row << " in\n" << bias;
  }
  const std::string sweep = read_file(dir / "2_sweep.csv");
  EXPECT_EQ(sweep.substr(0, sweep.find(",vcc.current")), "vin,vcc,in,b,c") << sweep;
  EXPECT_NE(sweep.find(",q1.collector_current,"), std::string::npos) << sweep;
  EXPECT_NE(sweep.find(",q1.vbe,"), std::string::npos) << sweep;
  const std::string transient = read_file(dir / "3_transient.csv");
  EXPECT_EQ(transient.substr(0, transient.find('\n')),
            "time_s,vcc,in,b,c,vcc.current,vin.current,rb.current,rc.current");
  const std::string spectrum = read_file(dir / "4_spectrum.csv");
  EXPECT_EQ(spectrum.substr(0, spectrum.find('\n')), "n,frequency_Hz,amplitude,phase_deg,thd");
  EXPECT_NE(spectrum.find("\n0,0,"), std::string::npos) << spectrum;  // DC as n = 0

  const auto tables = run("run " + file.string());
  EXPECT_NE(tables.out.find("q1 IC"), std::string::npos) << tables.out;
  EXPECT_NE(tables.out.find("\n  600.0 mV "), std::string::npos) << tables.out;
  const auto dc = tables.out.find(", DC ");
  ASSERT_NE(dc, std::string::npos) << tables.out;
  EXPECT_TRUE(tables.out.substr(dc, tables.out.find('\n', dc) - dc).ends_with(" V")) << tables.out;
  EXPECT_EQ(tables.out.find("0.000 f"), std::string::npos) << tables.out;
}

// A CSV file that cannot be written in its folder (a folder stands where
// the file should go) is a not_written error naming the file: status 2.
TEST(Command, CsvFileThatCannotBeWrittenIsNamed) {
  const fs::path dir = fs::temp_directory_path() / "stage_command_test_csv_blocked";
  fs::remove_all(dir);
  fs::create_directories(dir / "1_bias.csv");
  const auto file = write_temp("blocked_csv.stage",
                               "v1 = voltage(a, gnd, 1 V)\nr1 = resistor(a, gnd, 1 kΩ)\n"
                               "analyze bias()\n");
  const auto o = run("run " + file.string() + " --csv " + dir.string());
  EXPECT_EQ(o.status, 2) << o.out;
  EXPECT_NE(o.out.find("error (not_written): cannot write '" + (dir / "1_bias.csv").string()),
            std::string::npos)
      << o.out;
}

// A frequency analysis at one frequency (from = to) runs and has no
// corners: the JSON holds null for them.
TEST(Command, FrequencyAtOneFrequency) {
  const auto file = write_temp("one_frequency.stage",
                               "vin = voltage(in, gnd, dc = 0 V, ac = 1 V)\n"
                               "r1 = resistor(in, out, 1 kΩ)\nc1 = capacitor(out, gnd, 1 uF)\n"
                               "analyze frequency(from = 1 kHz, to = 1 kHz, input = vin, "
                               "output = out)\n");
  const auto o = run("run " + file.string() + " --json", Stderr::dropped);
  ASSERT_EQ(o.status, 0) << o.out;
  const auto frequency = nlohmann::json::parse(o.out)["analyses"][0];
  ASSERT_EQ(frequency["frequency_Hz"].size(), 1u);
  EXPECT_TRUE(frequency["lower_cutoff_Hz"].is_null());
  EXPECT_TRUE(frequency["upper_cutoff_Hz"].is_null());
  // |H| = 1 / sqrt(1 + (wRC)^2) of the RC low-pass (exact), wRC = 2 pi 1e3 1e3 1e-6.
  const double wrc = 2 * M_PI * 1e3 * 1e3 * 1e-6;
  EXPECT_NEAR(frequency["gain_dB"][0].get<double>(), -10 * std::log10(1 + wrc * wrc), 1e-9);
}

// A model whose saturation current has drifted 20 % from the one its
// reference Gummel curve was generated with fails the check (exit 1) and the
// message names the curve; the library's own model passes (exit 0).
TEST(Command, CurvesCheckFailsOnADriftedModel) {
  const std::string curve = std::string(STAGE_SOURCE_DIR) + "/models/curves/small_npn_gummel.csv";
  const auto passing =
      run("curves check " + std::string(STAGE_SOURCE_DIR) + "/models/transistors.stage " + curve);
  EXPECT_EQ(passing.status, 0) << passing.out;
  const auto drifted = write_temp("drifted.stage",
                                  "include \"transistors.stage\"\n"
                                  "model drifted = small_npn { saturation_current = 12 fA }\n");
  // `include` finds transistors.stage on the default model path.
  const auto failing = run("curves check " + drifted.string() + " " + curve + " --model drifted");
  EXPECT_EQ(failing.status, 1) << failing.out;
  EXPECT_NE(failing.out.find("small_npn_gummel"), std::string::npos) << failing.out;
}

std::string models(const std::string& name) {
  return std::string(STAGE_SOURCE_DIR) + "/models/" + name;
}

// Transistor and diode curves in one run, each checked against the library
// that defines its model; the curves are the libraries' own (generated from
// these models), so every one passes. A model found in none of the libraries
// is an input error at the curve file's `model` line naming every file searched.
TEST(Command, CurvesCheckSearchesSeveralModelLibraries) {
  const std::string npn = models("curves/small_npn_gummel.csv");
  const std::string diode = models("curves/signal_diode_forward.csv");
  const std::string libraries = models("transistors.stage") + " " + models("diodes.stage");
  const auto both = run("curves check " + libraries + " " + npn + " " + diode);
  EXPECT_EQ(both.status, 0) << both.out;
  EXPECT_NE(both.out.find("small_npn_gummel"), std::string::npos) << both.out;
  EXPECT_NE(both.out.find("signal_diode_forward"), std::string::npos) << both.out;
  // Curves before libraries read the same.
  EXPECT_EQ(run("curves check " + diode + " " + libraries).status, 0);

  const auto unknown = write_temp("unknown_model.csv",
                                  "curve, diode_forward\nmodel, no_such_diode\n"
                                  "sweep, forward_voltage, V\nmeasure, forward_current, A\n"
                                  "points\n0.6, 1e-3\n");
  const auto missing = run("curves check " + libraries + " " + unknown.string());
  EXPECT_EQ(missing.status, 2) << missing.out;
  EXPECT_NE(missing.out.find(unknown.string() + ":2:8: no model named 'no_such_diode' in " +
                             models("transistors.stage") + ", " + models("diodes.stage")),
            std::string::npos)
      << missing.out;

  const auto no_library = run("curves check " + npn);
  EXPECT_EQ(no_library.status, 2) << no_library.out;
  EXPECT_NE(no_library.out.find("model library"), std::string::npos) << no_library.out;
  const auto help = run("curves check --help");
  EXPECT_NE(help.out.find(".stage are model libraries"), std::string::npos) << help.out;
}

// `curves fit` output: an uncertainty is never a rounded zero, a dimensionless
// parameter's comment has no empty unit, stdout and the --output file end
// with a newline, and the written statement reads as a model.
TEST(Command, CurvesFitWritesCleanOutput) {
  const std::string gummel = models("curves/small_npn_gummel.csv");
  const auto fitted = fs::temp_directory_path() / "stage_command_test_fitted.stage";
  const auto fit = run("curves fit " + models("transistors.stage") + " " + gummel +
                           " --params saturation_current beta_forward --output " + fitted.string(),
                       Stderr::dropped);
  ASSERT_EQ(fit.status, 0) << fit.out;
  EXPECT_EQ(fit.out.back(), '\n') << fit.out;
  EXPECT_EQ(fit.out.find(" 0.0 fA"), std::string::npos) << fit.out;
  EXPECT_EQ(fit.out.find(" 0 A"), std::string::npos) << fit.out;
  EXPECT_EQ(fit.out.find("# ,"), std::string::npos) << fit.out;
  EXPECT_NE(fit.out.find("beta_forward"), std::string::npos) << fit.out;
  std::ifstream in(fitted);
  const std::string written((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  ASSERT_FALSE(written.empty());
  EXPECT_EQ(written.back(), '\n') << written;
  EXPECT_EQ(written.find("# ,"), std::string::npos) << written;
  // The statement derives from small_npn, and the file includes the library
  // that defines it, so it reads on its own; fitted back to small_npn's own
  // curve, it passes.
  EXPECT_NE(written.find("include \""), std::string::npos) << written;
  const auto check =
      run("curves check " + fitted.string() + " " + gummel + " --model small_npn_fitted");
  EXPECT_EQ(check.status, 0) << check.out;
}

// Numbers equal to a relative 1e-6 (or 1e-9 absolute near zero: residuals of
// picoamperes are rounding, not figures); strings,
// booleans and structure exactly.
void expect_close(const nlohmann::json& got, const nlohmann::json& want, const std::string& at) {
  ASSERT_EQ(got.type(), want.type()) << at;
  if (want.is_object()) {
    ASSERT_EQ(got.size(), want.size()) << at;
    for (const auto& [key, value] : want.items()) {
      ASSERT_TRUE(got.contains(key)) << at << "." << key;
      expect_close(got[key], value, at + "." + key);
    }
  } else if (want.is_array()) {
    ASSERT_EQ(got.size(), want.size()) << at;
    for (std::size_t i = 0; i < want.size(); ++i) {
      expect_close(got[i], want[i], at + "[" + std::to_string(i) + "]");
    }
  } else if (want.is_number()) {
    const double g = got.get<double>(), w = want.get<double>();
    EXPECT_NEAR(g, w, 1e-9 + 1e-6 * std::abs(w)) << at;
  } else {
    EXPECT_EQ(got, want) << at;
  }
}

// Golden figures of the follower example; regenerate with
//   build/apps/stage run apps/examples/follower_32ohm.stage --json
//     > tests/app/golden/follower_32ohm.json   (one line)
// after a deliberate change, and say why in the commit.
TEST(Command, FollowerJsonMatchesGolden) {
  const auto o = run("run " + example("follower_32ohm.stage") + " --json");
  ASSERT_EQ(o.status, 0) << o.out;
  const auto got = nlohmann::json::parse(o.out);
  std::ifstream golden(std::string(STAGE_SOURCE_DIR) + "/tests/app/golden/follower_32ohm.json");
  const auto want = nlohmann::json::parse(golden);
  expect_close(got, want, "document");
  // The keys of spec section 7 are where external tools read them.
  const auto& headroom = got["analyses"][2];
  EXPECT_EQ(headroom["kind"], "headroom");
  for (const char* key : {"positive_peak_V", "negative_peak_V", "symmetric_peak_to_peak_V",
                          "positive_limit", "negative_limit", "transient_runs", "load_line"}) {
    EXPECT_TRUE(headroom.contains(key)) << key;
  }
  EXPECT_EQ(got["analyses"][0]["devices"]["q1"]["region"], "forward_active");
}

}  // namespace

// --set takes values as the file writes them (units, prefixes) and reports
// its own errors as coming from the command line.
TEST(Command, SetTakesValuesWithUnitsAndNamesTheCommandLine) {
  const auto file = stage::testing::write_temp("set.stage",
                                               "let rl = 1 kΩ\n"
                                               "v1 = voltage(a, gnd, 10 V)\n"
                                               "r1 = resistor(a, gnd, rl)\n"
                                               "analyze bias()\n");
  // 10 V across 16 kΩ: 625 µA (Ohm's law).
  const auto set = stage::testing::run("run " + file.string() + " --json --set rl=16k");
  ASSERT_EQ(set.status, 0) << set.out;
  EXPECT_NEAR(nlohmann::json::parse(set.out)["analyses"][0]["element_currents"]["r1.current"],
              10.0 / 16e3, 1e-12);
  const auto with_unit = stage::testing::run("run " + file.string() + " --set rl=16kΩ");
  EXPECT_EQ(with_unit.status, 0) << with_unit.out;
  const auto wrong_unit = stage::testing::run("check " + file.string() + " --set rl=16V");
  EXPECT_EQ(wrong_unit.status, 2) << wrong_unit.out;
  EXPECT_NE(wrong_unit.out.find("--set:1:"), std::string::npos) << wrong_unit.out;
  EXPECT_NE(wrong_unit.out.find("in Ω in the file"), std::string::npos) << wrong_unit.out;
  const auto unknown = stage::testing::run("check " + file.string() + " --set r=16k");
  EXPECT_EQ(unknown.status, 2) << unknown.out;
  EXPECT_NE(unknown.out.find("(nearest: rl)"), std::string::npos) << unknown.out;
}

// `--strict` turns an exceeded maximum rating into exit status 4; without it
// the run succeeds and the table names the rating.
TEST(Command, StrictExitsFourWhenARatingIsExceeded) {
  const auto file = write_temp("over_rated.stage",
                               "model low_voltage = npn { max_collector_emitter_voltage = 30 V }\n"
                               "vcc = voltage(c, gnd, 40 V)\nvb = voltage(b, gnd, 0.65 V)\n"
                               "q1 = npn(c, b, gnd, model = low_voltage)\nanalyze bias()\n");
  const auto plain = run("run " + file.string());
  EXPECT_EQ(plain.status, 0) << plain.out;
  EXPECT_NE(plain.out.find("collector_emitter_voltage"), std::string::npos) << plain.out;
  const auto strict = run("run --strict " + file.string());
  EXPECT_EQ(strict.status, 4) << strict.out;
  const auto json = run("run --json " + file.string(), Stderr::dropped);
  const auto doc = nlohmann::json::parse(json.out);
  const auto& exceeded = doc["analyses"][0]["ratings_exceeded"];
  ASSERT_EQ(exceeded.size(), 1u) << json.out;
  EXPECT_EQ(exceeded[0]["device"], "q1");
  EXPECT_EQ(exceeded[0]["limit"], 30.0);
}

// Running out of memory is no bug: its own status (5) and a message that
// says so. Under an 800 MB address-space limit, reading /dev/zero (which
// has no size to check first) runs out before the 1 GiB file limit.
TEST(Command, OutOfMemoryHasItsOwnStatus) {
  const std::string command =
      "ulimit -v 800000; " + std::string(STAGE_BINARY_DIR) + "/apps/stage check /dev/zero 2>&1";
  FILE* pipe = popen(command.c_str(), "r");
  std::string out;
  std::array<char, 4096> buffer{};
  while (std::fgets(buffer.data(), buffer.size(), pipe) != nullptr) out += buffer.data();
  const int raw = pclose(pipe);
  ASSERT_TRUE(WIFEXITED(raw)) << out;
  EXPECT_EQ(WEXITSTATUS(raw), 5) << out;
  EXPECT_NE(out.find("out of memory"), std::string::npos) << out;
}
