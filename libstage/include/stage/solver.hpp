// How the equations are solved, kept apart from what is solved (the circuit)
// and what is asked of it (the analysis requests): Newton's tolerances and
// iteration limit, the integration method of a transient, and the smallest
// conductance of the homotopy fallback. The language's `solver(...)`
// statement fills one (stage::Deck::solver); a prepared simulation takes one
// at construction, the one-shot analyses as an argument after the request.
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

struct SolverOptions {
  double relative_tolerance = 1e-4;
  double voltage_tolerance = 1e-6;
  double current_tolerance = 1e-12;
  int max_newton_iterations = 150;
  Integration integration = Integration::tr_bdf2;
  // Conductance stepping (a fallback when plain Newton fails) lowers a
  // conductance from every node to ground down to this value, then removes it.
  double minimum_conductance = 1e-12;
};

}  // namespace stage
