// Reports of the stage report (`analyze characterize`): JSON, a readable
// one-page summary, and CSV.
#pragma once

#include <ostream>

#include "report/format.hpp"
#include "stage/characterize.hpp"

namespace stage::report {

Json to_json(const CharacterizeResult& result);
void print_table(std::ostream& out, const CharacterizeResult& result);
void write_csv(std::ostream& out, const CharacterizeResult& result);

}  // namespace stage::report
