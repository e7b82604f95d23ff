// The bias, sweep, transient and spectrum reports: the keys of spec section
// 7, the same names in the CSV, a summary for long runs, one CSV row per
// sample, and numbers a table can hold (infinity, zero, units).
#include <gtest/gtest.h>

#include <limits>
#include <sstream>

#include "report/bias_report.hpp"
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
  // DC as n = 0, then the harmonics; THD and THD+N on every row.
  EXPECT_EQ(csv.str(),
            "n,frequency_Hz,amplitude,phase_deg,thd,thd_plus_noise\n"
            "0,0,0.01,0,0.01,0.02\n"
            "1,1000,1,-3.2,0.01,0.02\n"
            "2,2000,0.01,10,0.01,0.02\n");
  std::ostringstream table;
  stage::report::print_table(table, s);
  EXPECT_NE(table.str().find("DC 10.00 mV"), std::string::npos) << table.str();
  EXPECT_NE(table.str().find("1.000 V"), std::string::npos) << table.str();
  s.signal = "rl.current";
  table.str("");
  stage::report::print_table(table, s);
  EXPECT_NE(table.str().find("DC 10.00 mA"), std::string::npos) << table.str();
}

// A bias point by hand: one node at 0 V, one at 5 V, a transistor without
// Early effect (r_out infinite, as bias.hpp documents).
stage::BiasResult bias_point(double base_voltage) {
  stage::BiasResult b;
  b.node_voltages = {{"out", 5.0}, {"x1/mid", 0.0}, {"base", base_voltage}};
  b.element_currents = {{"vcc.current", -1e-3}};
  stage::BipolarOperatingPoint q;
  q.name = "q1";
  q.region = stage::Region::forward_active;
  q.collector_current = 1e-3;
  q.vbe = 0.65;
  q.r_out = std::numeric_limits<double>::infinity();
  b.bipolars = {q};
  return b;
}

std::string first_line(const std::string& text) { return text.substr(0, text.find('\n')); }

// The CSV names every quantity as the JSON does: nodes as they are,
// "<element>.current", "<device>.<key>"; an infinite figure is "inf" there,
// null in the JSON and "∞" in the table; zero is "0 V", not "0.000 fV".
TEST(BiasReport, CsvNamesAreTheJsonKeysAndInfinityIsShown) {
  const stage::BiasResult b = bias_point(0.65);
  std::ostringstream csv, table;
  stage::report::write_csv(csv, b);
  stage::report::print_table(table, b);
  const std::string text = csv.str();
  for (const char* row :
       {"\nout,5\n", "\nx1/mid,0\n", "\nvcc.current,-0.001\n", "\nq1.region,forward_active\n",
        "\nq1.collector_current,0.001\n", "\nq1.r_out,inf\n"}) {
    EXPECT_NE(text.find(row), std::string::npos) << row << " in\n" << text;
  }
  EXPECT_EQ(text.find("v("), std::string::npos) << text;
  const auto json = stage::report::to_json(b);
  EXPECT_TRUE(json["devices"]["q1"]["r_out"].is_null());
  EXPECT_TRUE(json["node_voltages"].contains("x1/mid"));
  EXPECT_NE(table.str().find("∞ Ω"), std::string::npos) << table.str();
  EXPECT_NE(table.str().find("  0 V\n"), std::string::npos) << table.str();
  EXPECT_EQ(table.str().find("0.000"), std::string::npos) << table.str();
}

// A sweep shows and writes every device's figures as the bias point does,
// and its swept value with the unit of what was swept.
TEST(BiasReport, SweepCarriesDeviceFiguresAndTheSweptUnit) {
  stage::SweepResult r;
  r.options.name = "vin";
  r.options.quantity = stage::Quantity::voltage;
  r.points = {{0.6, bias_point(0.6)}, {0.7, bias_point(0.7)}};
  std::ostringstream csv, table;
  stage::report::write_csv(csv, r);
  stage::report::print_table(table, r);
  EXPECT_EQ(first_line(csv.str()),
            "vin,out,x1/mid,base,vcc.current,q1.kind,q1.region,q1.collector_current,"
            "q1.base_current,q1.emitter_current,q1.vbe,q1.vce,q1.vbc,q1.gm,q1.r_pi,q1.r_out,"
            "q1.c_pi,q1.c_mu,q1.c_cs,q1.power,q1.rated_dissipation");
  EXPECT_NE(csv.str().find("\n0.7,5,0,0.7,-0.001,npn,forward_active,0.001,"), std::string::npos)
      << csv.str();
  const std::string header = table.str().substr(table.str().find("  vin"));
  for (const char* column : {"q1 region", "q1 IC", "q1 VBE", "q1 r_out"}) {
    EXPECT_NE(first_line(header).find(column), std::string::npos) << column << " in " << header;
  }
  EXPECT_NE(table.str().find("\n  700.0 mV "), std::string::npos) << table.str();
  EXPECT_NE(table.str().find("forward_active"), std::string::npos) << table.str();
  EXPECT_EQ(table.str().find("v(out)"), std::string::npos) << table.str();
}

}  // namespace
