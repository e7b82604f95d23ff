// Reports of the bias point and of DC sweeps: the JSON of spec section 7, a
// readable table grouped by device, and CSV. Every analysis has a report
// header of this shape (to_json, print_table, write_csv).
#pragma once

#include <ostream>

#include "report/format.hpp"
#include "stage/bias.hpp"

namespace stage::report {

Json to_json(const BiasResult& result);
void print_table(std::ostream& out, const BiasResult& result);
// One row per node, current and device figure: "quantity,value".
void write_csv(std::ostream& out, const BiasResult& result);

Json to_json(const SweepResult& result);
void print_table(std::ostream& out, const SweepResult& result);
// One row per point: the swept value, every node voltage and current.
void write_csv(std::ostream& out, const SweepResult& result);

}  // namespace stage::report
