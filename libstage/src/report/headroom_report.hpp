// Reports of the headroom analysis: spec section 7's JSON, a readable table
// with the load-line estimate beside the simulated limits, and CSV.
#pragma once

#include <ostream>

#include "report/format.hpp"
#include "stage/headroom.hpp"

namespace stage::report {

Json to_json(const HeadroomResult& result);
void print_table(std::ostream& out, const HeadroomResult& result);
// "quantity,value" rows of every figure.
void write_csv(std::ostream& out, const HeadroomResult& result);

// Shared with the stage report.
Json to_json(const LoadLineEstimate& line);
void print_table(std::ostream& out, const LoadLineEstimate& line);

}  // namespace stage::report
