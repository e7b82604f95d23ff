// Round trips of the fit: curves computed from a known parameter set are
// fitted back from a start far off. Without noise the known values must come
// back to the solver's precision; with noise, within the fit's own
// uncertainty estimate.
#include <gtest/gtest.h>

#include <array>

#include "curve_builders.hpp"

namespace {

using namespace stage;
using namespace stage::testing;

const std::vector<std::string> kParams{"saturation_current",   "beta_forward",
                                       "knee_current_forward", "be_leakage_current",
                                       "be_leakage_emission",  "early_voltage_forward"};

BipolarModel shifted_start() {
  BipolarModel m = round_trip_npn();
  m.saturation_current *= 2.5;
  m.beta_forward *= 0.6;
  m.knee_current_forward *= 3;
  m.be_leakage_current *= 0.2;
  m.be_leakage_emission = 1.9;
  m.early_voltage_forward *= 2;
  return m;
}

double true_value(const std::string& name) {
  const BipolarModel m = round_trip_npn();
  for (const auto& row : bipolar_parameters()) {
    if (row.name == name) return m.*(row.field);
  }
  return NAN;
}

FitResult fit_with_noise(double sigma) {
  const DeviceModel truth{"truth", round_trip_npn()};
  const std::array curves{reference(gummel_shape(), truth, sigma, 2024),
                          reference(output_shape(), truth, sigma, 7)};
  return fit_model({"start", shifted_start()}, curves, kParams);
}

// Exact round trip: the data are the model's own curves, so the fit must
// return the known values. 1e-6 relative is far above what the 1e-10
// Newton tolerance leaves in the curves and far below the 20 % to 400 %
// the start is off by.
TEST(FitRoundTrip, NoiseFreeCurvesGiveBackTheKnownParameters) {
  const FitResult r = fit_with_noise(0);
  EXPECT_TRUE(r.converged) << r.report();
  for (const auto& p : r.parameters) {
    EXPECT_NEAR(p.value, true_value(p.name), 1e-6 * true_value(p.name)) << p.name;
    RecordProperty(p.name + "_relative_error", std::to_string(p.value / true_value(p.name) - 1));
  }
  EXPECT_LT(r.final_cost, 1e-10) << r.report();
}

// With 1 % log-normal noise (fixed seeds) each fitted value must lie within
// 3 estimated standard deviations of the known one (covariance s²(JᵀJ)⁻¹:
// 3 sd covers 99.7 % for a linearised Gaussian estimate). So that the check
// can fail, the estimates must also be tight: under 10 % of the value, much
// less than the distance of the start from the truth.
TEST(FitRoundTrip, NoisyCurvesGiveBackTheKnownParametersWithinTheirUncertainty) {
  const FitResult r = fit_with_noise(0.01);
  EXPECT_TRUE(r.converged) << r.report();
  for (const auto& p : r.parameters) {
    const double truth = true_value(p.name);
    EXPECT_LE(std::abs(p.value - truth), 3 * p.uncertainty)
        << p.name << " fitted " << p.value << " ± " << p.uncertainty << ", true " << truth;
    EXPECT_LT(p.uncertainty, 0.1 * std::abs(truth)) << p.name;
    EXPECT_GT(std::abs(p.start - truth), 3 * p.uncertainty) << p.name;
    std::cout << p.name << ": true " << truth << " fitted " << p.value << " ± " << p.uncertainty
              << " (" << (p.value - truth) / p.uncertainty << " sd)\n";
  }
  // The residual scale s matches the noise: 1 % noise over a 5 % tolerance on
  // a log scale is 0.01 / ln(1.05) = 0.205 per value (chi-square argument).
  const double s = std::sqrt(r.final_cost / (r.residual_count - 6));
  EXPECT_NEAR(s, 0.01 / std::log1p(0.05), 0.03);
}

// A diode: saturation current, emission coefficient and series resistance
// back from a forward curve with 1 % noise, within 3 sd.
TEST(FitRoundTrip, DiodeForwardCurve) {
  DiodeModel truth;
  truth.saturation_current = 4e-9;
  truth.emission_coefficient = 1.8;
  truth.series_resistance = 0.6;
  const auto shape = curve_of(CurveKind::diode_forward, CurveQuantity::forward_voltage,
                              {CurveQuantity::forward_current}, {}, range(0.2, 1.1, 0.05), "if");
  const std::array curves{reference(shape, {"truth", truth}, 0.01, 99)};
  DiodeModel start = truth;
  start.saturation_current = 1e-10;
  start.emission_coefficient = 1.3;
  start.series_resistance = 3;
  const std::vector<std::string> names{"saturation_current", "emission_coefficient",
                                       "series_resistance"};
  const FitResult r = fit_model({"start", start}, curves, names);
  EXPECT_TRUE(r.converged) << r.report();
  const std::array expected{truth.saturation_current, truth.emission_coefficient,
                            truth.series_resistance};
  for (std::size_t i = 0; i < expected.size(); ++i) {
    const auto& p = r.parameters[i];
    EXPECT_LE(std::abs(p.value - expected[i]), 3 * p.uncertainty) << p.name;
    EXPECT_LT(p.uncertainty, 0.1 * expected[i]) << p.name;
    std::cout << p.name << ": true " << expected[i] << " fitted " << p.value << " ± "
              << p.uncertainty << "\n";
  }
}

// The derived statement names the base model and every fitted parameter
// with its value and unit, in the `.stage` model syntax (spec section 4).
TEST(FitResult, ModelStatementDerivesFromTheStartModel) {
  FitResult r;
  r.model.name = "small_npn";
  r.parameters.push_back({"saturation_current", Quantity::current, 1e-14, 1.25e-14, 2e-16});
  r.parameters.push_back({"beta_forward", Quantity::dimensionless, 100, 180, 3});
  EXPECT_EQ(r.model_statement("fitted"),
            "model fitted = small_npn {\n"
            "  saturation_current = 1.25e-14       # A, ± 2e-16 (1 sd)\n"
            "  beta_forward       = 180            # ± 3 (1 sd)\n"
            "}\n");
}

// The report shows each uncertainty with two significant digits in the SI
// prefix its size calls for (a = 1e-18, f = 1e-15, m = 1e-3: the SI
// prefixes), also below femto, where a fixed number of decimals in fA would
// print a zero that is not zero.
TEST(FitResult, ReportShowsUncertaintiesWithSignificantDigits) {
  FitResult r;
  r.model.name = "small_npn";
  auto parameter = [](std::string name, Quantity q, double value, double uncertainty) {
    FittedParameter p{std::move(name), q, value, value, uncertainty};
    p.log_scale = true;
    return p;
  };
  r.parameters = {parameter("saturation_current", Quantity::current, 1e-14, 3.2e-18),
                  parameter("be_leakage_current", Quantity::current, 1e-13, 9.97e-16),
                  parameter("beta_forward", Quantity::dimensionless, 180, 0.71)};
  const std::string report = r.report();
  EXPECT_NE(report.find(" 3.2 aA "), std::string::npos) << report;
  // Two significant digits, or the three a prefix's integer part needs.
  EXPECT_NE(report.find(" 997 aA "), std::string::npos) << report;
  EXPECT_NE(report.find(" 710m "), std::string::npos) << report;
  EXPECT_EQ(report.find(" 0.0 fA"), std::string::npos) << report;
  EXPECT_EQ(report.find(" 0 A"), std::string::npos) << report;
}

}  // namespace
