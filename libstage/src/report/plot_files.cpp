// The charts as SVG files: the specifications written to charts.json and
// rendered by the committed Node script with the same Vega and Vega-Lite the
// page embeds (View.toSVG(), headless).
#include <cstdlib>
#include <fstream>

#include "report/charts.hpp"
#include "report/plot_tools.hpp"
#include "stage/errors.hpp"
#include "stage/report.hpp"

namespace stage {
namespace {

// A path as one word for the shell: single-quoted, with each ' closed,
// escaped and reopened.
std::string shell_word(const std::filesystem::path& path) {
  std::string word = "'";
  for (const char c : path.string()) word += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return word + "'";
}

}  // namespace

std::vector<ChartSpecification> chart_specifications(const RunResult& run) {
  std::vector<ChartSpecification> specs;
  for (const auto& c : report::charts(run)) specs.push_back({c.name, c.title, c.spec.dump()});
  return specs;
}

std::vector<std::filesystem::path> write_plot_files(const std::filesystem::path& dir,
                                                    const RunResult& run, const PlotTools& tools) {
  const std::filesystem::path script = report::bundle_file(tools, report::kSvgScript);
  for (const char* bundle : report::kBrowserBundles) report::bundle_file(tools, bundle);
  if (tools.node.empty() || !std::filesystem::exists(tools.node)) {
    throw Error(ErrorKind::invalid_request,
                "writing plots needs Node.js, not found" +
                    (tools.node.empty() ? std::string(" when the build was configured")
                                        : " at '" + tools.node.string() + "'") +
                    ": install Debian's nodejs (bash cmake/bootstrap.sh does) and configure "
                    "again, or set -DSTAGE_NODE_EXECUTABLE=PATH",
                {"node"});
  }
  create_output_folder(dir);
  report::Json list = report::Json::array();
  std::vector<std::filesystem::path> written;
  for (auto& c : report::charts(run)) {
    const std::string file = c.name + ".svg";
    list.push_back(report::Json{{"file", file}, {"spec", std::move(c.spec)}});
    written.push_back(dir / file);
  }
  const std::filesystem::path specs = dir / "charts.json";
  {
    std::ofstream out(specs);
    out << list.dump();
    if (!out) {
      throw Error(ErrorKind::not_written, "cannot write '" + specs.string() + "'",
                  {specs.string()});
    }
  }
  const std::string command = shell_word(tools.node) + " " + shell_word(script) + " " +
                              shell_word(specs) + " " + shell_word(dir);
  if (std::system(command.c_str()) != 0) {
    throw Error(ErrorKind::not_written,
                "rendering the plots into '" + dir.string() + "' failed (" + command +
                    "); its message is above",
                {dir.string()});
  }
  return written;
}

}  // namespace stage
