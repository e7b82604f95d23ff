// The configured plotting tools and the checks before they are used.
#include "report/plot_tools.hpp"

#include <cstdlib>
#include <fstream>
#include <sstream>

#include "stage/errors.hpp"

#ifndef STAGE_REPORT_BUNDLES
#define STAGE_REPORT_BUNDLES ""
#endif
#ifndef STAGE_NODE_EXECUTABLE
#define STAGE_NODE_EXECUTABLE ""
#endif

namespace stage {

PlotTools default_plot_tools() {
  const char* bundles = std::getenv("STAGE_REPORT_BUNDLES");
  return {bundles != nullptr && *bundles != '\0' ? bundles : STAGE_REPORT_BUNDLES,
          STAGE_NODE_EXECUTABLE};
}

namespace report {

std::filesystem::path bundle_file(const PlotTools& tools, const std::string& relative) {
  const std::filesystem::path file = tools.bundles / relative;
  if (!std::filesystem::is_regular_file(file)) {
    throw Error(ErrorKind::invalid_request,
                "the plotting library for the report is not installed: '" + file.string() +
                    "' is missing. Install it with `npm ci --ignore-scripts` in '" +
                    tools.bundles.string() +
                    "' (bash cmake/bootstrap.sh does this; it needs Debian's nodejs and npm), "
                    "or name the folder where it is installed with the environment variable "
                    "STAGE_REPORT_BUNDLES (or -DSTAGE_REPORT_BUNDLES=FOLDER when configuring)",
                {file.string()});
  }
  return file;
}

std::string read_whole(const std::filesystem::path& file) {
  std::ifstream in(file, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  if (!in) {
    throw Error(ErrorKind::invalid_request, "cannot read '" + file.string() + "'", {file.string()});
  }
  return text.str();
}

}  // namespace report
}  // namespace stage
