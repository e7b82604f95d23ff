// The headroom search on a sine drive that is shared: run_headroom makes a
// drive of its own, the stage report (characterize) runs the search on the
// drive it also reads its powers from, so both solve the bias point once
// and build one system.
#pragma once

#include "large_signal/sine_drive.hpp"
#include "stage/headroom.hpp"

namespace stage::analysis {

// `drive` runs on `circuit` with only the input carrying an AC phasor
// (with_only_ac_input); the options have been validated.
HeadroomResult headroom_search(const Circuit& circuit, const SineDrive& drive,
                               const HeadroomOptions& options, const ProgressCallback& progress);

}  // namespace stage::analysis
