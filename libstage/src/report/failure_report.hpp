// Reports of an analysis that failed: its error, in the place its result
// would have taken, so the analyses around it keep theirs. Same shape as
// bias_report.hpp.
#pragma once

#include <ostream>

#include "report/format.hpp"
#include "stage/run.hpp"

namespace stage::report {

// {"kind": <the analysis kind>, "error": message, "involved": [names],
// "line": n}: the key "error" marks a failed analysis.
Json to_json(const AnalysisFailure& failure);
void print_table(std::ostream& out, const AnalysisFailure& failure);
// Header "error,involved", one row.
void write_csv(std::ostream& out, const AnalysisFailure& failure);

}  // namespace stage::report
