// Reports of a run: the JSON document of spec section 7, the readable tables
// the command prints by default, one CSV file per analysis, and the pictures:
// one self-contained HTML page with a chart of every plot, and the same
// charts as SVG files.
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

// One plot of a run: a Vega-Lite specification (JSON text) with its data
// inline as rows of numbers. `name` is "<n>_<kind>_<plot>" for the n-th
// analysis (from 1), the stem of its SVG file.
struct ChartSpecification {
  std::string name;
  std::string title;
  std::string vega_lite;
};
std::vector<ChartSpecification> chart_specifications(const RunResult& run);

// What draws the charts: the folder where `npm ci` installed Vega, Vega-Lite
// and vega-embed (node_modules/ beside package.json and render-svg.js), and
// Node.js, which renders SVG files with them. The defaults are what the
// build was configured with (STAGE_REPORT_BUNDLES, STAGE_NODE_EXECUTABLE);
// the environment variable STAGE_REPORT_BUNDLES, when set, names the folder.
struct PlotTools {
  std::filesystem::path bundles;
  std::filesystem::path node;
};
PlotTools default_plot_tools();

// Writes one HTML page holding every analysis' figures and charts, with the
// plotting library inline, so that it opens offline. Throws an
// invalid_request Error naming the missing file and how to install it when
// the bundles are missing, a not_written Error when the file cannot be written.
void write_html_report(const std::filesystem::path& file, const RunResult& run,
                       const PlotTools& tools = default_plot_tools());

// Writes <dir>/<name>.svg for every chart (rendered by Node from the same
// specifications) and <dir>/charts.json, the specifications; returns the SVG
// paths. Throws as write_html_report, and an invalid_request Error when Node
// is missing or fails.
std::vector<std::filesystem::path> write_plot_files(const std::filesystem::path& dir,
                                                    const RunResult& run,
                                                    const PlotTools& tools = default_plot_tools());

}  // namespace stage
