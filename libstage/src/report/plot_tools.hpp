// Where the plotting library's files are: the browser bundles the HTML page
// embeds and the Node script that renders SVG files, each checked before use
// so that a missing install is told plainly, with how to install it.
#pragma once

#include <filesystem>
#include <string>

#include "stage/report.hpp"

namespace stage::report {

// The bundles' files, inline in the page, in load order.
inline constexpr const char* kBrowserBundles[] = {
    "node_modules/vega/build/vega.min.js",
    "node_modules/vega-lite/build/vega-lite.min.js",
    "node_modules/vega-embed/build/vega-embed.min.js",
};
inline constexpr const char* kSvgScript = "render-svg.js";

// `tools.bundles / relative`, after checking that it exists; throws an
// invalid_request Error naming it and how to install the bundles when not.
std::filesystem::path bundle_file(const PlotTools& tools, const std::string& relative);

// A whole file's text; throws an invalid_request Error naming it.
std::string read_whole(const std::filesystem::path& file);

}  // namespace stage::report
