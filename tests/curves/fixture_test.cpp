// The small-signal fixtures against published formulas: junction
// capacitance against the depletion formula, transition frequency against
// the hybrid-pi model built from the device's own reported small-signal
// values; and the forced-collector-current fixture against its definition.
#include <gtest/gtest.h>

#include <complex>
#include <numbers>

#include "curve_builders.hpp"
#include "curves/fixtures.hpp"

namespace {

using namespace stage;
using namespace stage::testing;
using Q = CurveQuantity;

// Textbook depletion capacitance C = C0 / (1 - V/phi)^m at junction voltage
// V = -VR (Sze, Physics of Semiconductor Devices, ch. 2; Gray & Meyer 1.2).
double depletion(double c0, double phi, double m, double reverse) {
  return c0 / std::pow(1 + reverse / phi, m);
}

// Reverse bias needs no depletion_fill_coefficient continuation, and with
// zero transit times no diffusion capacitance adds to the junction's, so the
// fixture must reproduce the formula to rounding (1e-9 allows for the
// solver's 1e-12 V on the junction voltage).
constexpr double kRounding = 1e-9;

TEST(JunctionCapacitance, BaseCollectorFollowsDepletionFormula) {
  BipolarModel m;
  m.bc_capacitance = 4e-12;
  m.bc_potential = 0.7;
  m.bc_grading = 0.4;
  m.be_capacitance = 9e-12;  // must not leak into the base-collector reading
  const auto shape = curve_of(CurveKind::junction_capacitance, Q::reverse_voltage,
                              {Q::base_collector_capacitance}, {}, range(0, 30, 2.5), "ccb");
  const Curve c = compute_curve(shape, {"m", m});
  for (const auto& p : c.points) {
    EXPECT_NEAR(p.measured[0], depletion(4e-12, 0.7, 0.4, p.swept), kRounding * 4e-12)
        << "VR = " << p.swept;
  }
}

TEST(JunctionCapacitance, BaseEmitterFollowsDepletionFormula) {
  BipolarModel m;
  m.be_capacitance = 12e-12;
  m.be_potential = 0.8;
  m.be_grading = 0.33;
  m.bc_capacitance = 3e-12;
  const auto shape = curve_of(CurveKind::junction_capacitance, Q::reverse_voltage,
                              {Q::base_emitter_capacitance}, {}, range(0, 5, 0.5), "ceb");
  const Curve c = compute_curve(shape, {"m", m});
  for (const auto& p : c.points) {
    EXPECT_NEAR(p.measured[0], depletion(12e-12, 0.8, 0.33, p.swept), kRounding * 12e-12);
  }
}

TEST(JunctionCapacitance, DiodeFollowsDepletionFormula) {
  DiodeModel d;
  d.junction_capacitance = 2e-12;
  d.junction_potential = 0.9;
  d.grading = 0.5;
  const auto shape = curve_of(CurveKind::junction_capacitance, Q::reverse_voltage,
                              {Q::diode_capacitance}, {}, range(0, 50, 5), "cj");
  const Curve c = compute_curve(shape, {"d", d});
  for (const auto& p : c.points) {
    EXPECT_NEAR(p.measured[0], depletion(2e-12, 0.9, 0.5, p.swept), kRounding * 2e-12);
  }
}

BipolarModel hybrid_pi_npn() {
  BipolarModel m;
  m.saturation_current = 1e-14;
  m.beta_forward = 100;
  m.be_capacitance = 8e-12;
  m.bc_capacitance = 3e-12;
  m.forward_transit_time = 300e-12;
  // No resistances, so the terminals are the hybrid-pi's; no Early voltage or
  // knee, so the transit charge depends on VBE alone (no B-C cross term).
  return m;
}

Curve transition_shape(std::optional<double> frequency) {
  std::vector<std::pair<Q, double>> held{{Q::collector_emitter_voltage, 5.0}};
  if (frequency) held.emplace_back(Q::frequency, *frequency);
  return curve_of(CurveKind::transition_frequency, Q::collector_current, {Q::transition_frequency},
                  held, {0.1e-3, 0.3e-3, 1e-3, 3e-3, 10e-3}, "ft");
}

// At a given measurement frequency the fixture's f |h21(f)| must equal the
// hybrid-pi short-circuit current gain built from the device's reported gm,
// r_pi, c_pi, c_mu: h21 = (gm - jwCmu) / (1/r_pi + jw(Cpi + Cmu))
// (Gray & Meyer, Analysis and Design of Analog ICs, 1.4.8). Both sides are
// the same linearisation, so they agree to the solver's rounding (1e-7).
TEST(TransitionFrequency, MatchesHybridPiCurrentGainAtTheMeasurementFrequency) {
  const double f = 20e6;
  const DeviceModel model{"m", hybrid_pi_npn()};
  const Curve shape = transition_shape(f);
  const Curve c = compute_curve(shape, model);
  const auto dc = curves::forced_collector_current(shape, model);
  for (std::size_t i = 0; i < c.points.size(); ++i) {
    const auto& q = dc[i].bipolar("q");
    const std::complex<double> jw(0, 2 * std::numbers::pi * f);
    const auto h21 = (q.gm - jw * q.c_mu) / (1 / q.r_pi + jw * (q.c_pi + q.c_mu));
    EXPECT_NEAR(c.points[i].measured[0], f * std::abs(h21), 1e-7 * f * std::abs(h21))
        << "IC = " << c.points[i].swept;
  }
}

// Extrapolated from the -20 dB/decade region, fT approaches the textbook
// fT = gm / (2 pi (Cpi + Cmu)) (Sedra & Smith, hybrid-pi model). At the
// automatic measurement frequency the two neglected hybrid-pi terms are each
// about 1/(2 beta) = 0.5 % for beta = 100; 1/beta bounds both.
TEST(TransitionFrequency, ExtrapolatesToGmOverTwoPiCTotal) {
  const DeviceModel model{"m", hybrid_pi_npn()};
  const Curve shape = transition_shape(std::nullopt);
  const Curve c = compute_curve(shape, model);
  const auto dc = curves::forced_collector_current(shape, model);
  for (std::size_t i = 0; i < c.points.size(); ++i) {
    const auto& q = dc[i].bipolar("q");
    const double ft = q.gm / (2 * std::numbers::pi * (q.c_pi + q.c_mu));
    const double beta = q.collector_current / q.base_current;
    EXPECT_NEAR(c.points[i].measured[0], ft, ft / beta) << "IC = " << c.points[i].swept;
  }
}

// The forced-IC fixture must put exactly the swept current through the
// collector at the held VCE (its definition), to the solver's tolerance.
TEST(ForcedCollectorCurrent, HoldsCollectorCurrentAndVce) {
  const DeviceModel model{"m", round_trip_npn()};
  const Curve shape = transition_shape(std::nullopt);
  const auto dc = curves::forced_collector_current(shape, model);
  for (std::size_t i = 0; i < dc.size(); ++i) {
    const auto& q = dc[i].bipolar("q");
    EXPECT_NEAR(q.collector_current, shape.points[i].swept, 1e-9 * shape.points[i].swept);
    EXPECT_NEAR(q.vce, 5.0, 1e-9);
  }
}

}  // namespace
