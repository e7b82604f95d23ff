// The DC operating point (`analyze bias()`) and DC sweeps (`analyze sweep`):
// options, results and the functions that run them.
//
//   stage::BiasResult op = stage::run_bias(circuit);
//   for (const auto& q : op.bipolars) std::cout << q.name << " " << to_string(q.region);
#pragma once

#include <map>
#include <string>
#include <vector>

#include "stage/analyses.hpp"
#include "stage/circuit.hpp"
#include "stage/progress.hpp"
#include "stage/ratings.hpp"
#include "stage/solver.hpp"

namespace stage {

// Where a bipolar transistor operates, by its internal junctions: only B-E
// conducting (forward_active), both (saturation), only B-C (reverse_active),
// neither (cutoff). to_string gives the names of spec section 7.
enum class Region { forward_active, saturation, cutoff, reverse_active };

// One transistor at the bias point. Currents flow into the device at that
// terminal; voltages are terminal voltages (spec section 7).
struct BipolarOperatingPoint {
  std::string name;
  Polarity polarity = Polarity::npn;
  Region region = Region::cutoff;
  double collector_current = 0, base_current = 0, emitter_current = 0;
  double vbe = 0, vce = 0, vbc = 0;
  double gm = 0;                        // dIC/dVBE (S)
  double r_pi = 0;                      // dVBE/dIB (ohm)
  double r_out = 0;                     // dVCE/dIC (ohm), infinity without Early effect
  double c_pi = 0, c_mu = 0, c_cs = 0;  // B-E, B-C, C-S small-signal capacitances (F)
  double power = 0;                     // W dissipated
  // The dissipation its model's ratings allow at the circuit temperature
  // (derated, spec section 4 "Ratings"); infinity when not rated.
  double rated_dissipation = kInfinity;
};

struct DiodeOperatingPoint {
  std::string name;
  double current = 0;      // anode to cathode through the diode
  double voltage = 0;      // v(anode) - v(cathode)
  double resistance = 0;   // small-signal dV/dI
  double capacitance = 0;  // small-signal dQ/dV
  double power = 0;
};

struct SupplyPower {
  std::string name;    // the voltage or current source
  double current = 0;  // its reported current
  double power = 0;    // delivered into the circuit (W); negative if absorbing
};

// How Newton got there: plain, or through a fallback homotopy.
enum class BiasMethod { newton, conductance_stepping, source_stepping };

struct BiasResult {
  bool converged = false;
  int newton_iterations = 0;  // total, over every homotopy step
  BiasMethod method = BiasMethod::newton;
  double max_kcl_residual = 0;  // A, largest |KCL sum| over the nodes
  // KLU's estimate of the reciprocal condition number of the last Jacobian:
  // near machine precision (1e-16) the bias point is barely determined.
  double reciprocal_condition = 0;
  double temperature = kRoomTemperature;
  std::vector<std::pair<std::string, double>>
      node_voltages;  // circuit nodes, in order of appearance
  std::vector<std::pair<std::string, double>> element_currents;  // "<name>.current"
  // K, "<name>.temperature": elements with a temperature of their own, which
  // heat flows set (none of the language's kinds has one yet).
  std::vector<std::pair<std::string, double>> element_temperatures;
  std::vector<BipolarOperatingPoint> bipolars;
  std::vector<DiodeOperatingPoint> diodes;
  std::vector<SupplyPower> supplies;
  // Figures that stand but should not be trusted blindly: a device far
  // outside the range its model describes, a nearly singular system. Each
  // names the device or node.
  std::vector<std::string> warnings;
  // Maximum ratings exceeded (devices whose models carry ratings).
  std::vector<RatingViolation> rating_violations;

  double voltage(const std::string& node) const;            // throws std::out_of_range
  double current(const std::string& element) const;         // element name, without ".current"
  double temperature_of(const std::string& element) const;  // its own, K; without ".temperature"
  const BipolarOperatingPoint& bipolar(const std::string& name) const;
  const DiodeOperatingPoint& diode(const std::string& name) const;
};

// Throws NumericalError (naming nodes) if no operating point is found.
BiasResult run_bias(const Circuit& circuit, const SolverOptions& solver = {});

struct SweepPoint {
  double value = 0;
  BiasResult bias;
};

struct SweepResult {
  SweepOptions options;
  std::vector<SweepPoint> points;
};

// Source and temperature sweeps. Parameter sweeps need the text's `let`
// parameters: see run_parameter_sweep in stage/run.hpp.
SweepResult run_sweep(const Circuit& circuit, const SweepOptions& options,
                      const SolverOptions& solver = {}, const ProgressCallback& progress = {});

std::string_view to_string(BiasMethod method);
std::string_view to_string(Region region);

}  // namespace stage
