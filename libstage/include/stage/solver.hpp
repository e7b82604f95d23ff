// How the equations are solved, kept apart from what is solved (the circuit)
// and what is asked of it (the analysis requests): Newton's tolerances and
// iteration limit, the integration method of a transient, and the smallest
// conductance of the homotopy fallback. The language's `solver(...)`
// statement fills one (stage::Deck::solver), all but the temperature and
// heat-flow tolerances, which only a device with a temperature of its own
// uses (none of the language's kinds has one yet). A prepared simulation
// takes one at construction, the one-shot analyses as an argument after
// the request.
//
//   stage::SolverOptions solver;
//   solver.relative_tolerance = 1e-6;
//   stage::Simulation sim(circuit, solver);
#pragma once

namespace stage {

// TR-BDF2 is the default: L-stable and second order, it damps the
// point-to-point ringing the trapezoidal rule keeps on nearly algebraic
// charges; the trapezoidal rule (no numerical damping, keeps an LC tank's
// energy) and BDF2 stay selectable.
enum class Integration { tr_bdf2, trapezoidal, bdf2 };

// Every unknown is a voltage, a current or a temperature, and each kind has
// its absolute tolerance: Newton stops when each unknown's last change is
// within it plus relative_tolerance of the unknown, and a transient step's
// charge error is held to it times the row's capacitance, inductance or heat
// capacity, plus relative_tolerance of the charge. The residual of each row
// is held to the absolute tolerance of what the row sums, plus
// relative_tolerance of the terms that meet there: currents at a node
// (current_tolerance), a branch equation's voltage (voltage_tolerance), heat
// flows into a temperature (heat_flow_tolerance).
struct SolverOptions {
  double relative_tolerance = 1e-4;
  double voltage_tolerance = 1e-6;   // V
  double current_tolerance = 1e-12;  // A
  // 1 mK. At a fixed current a junction's voltage moves by about -2 mV/K
  // (the textbook figure for silicon), so 1 mK is 2 uV, the order of the
  // voltage tolerance; its saturation current, IS ~ T^3 exp(-Eg / kT), moves
  // by about 15 %/K at 300 K, so 1 mK is 1.5e-4, the order of the relative
  // tolerance.
  double temperature_tolerance = 1e-3;  // K
  // 1 uW: the heat flow that moves a temperature by temperature_tolerance
  // through 1000 K/W, more than the junction-to-ambient resistance of a
  // small plastic transistor package (a few hundred K/W, from memory), as
  // current_tolerance is voltage_tolerance through 1 Mohm.
  double heat_flow_tolerance = 1e-6;  // W
  int max_newton_iterations = 150;
  Integration integration = Integration::tr_bdf2;
  // Conductance stepping (a fallback when plain Newton fails) lowers a
  // conductance from every node to ground down to this value, then removes it.
  double minimum_conductance = 1e-12;
};

}  // namespace stage
