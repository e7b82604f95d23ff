// Reports of a spectrum: the JSON of spec section 7, a readable table of the
// harmonics and CSV. Same shape as bias_report.hpp.
#pragma once

#include <ostream>

#include "report/format.hpp"
#include "stage/spectrum.hpp"

namespace stage::report {

// {"kind": "spectrum", "signal", "fundamental_Hz", "dc", "harmonics": [{"n",
// "amplitude", "phase_deg"}], "thd"}, "thd_plus_noise" when computed, and
// "settled" (with "warning" when false).
Json to_json(const SpectrumResult& result);
void print_table(std::ostream& out, const SpectrumResult& result);
// Header "n,frequency_Hz,amplitude,phase_deg", one row per harmonic.
void write_csv(std::ostream& out, const SpectrumResult& result);

}  // namespace stage::report
