// The chart specifications checked as data: every plot present, each series
// the same numbers as the JSON result, log axes where the report says so,
// marks at the corners and the limit points, and the follower's AC load line
// against the textbook one.
#include "report/charts.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <set>

#include "common/si_format.hpp"
#include "report/decimate.hpp"
#include "report/transient_report.hpp"
#include "stage/reader.hpp"
#include "stage/report.hpp"
#include "stage/run.hpp"

namespace {

using stage::report::Chart;
using stage::report::Json;

const Chart& find_chart(const std::vector<Chart>& charts, const std::string& name) {
  for (const auto& c : charts) {
    if (c.name == name) return c;
  }
  throw std::out_of_range("no chart " + name);
}

const Json& find_layer(const Chart& chart, const std::string& name) {
  for (const auto& l : chart.spec["layer"]) {
    if (l["name"] == name) return l;
  }
  throw std::out_of_range("no layer " + name + " in " + chart.name);
}

const Json& rows(const Json& layer) { return layer["data"]["values"]; }

// Whether a mark sits at exactly frequency f (the JSON's number) with
// `label` in its text.
bool marks_frequency(const Json& marks, double f, const std::string& label = "") {
  return std::any_of(marks.begin(), marks.end(), [&](const Json& m) {
    return m["frequency_Hz"] == f &&
           (label.empty() || m["label"].get<std::string>().find(label) != std::string::npos);
  });
}

// The follower example run once for every test here (its headroom search
// takes a few dozen transient runs).
class FollowerCharts : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    run_ = new stage::RunResult(stage::run_deck(
        stage::read_file(std::string(STAGE_SOURCE_DIR) + "/apps/examples/follower_32ohm.stage")));
    json_ = new nlohmann::json(nlohmann::json::parse(stage::json_document(*run_)));
    charts_ = new std::vector<Chart>(stage::report::charts(*run_));
  }
  static void TearDownTestSuite() {
    delete charts_;
    delete json_;
    delete run_;
  }
  static stage::RunResult* run_;
  static nlohmann::json* json_;
  static std::vector<Chart>* charts_;
};
stage::RunResult* FollowerCharts::run_ = nullptr;
nlohmann::json* FollowerCharts::json_ = nullptr;
std::vector<Chart>* FollowerCharts::charts_ = nullptr;

TEST_F(FollowerCharts, EveryPlotIsPresent) {
  std::set<std::string> names;
  for (const auto& c : *charts_) names.insert(c.name);
  // The bias point is a table; the frequency response has three plots, the
  // headroom search two.
  EXPECT_EQ(names,
            (std::set<std::string>{"2_frequency_gain", "2_frequency_phase", "2_frequency_impedance",
                                   "3_headroom_drive", "3_headroom_load_line"}));
  for (const auto& c : *charts_) {
    EXPECT_EQ(c.spec["$schema"], "https://vega.github.io/schema/vega-lite/v5.json") << c.name;
  }
}

TEST_F(FollowerCharts, FrequencySeriesAreTheJsonNumbersOnLogAxes) {
  const auto& f = (*json_)["analyses"][1];
  const Json& gain = find_layer(find_chart(*charts_, "2_frequency_gain"), "gain");
  ASSERT_EQ(rows(gain).size(), f["gain_dB"].size());
  for (std::size_t k = 0; k < rows(gain).size(); ++k) {
    EXPECT_DOUBLE_EQ(rows(gain)[k]["frequency_Hz"].get<double>(), f["frequency_Hz"][k]);
    EXPECT_DOUBLE_EQ(rows(gain)[k]["gain_dB"].get<double>(), f["gain_dB"][k]);
  }
  EXPECT_EQ(gain["encoding"]["x"]["scale"]["type"], "log");
  const Json& phase = find_layer(find_chart(*charts_, "2_frequency_phase"), "phase");
  for (std::size_t k = 0; k < rows(phase).size(); ++k) {
    EXPECT_DOUBLE_EQ(rows(phase)[k]["phase_deg"].get<double>(), f["phase_deg"][k]);
  }
  EXPECT_EQ(phase["encoding"]["x"]["scale"]["type"], "log");
  const Json& z = find_layer(find_chart(*charts_, "2_frequency_impedance"), "impedance");
  EXPECT_EQ(z["encoding"]["x"]["scale"]["type"], "log");
  EXPECT_EQ(z["encoding"]["y"]["scale"]["type"], "log");
  std::size_t in = 0, out = 0;
  for (const auto& r : rows(z)) {
    const bool input = r["impedance"] == "|Zin|";
    const auto& want = f[input ? "input_impedance_ohm" : "output_impedance_ohm"];
    EXPECT_DOUBLE_EQ(r["impedance_ohm"].get<double>(), want[input ? in++ : out++]);
  }
  EXPECT_EQ(in, f["input_impedance_ohm"].size());
  EXPECT_EQ(out, f["output_impedance_ohm"].size());
}

TEST_F(FollowerCharts, DrivePlotHasEveryRunAndEachSidesLimitWithItsCause) {
  const auto& h = (*json_)["analyses"][2];
  const Chart& chart = find_chart(*charts_, "3_headroom_drive");
  const Json& peaks = find_layer(chart, "peaks");
  EXPECT_EQ(peaks["encoding"]["x"]["scale"]["type"], "log");
  EXPECT_EQ(peaks["encoding"]["y"]["scale"]["type"], "log");
  // Every run's two peaks (all positive here), in the JSON's order.
  ASSERT_EQ(rows(peaks).size(), 2 * h["runs"].size());
  for (std::size_t k = 0; k < h["runs"].size(); ++k) {
    EXPECT_DOUBLE_EQ(rows(peaks)[2 * k]["peak"].get<double>(), h["runs"][k]["positive_peak"]);
    EXPECT_DOUBLE_EQ(rows(peaks)[2 * k + 1]["peak"].get<double>(), h["runs"][k]["negative_peak"]);
  }
  // The small-signal line: gain x drive at both ends.
  for (const auto& r : rows(find_layer(chart, "small_signal"))) {
    EXPECT_DOUBLE_EQ(r["peak"].get<double>(),
                     h["small_signal_gain"].get<double>() * r["input_amplitude"].get<double>());
  }
  // A mark at each side's clip point and distortion-limit point, labelled
  // with the mechanism the JSON gives.
  const Json& limits = rows(find_layer(chart, "limits"));
  const auto has_mark = [&](double amplitude, double peak, const std::string& words) {
    for (const auto& r : limits) {
      if (r["input_amplitude"].get<double>() == amplitude && r["peak"].get<double>() == peak &&
          r["label"].get<std::string>().find(words) != std::string::npos) {
        return true;
      }
    }
    return false;
  };
  for (const char* side : {"positive", "negative"}) {
    const auto& s = h[std::string(side) + "_limit"];
    const std::string clip_cause = s["clip_cause"]["mechanism"].get<std::string>() + " (" +
                                   s["clip_cause"]["device"].get<std::string>() + ")";
    EXPECT_TRUE(has_mark(s["clip_input_amplitude"].get<double>(), s["clip_peak_V"].get<double>(),
                         std::string(side) + " clip: " + clip_cause))
        << side;
    EXPECT_TRUE(has_mark(s["input_amplitude"].get<double>(),
                         h[std::string(side) + "_peak_V"].get<double>(),
                         std::string(side) + " 1 % limit: " + s["mechanism"].get<std::string>()))
        << side;
  }
}

TEST_F(FollowerCharts, AcLoadLineIsTheTextbookOne) {
  const auto& h = (*json_)["analyses"][2];
  const auto& q1 = (*json_)["analyses"][0]["devices"]["q1"];
  const Chart& chart = find_chart(*charts_, "3_headroom_load_line");
  const Json& ac = rows(find_layer(chart, "ac_load_line"));
  ASSERT_EQ(ac.size(), 2u);
  const double v0 = ac[0]["vce"], i0 = ac[0]["current"], v1 = ac[1]["vce"], i1 = ac[1]["current"];
  // Textbook AC load line (Malvino and Bates, "Electronic Principles", the
  // chapter on AC load lines): through Q with slope -1/R'ac, crossing the
  // VCE axis at VCEQ + ICQ R'ac. R'ac of the follower is RE || RL, 2.2 kohm
  // || 32 ohm from the example's values (the 2200 uF coupling capacitor adds
  // 0.07 ohm of reactance at 1 kHz, in quadrature: 1e-6 relative).
  const double r_ac = 1 / (1 / 2.2e3 + 1 / 32.0);
  const double vceq = q1["vce"], icq = q1["collector_current"];
  EXPECT_NEAR((i1 - i0) / (v1 - v0), -1 / r_ac, 1e-5 / r_ac);
  EXPECT_DOUBLE_EQ(i1, 0.0);
  EXPECT_NEAR(v1, vceq + icq * r_ac, 1e-6 * vceq);
  // ...and so through the quiescent point.
  EXPECT_NEAR(i0 + (i1 - i0) * (vceq - v0) / (v1 - v0), icq, 1e-9);
  // The DC load line has RE's slope (capacitors open; the same textbook).
  const Json& dc = rows(find_layer(chart, "dc_load_line"));
  EXPECT_NEAR((dc[1]["current"].get<double>() - dc[0]["current"].get<double>()) /
                  (dc[1]["vce"].get<double>() - dc[0]["vce"].get<double>()),
              -1 / 2.2e3, 1e-6 / 2.2e3);
  // The edges: cutoff at IC = 0, saturation at VCB = 0 (VCE = VBE).
  EXPECT_EQ(rows(find_layer(chart, "cutoff_edge"))[0]["current"], 0.0);
  EXPECT_DOUBLE_EQ(rows(find_layer(chart, "saturation_edge"))[0]["vce"].get<double>(),
                   std::abs(q1["vbe"].get<double>()));
  // The paths are the JSON's, in time order.
  const Json& paths = rows(find_layer(chart, "paths"));
  const auto& clean = h["load_line"]["clean_path"];
  const auto& clip = h["load_line"]["clip_path"];
  ASSERT_EQ(paths.size(), clean["vce_V"].size() + clip["vce_V"].size());
  for (std::size_t k = 0; k < clip["vce_V"].size(); ++k) {
    const auto& r = paths[clean["vce_V"].size() + k];
    EXPECT_DOUBLE_EQ(r["vce"].get<double>(), clip["vce_V"][k]);
    EXPECT_DOUBLE_EQ(r["current"].get<double>(), clip["current_A"][k]);
  }
  // At the clip level the negative side has cut q1 off: its path reaches
  // (nearly) zero current, along the AC load line.
  double least = INFINITY;
  for (const auto& i : clip["current_A"]) least = std::min(least, i.get<double>());
  EXPECT_LT(least, 0.05 * icq);
}

// A first-order RC low-pass, |H|^2 = 1 / (1 + (f/fc)^2) with fc = 1 / (2 pi
// R C) (any circuit-theory text). The report's corner is 3.0103 dB below the
// grid's peak, at its first point f0 = 10 Hz, so it lies where
// 1 + (f/fc)^2 = 2 (1 + (f0/fc)^2); the chart marks it where the JSON has it.
TEST(FrequencyCharts, CornerIsMarked) {
  const auto deck = stage::read_text(
      "v1 = voltage(in, gnd, dc = 0 V, ac = 1 V)\n"
      "r1 = resistor(in, out, 1 kΩ)\n"
      "c1 = capacitor(out, gnd, 100 nF)\n"
      "analyze frequency(from = 10 Hz, to = 100 kHz, per_decade = 10, input = v1, output = out)\n",
      "rc.stage");
  const auto run = stage::run_deck(deck);
  const auto json = nlohmann::json::parse(stage::json_document(run));
  const auto charts = stage::report::charts(run);
  const Json& marks = rows(find_layer(find_chart(charts, "1_frequency_gain"), "figures"));
  const double corner = json["analyses"][0]["upper_cutoff_Hz"];
  const double fc = 1 / (2 * std::numbers::pi * 1e3 * 100e-9), f0 = 10;
  EXPECT_NEAR(corner, fc * std::sqrt(1 + 2 * (f0 / fc) * (f0 / fc)), 1e-6 * corner);
  EXPECT_TRUE(marks_frequency(marks, corner)) << marks.dump();
}

// The same low-pass behind an ideal amplifier of gain 10: |H| = 10 /
// sqrt(1 + (f/fc)^2) falls through 0 dB at fc sqrt(99) (solving |H| = 1),
// where the chart marks the unity gain.
TEST(FrequencyCharts, UnityGainIsMarked) {
  const auto deck = stage::read_text(
      "v1 = voltage(in, gnd, dc = 0 V, ac = 1 V)\n"
      "r1 = resistor(in, mid, 1 kΩ)\n"
      "c1 = capacitor(mid, gnd, 100 nF)\n"
      "e1 = vcvs(out, gnd, control = (mid, gnd), gain = 10)\n"
      "r2 = resistor(out, gnd, 1 kΩ)\n"
      "analyze frequency(from = 10 Hz, to = 1 MHz, per_decade = 10, input = v1, output = out)\n",
      "amplifier.stage");
  const auto run = stage::run_deck(deck);
  const auto json = nlohmann::json::parse(stage::json_document(run));
  const auto charts = stage::report::charts(run);
  const double unity = json["analyses"][0]["unity_gain_frequency_Hz"];
  const double fc = 1 / (2 * std::numbers::pi * 1e3 * 100e-9);
  EXPECT_NEAR(unity, fc * std::sqrt(99.0), 1e-6 * unity);
  const Json& marks = rows(find_layer(find_chart(charts, "1_frequency_gain"), "figures"));
  EXPECT_TRUE(marks_frequency(marks, unity, "unity gain")) << marks.dump();
}

// A divider swept over its source: every node's voltage against the swept
// value, the JSON's numbers; the output is half the source (two equal
// resistors, Ohm's law).
TEST(SweepCharts, NodeVoltagesAgainstTheSweptValueAreTheJsonNumbers) {
  const auto deck = stage::read_text(
      "v1 = voltage(in, gnd, 0 V)\n"
      "r1 = resistor(in, out, 1 kΩ)\n"
      "r2 = resistor(out, gnd, 1 kΩ)\n"
      "analyze sweep(source = v1, from = 0 V, to = 10 V, step = 2.5 V)\n",
      "divider.stage");
  const auto run = stage::run_deck(deck);
  const auto json = nlohmann::json::parse(stage::json_document(run));
  const auto charts = stage::report::charts(run);
  ASSERT_EQ(charts.size(), 1u);  // no transistor: no collector currents
  const Json& swept = rows(find_layer(charts.front(), "swept"));
  const auto& points = json["analyses"][0]["points"];
  ASSERT_EQ(swept.size(), 2 * points.size());
  for (const auto& r : swept) {
    const auto k = static_cast<std::size_t>(std::lround(r["swept"].get<double>() / 2.5));
    EXPECT_DOUBLE_EQ(r["value"].get<double>(),
                     points[k]["node_voltages"][r["series"].get<std::string>()].get<double>());
    if (r["series"] == "out") {
      EXPECT_NEAR(r["value"].get<double>(), r["swept"].get<double>() / 2, 1e-9);
    }
  }
  EXPECT_EQ(charts.front().spec["layer"][0]["encoding"]["x"]["title"], "v1 (V)");
}

// A transient built by hand: one plot per unit, the samples as in the JSON.
TEST(TimeCharts, SignalsGroupedByUnitAreTheJsonSamples) {
  stage::TransientResult t;
  t.time = {0, 1e-3, 2e-3, 3e-3};
  t.signals = {{"out", {0, 1, 0, -1}, {}, {}},
               {"in", {0, 0.5, 0, -0.5}, {}, {}},
               {"r1.current", {0, 1e-3, 0, -1e-3}, {}, {}}};
  const auto charts = stage::report::charts_of(t, "1_transient");
  ASSERT_EQ(charts.size(), 2u);
  EXPECT_EQ(charts[0].name, "1_transient_voltages");
  EXPECT_EQ(charts[1].name, "1_transient_currents");
  const Json json = stage::report::to_json(t);
  const Json& voltages = charts[0].spec["data"]["values"];
  ASSERT_EQ(voltages.size(), 2 * t.time.size());
  for (std::size_t k = 0; k < voltages.size(); ++k) {
    const std::string signal = voltages[k]["signal"];
    EXPECT_EQ(voltages[k]["time_s"], json["time_s"][k / 2]);
    EXPECT_EQ(voltages[k]["value"], json["signals"][signal][k / 2]);
  }
  EXPECT_EQ(charts[1].spec["data"]["values"].size(), t.time.size());
  EXPECT_NE(charts[0].spec["title"]["subtitle"].get<std::string>().find("all drawn"),
            std::string::npos);
}

// 100,000 samples of a sine with one narrow spike: the decimated record
// keeps the spike and each bucket's extremes (the min/max method's defining
// property), and the plot says it is decimated.
TEST(TimeCharts, LongRecordsAreDecimatedKeepingPeaks) {
  constexpr std::size_t n = 100000;
  stage::TransientResult t;
  std::vector<double> v(n);
  for (std::size_t k = 0; k < n; ++k) {
    t.time.push_back(1e-8 * static_cast<double>(k));
    v[k] = std::sin(2 * std::numbers::pi * 7 * static_cast<double>(k) / n);
  }
  v[54321] = 3.0;  // one sample wide
  t.signals = {{"out", v, {}, {}}};
  const auto kept = stage::report::display_samples(n, {&t.signals[0].values});
  EXPECT_LE(kept.size(), 2 * stage::report::kDisplayBuckets + 2);
  EXPECT_TRUE(std::is_sorted(kept.begin(), kept.end()));
  EXPECT_NE(std::find(kept.begin(), kept.end(), 54321u), kept.end());
  for (std::size_t b = 0; b < stage::report::kDisplayBuckets; ++b) {
    const std::size_t begin = b * n / stage::report::kDisplayBuckets;
    const std::size_t end = (b + 1) * n / stage::report::kDisplayBuckets;
    const auto high = std::max_element(v.begin() + begin, v.begin() + end) - v.begin();
    const auto low = std::min_element(v.begin() + begin, v.begin() + end) - v.begin();
    EXPECT_TRUE(std::binary_search(kept.begin(), kept.end(), static_cast<std::size_t>(high)));
    EXPECT_TRUE(std::binary_search(kept.begin(), kept.end(), static_cast<std::size_t>(low)));
  }
  const auto charts = stage::report::charts_of(t, "1_transient");
  double largest = 0;
  for (const auto& r : charts[0].spec["data"]["values"]) {
    largest = std::max(largest, r["value"].get<double>());
  }
  EXPECT_EQ(largest, 3.0);
  EXPECT_NE(charts[0].spec["title"]["subtitle"].get<std::string>().find("decimated"),
            std::string::npos);
}

// Harmonic bars in dB re the fundamental, 20 log10(A_n / A_1) (the
// definition of dBc), and the THD written on the plot.
TEST(TimeCharts, SpectrumBarsAreDecibelsReFundamental) {
  stage::SpectrumResult s;
  s.signal = "out";
  s.fundamental = 1e3;
  s.harmonics = {{1, 2.0, 0}, {2, 0.02, 0}, {3, 0.2, 0}};
  s.thd = std::hypot(0.02, 0.2) / 2.0;
  s.periods = 1;
  const auto charts = stage::report::charts_of(s, "2_spectrum");
  ASSERT_EQ(charts.size(), 1u);
  const Json& bars = rows(find_layer(charts[0], "harmonics"));
  ASSERT_EQ(bars.size(), 2u);
  EXPECT_DOUBLE_EQ(bars[0]["relative_dB"].get<double>(), -40.0);
  EXPECT_DOUBLE_EQ(bars[1]["relative_dB"].get<double>(), -20.0);
  const std::string thd = rows(find_layer(charts[0], "thd"))[0]["label"];
  EXPECT_EQ(thd, "THD " + stage::text::percent(s.thd));
}

}  // namespace
