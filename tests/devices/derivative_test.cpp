// Finite-difference check of every analytic derivative (every entry of G and
// C) of the diode and the bipolar transistor, npn and pnp, with and without
// resistances, charges and breakdown, over a grid of biases that reaches into
// the region where Newton limits the junctions and past the point where the
// junction exponential is continued linearly (80 n kT/q ~ 2.1 V).
#include <gtest/gtest.h>

#include <algorithm>
#include <cstdio>
#include <string>

#include "device_fixtures.hpp"

namespace {

using stage::BipolarModel;
using stage::Polarity;
using namespace stage::testing;

// Tolerance of the scaled error defined in derivative_check.hpp. The error
// budget there is ~1e-9 (truncation plus rounding); 1e-6 leaves room for the
// steeper leakage exponentials and the linear-continuation corner while still
// catching any wrong term, which shows up at order 1 (common practice).
constexpr double kTolerance = 1e-6;

std::string scientific(double v) {
  char text[32];
  std::snprintf(text, sizeof text, "%.3g", v);
  return text;
}

// Junction voltages in the npn sense. Zero itself is left out: the
// current-crowding base resistance has a corner at zero base current.
const double kJunctionGrid[] = {-2.0, -0.4, 0.2, 0.6, 0.72, 0.85, 1.1, 2.5};

double worst_over_grid(const BipolarModel& model, Polarity polarity, double area = 1,
                       double kelvin = stage::kRoomTemperature) {
  auto check = bipolar_check(model, polarity, area);
  double worst = 0, raw = 0;
  for (double vbe : kJunctionGrid) {
    for (double vbc : kJunctionGrid) {
      const auto result = check.compare(bipolar_state(check, polarity, vbe, vbc), kelvin);
      EXPECT_LT(result.worst, kTolerance)
          << "vbe " << vbe << " vbc " << vbc << ": " << result.where;
      worst = std::max(worst, result.worst);
      raw = std::max(raw, result.worst_raw);
    }
  }
  ::testing::Test::RecordProperty(polarity == Polarity::npn ? "worst_npn" : "worst_pnp",
                                  scientific(worst) + " raw " + scientific(raw));
  return worst;
}

TEST(BipolarDerivatives, DefaultModelNpnAndPnp) {
  for (Polarity p : {Polarity::npn, Polarity::pnp}) worst_over_grid(BipolarModel{}, p);
}

TEST(BipolarDerivatives, EbersMollFormWithResistancesAndCharges) {
  BipolarModel m = full_bipolar_model();
  m.form = stage::BipolarForm::ebers_moll;
  for (Polarity p : {Polarity::npn, Polarity::pnp}) worst_over_grid(m, p);
}

TEST(BipolarDerivatives, FullGummelPoonBaseChargeModulatedResistance) {
  for (Polarity p : {Polarity::npn, Polarity::pnp}) worst_over_grid(full_bipolar_model(), p, 2.0);
}

TEST(BipolarDerivatives, FullGummelPoonCurrentCrowdingAwayFromReference) {
  BipolarModel m = full_bipolar_model();
  m.base_resistance_half_current = 1e-3;
  for (Polarity p : {Polarity::npn, Polarity::pnp}) worst_over_grid(m, p, 1.0, 350.0);
}

// The excess-phase network adds a node, a current unknown and their
// stamps, including the transport current's derivatives entering the node.
TEST(BipolarDerivatives, FullGummelPoonWithExcessPhase) {
  BipolarModel m = full_bipolar_model();
  m.excess_phase_delay = 50e-12;
  for (Polarity p : {Polarity::npn, Polarity::pnp}) worst_over_grid(m, p);
}

TEST(BipolarDerivatives, GummelPoonWithoutResistancesOrCharges) {
  BipolarModel m = full_bipolar_model();
  m.base_resistance = m.emitter_resistance = m.collector_resistance = 0;
  m.be_capacitance = m.bc_capacitance = m.cs_capacitance = 0;
  m.forward_transit_time = m.reverse_transit_time = 0;
  for (Polarity p : {Polarity::npn, Polarity::pnp}) worst_over_grid(m, p);
}

double worst_diode(const stage::DiodeModel& model, double area = 1,
                   double kelvin = stage::kRoomTemperature) {
  auto check = diode_check(model, area);
  double worst = 0, raw = 0;
  // Through breakdown (-6.2 V) and past its linear continuation, and
  // forward past the limiting and continuation voltages.
  for (double v : {-12.0, -9.0, -6.6, -6.2, -3.0, -0.5, 0.2, 0.6, 0.8, 1.2, 3.0, 6.0}) {
    // Internal anode 50 mV below the anode when the series resistance exists.
    const auto x =
        check.state({{"a", v + 0.05}, {"k", 0.0}}, [&](const std::string&) { return v; });
    const auto result = check.compare(x, kelvin);
    EXPECT_LT(result.worst, kTolerance) << "v " << v << ": " << result.where;
    worst = std::max(worst, result.worst);
    raw = std::max(raw, result.worst_raw);
  }
  ::testing::Test::RecordProperty("worst_diode", scientific(worst) + " raw " + scientific(raw));
  return worst;
}

TEST(DiodeDerivatives, DefaultModel) { worst_diode(stage::DiodeModel{}); }

TEST(DiodeDerivatives, EveryEffectWithAreaAndTemperature) {
  worst_diode(full_diode_model(), 3.0);
  worst_diode(full_diode_model(), 0.5, 390.0);
}

}  // namespace
