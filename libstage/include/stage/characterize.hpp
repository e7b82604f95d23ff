// The stage report (`analyze characterize(...)`): in one result, the figures
// a designer reads off a stage: bias and dissipation, gain, input and output
// impedance and bandwidth, headroom each way, THD at half and at full
// headroom, and efficiency at full swing.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "stage/bias.hpp"
#include "stage/frequency.hpp"
#include "stage/headroom.hpp"

namespace stage {

// Powers averaged over one period of the drive.
struct SwingPower {
  double input_amplitude = 0;
  double output_amplitude = 0;  // fundamental
  double thd = 0;
  double supply_power = 0;  // W delivered by the DC supplies (the input source excluded)
  double load_power = 0;    // W of signal into the load (its DC part excluded; 0 without a load)
  double dissipation = 0;   // supply power less load power: lost in the stage
  double efficiency = 0;    // load power over supply power
};

struct CharacterizeResult {
  CharacterizeOptions options;
  std::string output;
  BiasResult bias;
  FrequencyResult frequency;                               // a wide sweep around options.frequency
  double gain = 0;                                         // |output/input| at options.frequency
  std::complex<double> input_impedance, output_impedance;  // at options.frequency
  HeadroomResult headroom;                                 // at a 1 % limit
  std::optional<SwingPower> half_swing, full_swing;  // at half and all of the symmetric headroom
};

// Throws std::invalid_argument for bad options and NumericalError when an
// analysis fails.
CharacterizeResult run_characterize(const Circuit& circuit, const CharacterizeOptions& options,
                                    const ProgressCallback& progress = {});

}  // namespace stage
