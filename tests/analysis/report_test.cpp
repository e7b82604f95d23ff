// The transient and spectrum reports: the keys of spec section 7, a summary
// for long runs, and one CSV row per sample.
#include <gtest/gtest.h>

#include <sstream>

#include "report/spectrum_report.hpp"
#include "report/transient_report.hpp"

namespace {

stage::TransientResult small_result(std::size_t points) {
  stage::TransientResult r;
  r.signals = {{"out", {}}, {"v1.current", {}}};
  for (std::size_t k = 0; k < points; ++k) {
    r.time.push_back(1e-6 * static_cast<double>(k));
    r.signals[0].values.push_back(static_cast<double>(k));
    r.signals[1].values.push_back(-1e-3 * static_cast<double>(k));
  }
  return r;
}

TEST(TransientReport, JsonKeysOfTheSpec) {
  const auto j = stage::report::to_json(small_result(3));
  EXPECT_EQ(j["kind"], "transient");
  EXPECT_EQ(j["time_s"].size(), 3u);
  EXPECT_EQ(j["signals"]["out"][2], 2.0);
  EXPECT_EQ(j["signals"]["v1.current"].size(), 3u);
}

TEST(TransientReport, LongRunPrintsASummaryAndCsvEverySample) {
  const auto r = small_result(1000);
  std::ostringstream table, csv;
  stage::report::print_table(table, r);
  stage::report::write_csv(csv, r);
  const std::string summary = table.str();
  EXPECT_NE(summary.find("1000 points"), std::string::npos);
  EXPECT_NE(summary.find("final"), std::string::npos);
  EXPECT_LT(std::count(summary.begin(), summary.end(), '\n'), 10);
  const std::string text = csv.str();
  EXPECT_EQ(text.substr(0, text.find('\n')), "time_s,out,v1.current");
  EXPECT_EQ(std::count(text.begin(), text.end(), '\n'), 1001);
}

TEST(SpectrumReport, JsonKeysOfTheSpec) {
  stage::SpectrumResult s;
  s.signal = "out";
  s.fundamental = 1e3;
  s.dc = 0.01;
  s.harmonics = {{1, 1.0, -3.2}, {2, 0.01, 10.0}};
  s.thd = 0.01;
  auto j = stage::report::to_json(s);
  EXPECT_EQ(j["kind"], "spectrum");
  EXPECT_EQ(j["fundamental_Hz"], 1e3);
  EXPECT_EQ(j["harmonics"][0]["n"], 1);
  EXPECT_EQ(j["harmonics"][0]["phase_deg"], -3.2);
  EXPECT_EQ(j["thd"], 0.01);
  EXPECT_FALSE(j.contains("thd_plus_noise"));
  s.thd_plus_noise = 0.02;
  EXPECT_EQ(stage::report::to_json(s)["thd_plus_noise"], 0.02);
  std::ostringstream csv;
  stage::report::write_csv(csv, s);
  const std::string text = csv.str();
  EXPECT_EQ(std::count(text.begin(), text.end(), '\n'), 3);
}

}  // namespace
