// Reports of a frequency analysis: the JSON of spec section 7 (magnitudes
// under the spec's keys, real and imaginary parts beside them, the derived
// figures and the bias point used), a readable table, and CSV.
#pragma once

#include <ostream>

#include "report/format.hpp"
#include "stage/frequency.hpp"

namespace stage::report {

Json to_json(const FrequencyResult& result);
// One row per frequency: gain, phase, |Zin|, angle of Zin, |Zout|, angle of
// Zout; then the derived figures and the notes.
void print_table(std::ostream& out, const FrequencyResult& result);
// One row per frequency, full precision, impedances as real and imaginary.
void write_csv(std::ostream& out, const FrequencyResult& result);

}  // namespace stage::report
