// The demo's HTML reports in a real browser: headless Chromium loads each
// example's page, and after rendering its DOM holds one SVG per chart, each
// with a mark group for every layer of its specification (as many drawn
// items as data rows for points, rules, text and bars) and its axis titles,
// and no script error was logged. A screenshot of each page is written to
// the build folder (report-browser/<example>.png). Without a browser (or the
// plotting bundles) the test fails in CI (CI=true) and is skipped elsewhere.
#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <nlohmann/json.hpp>
#include <string>

#include "run_command.hpp"
#include "stage/reader.hpp"
#include "stage/report.hpp"
#include "stage/run.hpp"

namespace {

namespace fs = std::filesystem;

#ifndef STAGE_CHROMIUM_EXECUTABLE
#define STAGE_CHROMIUM_EXECUTABLE ""
#endif

// Virtual time the page may take to render: far beyond what it needs
// (under a second), and spent only while the page is busy.
constexpr const char* kRenderBudgetMs = "5000";

// One browser run: the rendered DOM on stdout and a screenshot of the page's
// first 2,700 pixels (the README's picture) into `screenshot`. As root (CI)
// Chromium runs only without its sandbox; a profile per page in the build
// folder (the pages are tested in parallel) and no use of /dev/shm (small
// in containers) keep it independent of the machine.
std::string chromium_command(const fs::path& page, const fs::path& screenshot) {
  return std::string("'") + STAGE_CHROMIUM_EXECUTABLE +
         "' --headless --no-sandbox --disable-gpu --disable-dev-shm-usage --hide-scrollbars "
         "--user-data-dir='" +
         (page.parent_path() / (page.stem().string() + "-profile")).string() +
         "' --window-size=1100,2700 --virtual-time-budget=" + kRenderBudgetMs +
         " --dump-dom --screenshot='" + screenshot.string() + "' 'file://" + page.string() +
         "' 2>/dev/null";
}

// The text from `from` up to the first `until` after it (empty when absent).
std::string between(const std::string& text, const std::string& from, const std::string& until,
                    std::size_t start = 0) {
  const auto begin = text.find(from, start);
  if (begin == std::string::npos) return {};
  const auto end = text.find(until, begin + from.size());
  return text.substr(begin, end == std::string::npos ? std::string::npos : end - begin);
}

std::size_t count(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

// What stops the test from running here, if anything: in CI a failure.
std::string missing_tools() {
  if (std::string(STAGE_CHROMIUM_EXECUTABLE).empty() || !fs::exists(STAGE_CHROMIUM_EXECUTABLE)) {
    return "no Chromium was found when the build was configured (Debian's chromium package; "
           "bash cmake/bootstrap.sh test installs it)";
  }
  const stage::PlotTools tools = stage::default_plot_tools();
  if (!fs::exists(tools.bundles / "node_modules/vega-embed/build/vega-embed.min.js")) {
    return "the plotting bundles are not installed in " + tools.bundles.string() +
           " (npm ci there; bash cmake/bootstrap.sh does)";
  }
  return {};
}

class DemoReportInBrowser : public ::testing::TestWithParam<std::string> {};

TEST_P(DemoReportInBrowser, DrawsEveryChartWithoutScriptErrors) {
  if (const std::string missing = missing_tools(); !missing.empty()) {
    const char* ci = std::getenv("CI");
    if (ci != nullptr && std::string(ci) == "true") FAIL() << missing;
    GTEST_SKIP() << missing;
  }
  const std::string example = GetParam();
  const stage::RunResult run = stage::run_deck(
      stage::read_file(std::string(STAGE_SOURCE_DIR) + "/apps/examples/" + example + ".stage"));
  const fs::path folder = fs::path(STAGE_BINARY_DIR) / "report-browser";
  fs::create_directories(folder);
  const fs::path page = folder / (example + ".html");
  stage::write_html_report(page, run);

  const fs::path screenshot = folder / (example + ".png");
  fs::remove(screenshot);
  const auto dom = stage::testing::run_shell(chromium_command(page, screenshot));
  ASSERT_EQ(dom.status, 0) << dom.out.substr(0, 2000);
  const auto specs = stage::chart_specifications(run);
  ASSERT_FALSE(specs.empty());
  const std::string html_tag = between(dom.out, "<html", ">");
  EXPECT_NE(html_tag.find("data-charts-rendered=\"" + std::to_string(specs.size()) + "\""),
            std::string::npos)
      << html_tag;
  EXPECT_EQ(html_tag.find("data-script-errors"), std::string::npos)
      << between(dom.out, "<pre id=\"script-errors\"", "</pre>");

  for (const auto& chart : specs) {
    const std::string figure = between(dom.out, "id=\"chart-" + chart.name + "\"", "<figcaption");
    ASSERT_FALSE(figure.empty()) << chart.name;
    EXPECT_EQ(count(figure, "<svg"), 1u) << chart.name;
    // Both axes titled (x and y): Vega draws a title per axis.
    EXPECT_EQ(count(figure, "role-axis-title"), 2u) << chart.name;
    const auto spec = nlohmann::json::parse(chart.vega_lite);
    for (const auto& layer : spec["layer"]) {
      const std::string name = layer["name"];
      const std::string group = between(figure, "role-mark " + name + "_marks\"", "</g>");
      ASSERT_FALSE(group.empty()) << chart.name << ": no marks of layer " << name;
      const std::string mark = layer["mark"].is_string() ? layer["mark"].get<std::string>()
                                                         : layer["mark"]["type"].get<std::string>();
      const auto& rows = layer.contains("data") ? layer["data"]["values"] : spec["data"]["values"];
      if (mark == "line") {
        EXPECT_GE(count(group, "<path"), 1u) << chart.name << ": " << name;
      } else {
        // One drawn item per row: a symbol, a rule, a label or a bar.
        EXPECT_EQ(count(group, "role=\"graphics-symbol\""), rows.size())
            << chart.name << ": " << name;
      }
    }
  }
  // A picture of a drawn page, not an empty one: tens of kilobytes.
  EXPECT_GT(fs::exists(screenshot) ? fs::file_size(screenshot) : 0u, 10000u) << screenshot;
}

INSTANTIATE_TEST_SUITE_P(Examples, DemoReportInBrowser,
                         ::testing::Values("follower_32ohm", "push_pull_class_b",
                                           "push_pull_class_ab"));

// Without the bundles the report says what is missing and how to install
// it, as a request that cannot be done (exit status 2, spec section 8).
TEST(Report, MissingBundlesAreNamedWithHowToInstallThem) {
  const auto file = stage::testing::write_temp("report.stage",
                                               "v1 = voltage(a, gnd, 1 V)\n"
                                               "r1 = resistor(a, gnd, 1 kΩ)\n"
                                               "analyze bias()\n");
  const auto out = fs::temp_directory_path() / "stage_command_test_report.html";
  ::setenv("STAGE_REPORT_BUNDLES", "/nonexistent", 1);
  const auto o = stage::testing::run("run " + file.string() + " --report " + out.string());
  ::unsetenv("STAGE_REPORT_BUNDLES");
  EXPECT_EQ(o.status, 2) << o.out;
  EXPECT_NE(o.out.find("/nonexistent/node_modules/vega/build/vega.min.js"), std::string::npos)
      << o.out;
  EXPECT_NE(o.out.find("npm ci"), std::string::npos) << o.out;
}

// --plots writes one SVG per chart, drawn by Node from the specifications it
// also writes, and --report the page, with the plotting library inline.
TEST(Report, CommandWritesThePageAndOneSvgPerChart) {
  if (const std::string missing = missing_tools(); !missing.empty()) {
    const char* ci = std::getenv("CI");
    if (ci != nullptr && std::string(ci) == "true") FAIL() << missing;
    GTEST_SKIP() << missing;
  }
  const fs::path folder = fs::path(STAGE_BINARY_DIR) / "report-command";
  fs::remove_all(folder);
  const auto o = stage::testing::run(
      "run " + std::string(STAGE_SOURCE_DIR) + "/apps/examples/push_pull_class_b.stage --report " +
      (folder / "page.html").string() + " --plots " + (folder / "plots").string());
  ASSERT_EQ(o.status, 0) << o.out;
  const auto charts = nlohmann::json::parse(std::ifstream(folder / "plots" / "charts.json"));
  // The class-B example: a transient (its voltages, its supplies' currents)
  // and a spectrum.
  ASSERT_EQ(charts.size(), 3u);
  for (const auto& c : charts) {
    std::ifstream svg(folder / "plots" / c["file"].get<std::string>());
    const std::string text((std::istreambuf_iterator<char>(svg)), {});
    EXPECT_EQ(text.rfind("<svg", 0), 0u) << c["file"];
    EXPECT_NE(text.find("role-mark"), std::string::npos) << c["file"];
  }
  std::ifstream page(folder / "page.html");
  const std::string html((std::istreambuf_iterator<char>(page)), {});
  EXPECT_NE(html.find("vegaEmbed"), std::string::npos);
  EXPECT_EQ(html.find("<script src="), std::string::npos);  // nothing fetched at view time
}

}  // namespace
