// The HTML report: one self-contained page, a section per analysis with its
// figures (the operating point as tables; every other analysis' readable
// report folded beneath its charts) and its charts, rendered in the page by
// Vega-Lite from the specifications of charts.cpp. The plotting library is
// inline, so the page opens offline; a script error is shown on the page and
// counted on <html> (data-script-errors), and <html data-charts-rendered="n">
// says when all n charts are drawn, for a browser test to read.
#include <cmath>
#include <fstream>
#include <sstream>

#include "common/constants.hpp"
#include "report/bias_report.hpp"
#include "report/characterize_report.hpp"
#include "report/charts.hpp"
#include "report/failure_report.hpp"
#include "report/frequency_report.hpp"
#include "report/headroom_report.hpp"
#include "report/plot_tools.hpp"
#include "report/spectrum_report.hpp"
#include "report/transient_report.hpp"
#include "stage/errors.hpp"
#include "stage/report.hpp"

#ifndef STAGE_VERSION
#define STAGE_VERSION ""
#endif

namespace stage {
namespace {

// A light page in the manner of a printed technical report: serif text,
// numbered sections and figures, thin table rules, one muted accent.
constexpr const char* kStyle = R"(
:root { --ink: #1d232a; --muted: #5b6670; --rule: #c9d1d8; --accent: #2e6f9e; --paper: #fdfdfb; }
body { background: var(--paper); color: var(--ink); margin: 0;
       font: 15px/1.5 "DejaVu Serif", Georgia, serif; }
main { max-width: 980px; margin: 0 auto; padding: 28px 32px 64px; }
header { border-bottom: 2px solid var(--ink); margin-bottom: 24px; }
header h1 { font: 600 26px/1.25 "DejaVu Sans", Helvetica, sans-serif; margin: 0 0 4px; }
header p { color: var(--muted); margin: 0 0 12px; font-size: 13px; }
h2 { font: 600 19px/1.3 "DejaVu Sans", Helvetica, sans-serif; margin: 36px 0 8px;
     border-bottom: 1px solid var(--rule); padding-bottom: 4px; }
h2 .number { color: var(--accent); margin-right: 8px; }
h3 { font: 600 15px "DejaVu Sans", Helvetica, sans-serif; margin: 18px 0 6px; }
table { border-collapse: collapse; margin: 6px 0 14px; font-size: 13px;
        font-variant-numeric: tabular-nums; }
th, td { padding: 3px 12px 3px 0; text-align: right; border-bottom: 1px solid var(--rule); }
th { font-family: "DejaVu Sans", Helvetica, sans-serif; font-weight: 600;
     border-bottom: 1.5px solid var(--ink); }
th:first-child, td:first-child { text-align: left; }
.figures { display: flex; flex-wrap: wrap; gap: 0 28px; align-items: flex-start; }
figure { margin: 14px 0 22px; }
figcaption { color: var(--muted); font-size: 13px; margin-top: 2px; }
figcaption b { color: var(--ink); }
.chart { min-height: 40px; }
details { margin: 8px 0; }
summary { cursor: pointer; color: var(--accent); font-size: 13px; }
pre { font: 12px/1.4 "DejaVu Sans Mono", monospace; background: #f3f5f6; padding: 10px;
      overflow-x: auto; border-left: 3px solid var(--rule); }
.failure { border-left: 3px solid #b03a2e; padding-left: 10px; }
#script-errors { color: #b03a2e; border-left-color: #b03a2e; }
.note { color: var(--muted); font-size: 13px; }
)";

// First in <head>, before the bundles: every uncaught error and every
// console.error (Vega reports a bad specification there) is listed on the
// page and counted on <html data-script-errors="n">.
constexpr const char* kErrorScript = R"(
window.stageErrors = [];
window.stageShowErrors = function () {
  const box = document.getElementById('script-errors');
  if (box && window.stageErrors.length) {
    box.textContent = window.stageErrors.join('\n');
    box.hidden = false;
  }
};
window.stageError = function (message) {
  window.stageErrors.push(String(message));
  document.documentElement.dataset.scriptErrors = String(window.stageErrors.length);
  window.stageShowErrors();
};
window.addEventListener('error', (event) => window.stageError(event.message));
window.addEventListener('unhandledrejection', (event) => window.stageError(event.reason));
const consoleError = console.error;
console.error = function (...parts) {
  window.stageError(parts.join(' '));
  consoleError.apply(console, parts);
};
)";

// Last in <body>: every chart drawn as SVG into its figure; <html
// data-charts-rendered="n"> once all n are.
constexpr const char* kRenderScript = R"(
(function () {
  window.stageShowErrors();
  const charts = JSON.parse(document.getElementById('chart-specifications').textContent);
  Promise.all(charts.map((c) =>
      vegaEmbed('#chart-' + c.name, c.spec, {renderer: 'svg', actions: false})
          .catch((error) => window.stageError(c.name + ': ' + error.message))))
      .then(() => { document.documentElement.dataset.chartsRendered = String(charts.length); });
})();
)";

std::string escaped(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (const char c : text) {
    switch (c) {
      case '&':
        out += "&amp;";
        break;
      case '<':
        out += "&lt;";
        break;
      case '>':
        out += "&gt;";
        break;
      case '"':
        out += "&quot;";
        break;
      default:
        out += c;
    }
  }
  return out;
}

// A bundle placed inside a <script> element: only "</script" would end it
// early (HTML's script data state; the bundles write it in lower case), and
// in JavaScript "<\/script" reads the
// same wherever it can stand (a string, a template, a regular expression).
std::string script_safe(const std::string& text) {
  static constexpr std::string_view kEnd = "</script";
  std::string out;
  out.reserve(text.size());
  for (std::size_t k = 0; k < text.size(); ++k) {
    const bool ends = text.compare(k, kEnd.size(), kEnd) == 0;
    out += text[k];
    if (ends) out += '\\';
  }
  return out;
}

// JSON placed inside a <script> element: every '<' (found only in strings)
// as the escape \u003c, so that no tag can start in it.
std::string json_script_safe(const std::string& json) {
  std::string out;
  out.reserve(json.size());
  for (const char c : json) out += c == '<' ? std::string("\\u003c") : std::string(1, c);
  return out;
}

void row(std::ostream& out, const std::vector<std::string>& cells, const char* tag = "td") {
  out << "<tr>";
  for (const auto& c : cells) out << '<' << tag << '>' << escaped(c) << "</" << tag << '>';
  out << "</tr>\n";
}

// The operating point as tables: node voltages, transistors, diodes, supplies.
void bias_tables(std::ostream& out, const BiasResult& b) {
  using report::si;
  out << "<h3>Node voltages</h3>\n<table>\n";
  row(out, {"node", "voltage"}, "th");
  for (const auto& [node, v] : b.node_voltages) row(out, {node, si(v, "V")});
  out << "</table>\n";
  if (!b.bipolars.empty()) {
    out << "<h3>Transistors</h3>\n<table>\n";
    row(out,
        {"name", "region", "IC", "IB", "VBE", "VCE", "gm", "r_pi", "dissipation",
         "rated (derated)"},
        "th");
    for (const auto& q : b.bipolars) {
      const std::string rated =
          std::isinf(q.rated_dissipation) ? "not rated" : si(q.rated_dissipation, "W");
      row(out, {q.name, std::string(to_string(q.region)), si(q.collector_current, "A"),
                si(q.base_current, "A"), si(q.vbe, "V"), si(q.vce, "V"), si(q.gm, "S"),
                si(q.r_pi, "Ω"), si(q.power, "W"), rated});
    }
    out << "</table>\n";
  }
  if (!b.diodes.empty()) {
    out << "<h3>Diodes</h3>\n<table>\n";
    row(out, {"name", "current", "voltage", "resistance", "dissipation"}, "th");
    for (const auto& d : b.diodes) {
      row(out, {d.name, si(d.current, "A"), si(d.voltage, "V"), si(d.resistance, "Ω"),
                si(d.power, "W")});
    }
    out << "</table>\n";
  }
  if (!b.supplies.empty()) {
    out << "<h3>Supplies</h3>\n<table>\n";
    row(out, {"source", "current", "power delivered"}, "th");
    for (const auto& s : b.supplies) row(out, {s.name, si(s.current, "A"), si(s.power, "W")});
    out << "</table>\n";
  }
  for (const auto& w : b.warnings) out << "<p class=\"note\">warning: " << escaped(w) << "</p>\n";
}

std::string heading(const AnalysisResult& result) {
  struct Heading {
    std::string operator()(const BiasResult&) const { return "Operating point"; }
    std::string operator()(const SweepResult&) const { return "Bias sweep"; }
    std::string operator()(const FrequencyResult& r) const {
      return "Frequency response of " + r.output;
    }
    std::string operator()(const TransientResult&) const { return "Transient"; }
    std::string operator()(const SpectrumResult& r) const { return "Spectrum of " + r.signal; }
    std::string operator()(const HeadroomResult& r) const { return "Headroom of " + r.output; }
    std::string operator()(const CharacterizeResult& r) const {
      return "Stage report of " + r.output;
    }
    std::string operator()(const AnalysisFailure& f) const {
      return "analyze " + f.kind + ": failed";
    }
  };
  return std::visit(Heading{}, result);
}

// The index-th analysis' section; its charts' specifications are added to
// `specs`, which the page renders at its end.
void section(std::ostream& out, const RunResult& run, std::size_t index, int& figure,
             report::Json& specs) {
  const AnalysisResult& result = run.analyses[index];
  out << "<section id=\"analysis-" << index + 1 << "\">\n<h2><span class=\"number\">" << index + 1
      << "</span>" << escaped(heading(result)) << "</h2>\n";
  if (const auto* failure = std::get_if<AnalysisFailure>(&result)) {
    out << "<p class=\"failure\">" << escaped(to_string(failure->error_kind)) << ": "
        << escaped(failure->message) << "</p>\n</section>\n";
    return;
  }
  if (const auto* bias = std::get_if<BiasResult>(&result)) bias_tables(out, *bias);
  if (const auto* stage = std::get_if<CharacterizeResult>(&result)) {
    bias_tables(out, stage->bias);
  }
  out << "<div class=\"figures\">\n";
  for (auto& c : std::visit(
           [&](const auto& r) { return report::charts_of(r, report::analysis_prefix(run, index)); },
           result)) {
    out << "<figure><div class=\"chart\" id=\"chart-" << escaped(c.name)
        << "\"></div><figcaption><b>Figure " << ++figure << ".</b> " << escaped(c.title)
        << "</figcaption></figure>\n";
    specs.push_back(report::Json{{"name", c.name}, {"spec", std::move(c.spec)}});
  }
  out << "</div>\n";
  std::ostringstream figures;
  std::visit([&](const auto& r) { report::print_table(figures, r); }, result);
  out << "<details><summary>Figures as the command prints them</summary><pre>"
      << escaped(figures.str()) << "</pre></details>\n</section>\n";
}

}  // namespace

void write_html_report(const std::filesystem::path& file, const RunResult& run,
                       const PlotTools& tools) {
  std::string bundles;
  for (const char* bundle : report::kBrowserBundles) {
    bundles += "<script>" + script_safe(report::read_whole(report::bundle_file(tools, bundle))) +
               "</script>\n";
  }
  if (file.has_parent_path()) create_output_folder(file.parent_path());
  std::ofstream out(file, std::ios::binary);
  const std::string title = run.title.empty() ? "stage report" : run.title;
  out << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>"
      << escaped(title) << "</title>\n<style>" << kStyle << "</style>\n<script>" << kErrorScript
      << "</script>\n"
      << bundles << "</head>\n<body>\n<main>\n<header><h1>" << escaped(title) << "</h1><p>stage "
      << STAGE_VERSION << " · " << run.analyses.size()
      << (run.analyses.size() == 1 ? " analysis" : " analyses") << " at "
      << report::fixed(run.temperature - kZeroCelsius, "°C", 1)
      << " · charts drawn by Vega-Lite in this page (drag to pan, wheel to zoom; hover a "
         "waveform for its values)</p></header>\n"
      << "<pre id=\"script-errors\" hidden></pre>\n";
  int figure = 0;
  report::Json specs = report::Json::array();
  for (std::size_t i = 0; i < run.analyses.size(); ++i) section(out, run, i, figure, specs);
  out << "</main>\n<script type=\"application/json\" id=\"chart-specifications\">"
      << json_script_safe(specs.dump()) << "</script>\n<script>" << kRenderScript
      << "</script>\n</body>\n</html>\n";
  if (!out) {
    throw Error(ErrorKind::not_written, "cannot write '" + file.string() + "'", {file.string()});
  }
}

}  // namespace stage
