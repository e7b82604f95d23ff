// Reports of a transient: the JSON of spec section 7, a readable summary
// and CSV of every sample. Same shape as bias_report.hpp.
#pragma once

#include <ostream>

#include "report/format.hpp"
#include "stage/transient.hpp"

namespace stage::report {

// {"kind": "transient", "time_s": [...], "signals": {"out": [...], ...}}
Json to_json(const TransientResult& result);
// Every sample for a short run; for a long one the number of points and the
// minimum, maximum and final value of each signal.
void print_table(std::ostream& out, const TransientResult& result);
// Header "time_s,<signal>,...", then one row per sample.
void write_csv(std::ostream& out, const TransientResult& result);

}  // namespace stage::report
