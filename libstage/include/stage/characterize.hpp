// The stage report (`analyze characterize(...)`): in one result, the figures
// a designer reads off a stage: bias and dissipation, gain, input and output
// impedance and bandwidth, headroom and clip level each way, and THD,
// dissipation and efficiency at full swing (the symmetric clip level), at
// half of it, and at the edge of the 1 % limit.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "stage/bias.hpp"
#include "stage/frequency.hpp"
#include "stage/headroom.hpp"
#include "stage/ratings.hpp"
#include "stage/solver.hpp"

namespace stage {

// Powers averaged over the last period of the drive, each element's from its
// own terminal voltages and currents. They balance:
//   supply_power + drive_power = load_power + dissipation + stored_power
// and run_characterize checks that they do (energy_residual).
struct SwingPower {
  double input_amplitude = 0;
  double output_amplitude = 0;  // fundamental
  double thd = 0;
  double supply_power = 0;  // W delivered by the independent sources, the input excluded
  double drive_power = 0;   // W delivered by the input source
  double load_power = 0;    // W of signal into the load (its DC part excluded; 0 without a load)
  // W taken by resistors, semiconductors and controlled sources, and the
  // load's DC part: lost in the stage.
  double dissipation = 0;
  double stored_power = 0;     // W into capacitors and inductors (0 once the drive has settled)
  double energy_residual = 0;  // imbalance of the equation above over supply + drive power
  double efficiency = 0;       // load power over supply power
  // False when the last two periods still differed after the longest run
  // allowed (a slow coupling capacitor): the figures are approximate and
  // stored_power shows the charge still moving; `unsettled` says by how much.
  bool settled = true;
  std::string unsettled;
  // Maximum ratings exceeded at this drive (every accepted point of its
  // run; spec section 4, "Ratings").
  std::vector<RatingViolation> rating_violations;
};

struct CharacterizeResult {
  CharacterizeOptions options;
  std::string output;
  BiasResult bias;
  FrequencyResult frequency;                               // a wide sweep around options.frequency
  double gain = 0;                                         // |output/input| at options.frequency
  std::complex<double> input_impedance, output_impedance;  // at options.frequency
  HeadroomResult headroom;                                 // at a 1 % limit
  // Full swing: the drive where the first side reaches the symmetric clip
  // level (headroom.symmetric_clip_peak); half swing: half that drive.
  std::optional<SwingPower> half_swing, full_swing;
  // At the largest symmetric swing within the 1 % limit (the THD's and each
  // side's shortfall): how clean the stage is before it compresses. Only
  // when a side reaches its limit.
  std::optional<SwingPower> limit_swing;

  // Some bias point or swing exceeded a device's maximum rating.
  bool exceeds_ratings() const;
};

// Throws an invalid_request Error for bad options and NumericalError when an
// analysis fails or a swing's powers do not balance (or its supplies would
// absorb power).
CharacterizeResult run_characterize(const Circuit& circuit, const CharacterizeOptions& options,
                                    const SolverOptions& solver = {},
                                    const ProgressCallback& progress = {});

}  // namespace stage
