// Reports of a run: the JSON document of spec section 7, the readable tables
// the command prints by default, and one CSV file per analysis.
#pragma once

#include <filesystem>
#include <ostream>
#include <string>
#include <vector>

#include "stage/run.hpp"

namespace stage {

std::string json_document(const RunResult& run, int indent = 2);
void print_report(std::ostream& out, const RunResult& run);
// Creates `dir` (and its parents) for output files; throws a not_written
// Error naming it when it cannot.
void create_output_folder(const std::filesystem::path& dir);
// Writes <dir>/<n>_<kind>.csv for the n-th analysis (from 1), creating <dir>;
// returns the paths. Throws a not_written Error naming the folder or file.
std::vector<std::filesystem::path> write_csv_files(const std::filesystem::path& dir,
                                                   const RunResult& run);

}  // namespace stage
