// The small types every part of the matrix layer shares: unknown indices,
// value slots, and what an evaluation of the devices is asked for and where
// it writes. Nothing here knows circuits, devices or results.
#pragma once

#include "stage/models.hpp"

namespace stage::mna {

using Index = int;
inline constexpr Index kGroundIndex = 0;
using Slot = int;

// What an evaluation is for. The same evaluate() serves DC, AC bias, and each
// transient step.
struct EvalRequest {
  const double* x = nullptr;  // x[0] = 0 (ground), unknowns x[1..n]
  double time = 0;            // seconds; used when !dc
  bool dc = true;             // sources at their DC value; else at `time`
  double source_scale = 1;    // independent sources scaled (source stepping)
  bool limit = false;         // junction-voltage limiting (Newton iterations > 1)
  // q and C wanted. A DC solve reads neither: without them the evaluation
  // of a nonlinear system writes only f and G and leaves q and C as they were.
  bool charges = true;
  double temperature = kRoomTemperature;
};

// Where an evaluation goes. f and q have n + 1 entries (0 is trash); g and c
// have nnz + 1 (the last is trash).
struct EvalOutput {
  double* f = nullptr;
  double* q = nullptr;
  double* g = nullptr;
  double* c = nullptr;
  // Set by a device whose evaluation used a limited junction voltage instead
  // of the one in x: the stamped residual is then that of a linearisation,
  // and Newton must not take it as converged.
  bool limited = false;
  // Set by a device that evaluated a junction beyond the range where its
  // model's equations hold (see ModelRangeFindings): cheap to test at every
  // accepted point, check_model_range then says which and why.
  bool beyond_model_range = false;
};

}  // namespace stage::mna
