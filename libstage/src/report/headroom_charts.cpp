// Charts of a headroom search and of the stage report: each side's output
// peak against the drive with the small-signal prediction and each side's
// limit points labelled with their cause; and the load-line picture, the
// transistor's (VCE, IC) path at the largest clean drive and at the clip
// level over its DC and AC load lines and the edges of saturation and cutoff.
#include <algorithm>
#include <cmath>

#include "report/chart_spec.hpp"
#include "report/charts.hpp"

namespace stage::report {
namespace {

// The picture's current axis reaches this far above the larger of the
// path's largest current and twice the quiescent current: the steep AC load
// line of a follower would otherwise squash the path against the axis.
constexpr double kCurrentHeadroom = 1.25;
constexpr double kVoltageHeadroom = 1.05;

std::string cause_words(const LimitCause& c) {
  const std::string mechanism(to_string(c.mechanism));
  return c.device.empty() ? mechanism : mechanism + " (" + c.device + ")";
}

Json limit_points(const HeadroomResult& r) {
  Json rows = Json::array();
  const std::string limit = text::percent(r.options.distortion_limit);
  for (const auto& [name, s] : {std::pair{"positive", &r.positive}, {"negative", &r.negative}}) {
    if (s->clip.peak > 0) {
      rows.push_back(Json{{"input_amplitude", s->clip.input_amplitude},
                          {"peak", s->clip.peak},
                          {"label", std::string(name) + " clip: " + cause_words(s->clip.cause)}});
    }
    if (s->found && s->peak > 0) {
      rows.push_back(
          Json{{"input_amplitude", s->input_amplitude},
               {"peak", s->peak},
               {"label", std::string(name) + " " + limit + " limit: " + cause_words(s->cause)}});
    }
  }
  return rows;
}

Chart drive_chart(const HeadroomResult& r, const std::string& prefix) {
  Json rows = Json::array();
  double smallest = 0, largest = 0;
  for (const DrivePoint& p : r.runs) {
    for (const auto& [side, peak] :
         {std::pair{"positive peak", p.positive_peak}, {"negative peak", p.negative_peak}}) {
      if (!(peak > 0) || !spec::drawable(peak)) continue;
      rows.push_back(Json{{"input_amplitude", p.input_amplitude}, {"peak", peak}, {"side", side}});
      smallest = smallest == 0 ? p.input_amplitude : std::min(smallest, p.input_amplitude);
      largest = std::max(largest, p.input_amplitude);
    }
  }
  const Json x = spec::axis("input_amplitude", "input amplitude", true);
  const Json y = spec::axis("peak", "output peak from its average (V)", true);
  Json layers =
      Json::array({spec::layer("peaks", Json{{"type", "line"}, {"point", true}}, std::move(rows),
                               Json{{"x", x}, {"y", y}, {"color", spec::colour("side", "")}})});
  if (largest > 0 && r.small_signal_gain > 0) {
    layers.push_back(spec::layer(
        "small_signal", Json{{"type", "line"}, {"strokeDash", {6, 4}}, {"color", "#777777"}},
        Json::array({Json{{"input_amplitude", smallest}, {"peak", r.small_signal_gain * smallest}},
                     Json{{"input_amplitude", largest}, {"peak", r.small_signal_gain * largest}}}),
        Json{{"x", x}, {"y", y}}));
  }
  // Each limit point a shape of its own, its cause in the legend: labels
  // beside points a few percent of drive apart would overlap.
  layers.push_back(spec::layer(
      "limits", Json{{"type", "point"}, {"size", 110}, {"filled", true}, {"color", "#b03a2e"}},
      limit_points(r),
      Json{{"x", x},
           {"y", y},
           {"shape", Json{{"field", "label"},
                          {"type", "nominal"},
                          {"title", "limit points"},
                          {"legend", Json{{"labelLimit", 320}}},
                          {"scale", Json{{"range",
                                          {"diamond", "square", "triangle-up", "triangle-down",
                                           "cross", "circle"}}}}}},
           {"tooltip", Json::array({Json{{"field", "label"}},
                                    Json{{"field", "input_amplitude"}, {"format", ".4~g"}},
                                    Json{{"field", "peak"}, {"format", ".4~g"}}})}}));
  return {prefix + "_drive", "Output peak of each side against the drive",
          spec::chart("Output peak of " + r.output + " against drive",
                      "dashed: small-signal prediction, gain " + text::si(r.small_signal_gain, "") +
                          "; red: each side's limit and clip point, its cause in the legend",
                      std::move(layers))};
}

// A straight load line through the quiescent point with slope -1/load,
// from the current axis to the voltage axis.
Json load_line_rows(const LoadLineEstimate& e, double load) {
  return Json::array(
      {Json{{"vce", 0.0}, {"current", e.quiescent_current + e.quiescent_vce / load}},
       Json{{"vce", e.quiescent_vce + e.quiescent_current * load}, {"current", 0.0}}});
}

Chart load_line_chart(const HeadroomResult& r, const LoadLineEstimate& e,
                      const std::string& prefix) {
  Json paths = Json::array();
  double top = 2 * e.quiescent_current, right = e.cutoff_vce;
  for (const auto& [path, what] :
       {std::pair{&e.clean_path, "within every limit"}, {&e.clip_path, "at the clip level"}}) {
    if (!*path) continue;
    const std::string label =
        std::string(what) + " (" + text::si((*path)->input_amplitude, "V") + " drive)";
    int k = 0;
    for (const LoadLinePoint& p : (*path)->points) {
      paths.push_back(
          Json{{"vce", p.vce}, {"current", p.current}, {"order", k++}, {"path", label}});
      top = std::max(top, p.current);
      right = std::max(right, p.vce);
    }
  }
  if (e.dc_load > 0) right = std::max(right, e.quiescent_vce + e.quiescent_current * e.dc_load);
  top *= kCurrentHeadroom;
  right *= kVoltageHeadroom;
  const Json x = spec::axis("vce", "VCE (V)", 0.0, right);
  const Json y = spec::axis("current", "IC (A)", 0.0, top);
  const Json clipped_line{{"type", "line"}, {"clip", true}};
  Json layers = Json::array();
  if (e.dc_load > 0) {
    Json mark = clipped_line;
    mark["color"] = "#8c8c8c";
    layers.push_back(
        spec::layer("dc_load_line", mark, load_line_rows(e, e.dc_load), Json{{"x", x}, {"y", y}}));
  }
  Json ac_mark = clipped_line;
  ac_mark["color"] = "#1f1f1f";
  ac_mark["strokeDash"] = Json::array({6, 3});
  layers.push_back(
      spec::layer("ac_load_line", ac_mark, load_line_rows(e, e.ac_load), Json{{"x", x}, {"y", y}}));
  // The edges: cutoff where no collector current flows; saturation where
  // the collector-base junction reaches zero bias, VCE = VBE (the edge of the
  // forward-active region, Sedra and Smith, "Microelectronic Circuits", ch. 6).
  Json edges = Json::array({Json{{"edge", "cutoff (IC = 0)"}, {"current", 0.0}}});
  layers.push_back(spec::layer("cutoff_edge", Json{{"type", "rule"}, {"color", "#b03a2e"}}, edges,
                               Json{{"y", y}}));
  for (const auto& q : r.bias.bipolars) {
    if (q.name != e.device) continue;
    layers.push_back(spec::layer(
        "saturation_edge", Json{{"type", "rule"}, {"color", "#b03a2e"}, {"strokeDash", {2, 2}}},
        Json::array({Json{{"edge", "saturation (VCB = 0)"}, {"vce", std::abs(q.vbe)}}}),
        Json{{"x", x}}));
  }
  Json path_layer = spec::layer("paths", Json{{"type", "line"}, {"clip", true}, {"strokeWidth", 2}},
                                std::move(paths),
                                Json{{"x", x},
                                     {"y", y},
                                     {"order", Json{{"field", "order"}, {"type", "quantitative"}}},
                                     {"color", spec::colour("path", "path over one period")}});
  // Zoom on both axes: the path hugs a steep AC load line near Q.
  path_layer["params"] = Json::array(
      {Json{{"name", "zoom"}, {"select", Json{{"type", "interval"}}}, {"bind", "scales"}}});
  layers.push_back(std::move(path_layer));
  layers.push_back(spec::layer(
      "quiescent", Json{{"type", "point"}, {"filled", true}, {"size", 70}, {"color", "#1f1f1f"}},
      Json::array(
          {Json{{"vce", e.quiescent_vce}, {"current", e.quiescent_current}, {"label", "Q"}}}),
      Json{{"x", x}, {"y", y}}));
  return {prefix + "_load_line", "Load lines of " + e.device + " with its path over one period",
          spec::chart("Load lines of " + e.device,
                      "grey: DC load line (" + text::si(e.dc_load, "Ω") +
                          "); dashed: AC load line "
                          "through Q (R'ac " +
                          text::si(e.ac_load, "Ω") +
                          "); red: cutoff and "
                          "saturation edges",
                      std::move(layers))};
}

}  // namespace

std::vector<Chart> charts_of(const HeadroomResult& r, const std::string& prefix) {
  std::vector<Chart> charts{drive_chart(r, prefix)};
  if (r.load_line) charts.push_back(load_line_chart(r, *r.load_line, prefix));
  return charts;
}

std::vector<Chart> charts_of(const CharacterizeResult& r, const std::string& prefix) {
  std::vector<Chart> charts = charts_of(r.frequency, prefix);
  for (auto& c : charts_of(r.headroom, prefix)) charts.push_back(std::move(c));
  return charts;
}

}  // namespace stage::report
