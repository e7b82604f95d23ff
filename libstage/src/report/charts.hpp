// Chart specifications of every analysis for the HTML report and the SVG
// plots: declarative Vega-Lite JSON with the data inline as data (rows of
// numbers, never drawn paths), one specification per plot. Every layer has
// a "name", so that a reader (and the tests) can find a series by it.
#pragma once

#include <string>
#include <vector>

#include "report/format.hpp"
#include "stage/run.hpp"

namespace stage::report {

struct Chart {
  std::string name;   // file stem: "<n>_<kind>_<plot>", n the analysis' place from 1
  std::string title;  // what it shows, for a caption
  Json spec;          // a Vega-Lite specification
};

// Every chart of one analysis; `prefix` is "<n>_<kind>". A bias point and a
// failure have none (the page shows their tables).
std::vector<Chart> charts_of(const BiasResult& result, const std::string& prefix);
std::vector<Chart> charts_of(const SweepResult& result, const std::string& prefix);
std::vector<Chart> charts_of(const FrequencyResult& result, const std::string& prefix);
std::vector<Chart> charts_of(const TransientResult& result, const std::string& prefix);
std::vector<Chart> charts_of(const SpectrumResult& result, const std::string& prefix);
std::vector<Chart> charts_of(const HeadroomResult& result, const std::string& prefix);
std::vector<Chart> charts_of(const CharacterizeResult& result, const std::string& prefix);
std::vector<Chart> charts_of(const AnalysisFailure& result, const std::string& prefix);

// The statement kind of a result ("bias", ..., "<kind>_failed"), as the CSV
// file names use it.
std::string kind_of(const AnalysisResult& result);
// "<n>_<kind>" of the n-th analysis (from 1).
std::string analysis_prefix(const RunResult& run, std::size_t index);

// Every chart of the run, analysis by analysis.
std::vector<Chart> charts(const RunResult& run);

}  // namespace stage::report
