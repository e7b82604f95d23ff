// The fixture circuits that compute a model's curve: one small circuit per
// curve kind, built in code around the device, solved by the simulator's own
// analyses (DC sweeps with the previous point as the guess, the frequency
// analysis for transition frequency).
#pragma once

#include <vector>

#include "stage/bias.hpp"
#include "stage/curves.hpp"
#include "stage/solver.hpp"

namespace stage::curves {

// The model's value of each of reference.measured at each reference point:
// values[point][k]. Bipolar fixtures simulate an npn with the model's
// parameters and return magnitudes (see curves.hpp on polarity).
std::vector<std::vector<double>> simulate(const Curve& reference, const DeviceModel& model);

// The fixture circuit's solver: much tighter than the default so that finite
// differences of a curve with respect to model parameters are not lost in
// Newton's stopping tolerance.
SolverOptions fixture_solver();

// The device's model name inside every fixture circuit.
inline constexpr const char* kDeviceModel = "device_under_test";

// A circuit holding only the model, at the curve's temperature; the fixture
// adds the device (`q` or `d`) and its sources, and solves it with the
// fixture solver.
Circuit fixture_circuit(const Curve& reference, const DeviceModel& model);

// run_sweep over one independent source with the fixture solver: the
// previous point is the guess.
std::vector<BiasResult> sweep_source(const Circuit& circuit, const std::string& source,
                                     const std::vector<double>& values);

// The transistor at each reference point's collector current (the swept
// value) and the held VCE: the current_gain fixture, also the DC part of
// the transition-frequency fixture.
std::vector<BiasResult> forced_collector_current(const Curve& reference, const DeviceModel& model);

// small_signal_fixtures.cpp
std::vector<std::vector<double>> junction_capacitance(const Curve& reference,
                                                      const DeviceModel& model);
std::vector<std::vector<double>> transition_frequency(const Curve& reference,
                                                      const DeviceModel& model);

}  // namespace stage::curves
