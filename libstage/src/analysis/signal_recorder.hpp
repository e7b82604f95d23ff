// Reads the signals a transient keeps out of each accepted solution: node
// voltages, node-pair voltages, elements' reported currents and own
// temperatures, with their
// time derivatives at both ends of each step for the interpolant.
#pragma once

#include <span>
#include <vector>

#include "mna/system.hpp"
#include "stage/signal.hpp"
#include "stage/transient.hpp"

namespace stage::analysis {

// The polynomial an accepted step's signals follow from its start to its
// end, which gives their slopes at both ends: the line (backward Euler),
// the quadratic also through the point before the step (the trapezoidal
// rule and BDF2), or also through the step's inner stage (TR-BDF2).
enum class StepShape { line, through_previous_point, through_inner_stage };

class SignalRecorder {
 public:
  // `wanted` empty: every circuit node voltage, every reported current and
  // every element's own temperature ("<name>.temperature").
  // Samples before `from` are not kept. Throws an invalid_request Error for a
  // node or element that does not exist.
  SignalRecorder(const mna::System& system, const std::vector<SignalRef>& wanted, double from,
                 TransientResult& result);

  // The first point, at time t with solution x.
  void start(double t, const std::vector<double>& x);
  // An accepted step to time t with solution x; for through_inner_stage,
  // the inner stage's time and solution.
  void advance(double t, const std::vector<double>& x, StepShape shape, double t_stage = 0,
               const std::vector<double>* x_stage = nullptr);

 private:
  // A voltage x[p] - x[n], or a device's reported current.
  struct Probe {
    mna::Index p = mna::kGroundIndex, n = mna::kGroundIndex;
    const mna::Device* device = nullptr;
  };
  void add_current(const mna::Device& device, const std::string& name);
  void add_every_current(const mna::Device& device);
  // Every signal's value at solution x and time t.
  void read(double t, const std::vector<double>& x, std::span<double> out) const;
  void append(double t, std::span<const double> values);

  const mna::System& system_;
  double from_;
  TransientResult& result_;
  std::vector<Probe> probes_;
  std::vector<double> zero_;
  // Signal values at the last two accepted points (recorded or not) and at
  // an inner stage, newest first; and the step's slopes at its two ends.
  double t_now_ = 0, t_before_ = 0;
  std::vector<double> now_, before_, stage_, newest_, slope_start_, slope_end_;
};

}  // namespace stage::analysis
