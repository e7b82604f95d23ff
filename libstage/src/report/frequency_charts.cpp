// Charts of a frequency response: gain and phase against log frequency with
// the -3 dB corners and the unity-gain point marked, and the input and output
// impedance magnitudes against log frequency.
#include <cmath>
#include <complex>

#include "common/si_format.hpp"
#include "report/chart_spec.hpp"
#include "report/charts.hpp"

namespace stage::report {
namespace {

// A rule across the plot at each figure the response has, labelled.
Json figure_marks(const FrequencyFigures& fig) {
  Json rows = Json::array();
  const auto add = [&](const std::optional<double>& f, const std::string& what) {
    if (f && spec::drawable(*f)) {
      rows.push_back(Json{{"frequency_Hz", *f}, {"label", what + " " + text::si(*f, "Hz")}});
    }
  };
  add(fig.lower_cutoff, "−3 dB");
  add(fig.upper_cutoff, "−3 dB");
  add(fig.unity_gain_frequency, "unity gain");
  return rows;
}

Json marks_layers(Json rows) {
  const Json x = spec::axis("frequency_Hz", "frequency (Hz)", true);
  return Json::array(
      {spec::layer("figures", Json{{"type", "rule"}, {"strokeDash", {4, 3}}, {"color", "#b03a2e"}},
                   rows, Json{{"x", x}}),
       spec::layer("figure_labels",
                   Json{{"type", "text"},
                        {"align", "left"},
                        {"dx", 4},
                        {"y", 8},
                        {"color", "#b03a2e"},
                        {"baseline", "top"}},
                   rows, Json{{"x", x}, {"text", Json{{"field", "label"}}}})});
}

Chart gain_chart(const FrequencyResult& r, const std::string& prefix) {
  Json rows = Json::array();
  for (std::size_t k = 0; k < r.frequencies.size(); ++k) {
    if (spec::drawable(r.gain_dB[k])) {
      rows.push_back(Json{{"frequency_Hz", r.frequencies[k]}, {"gain_dB", r.gain_dB[k]}});
    }
  }
  const Json x = spec::axis("frequency_Hz", "frequency (Hz)", true);
  Json layers =
      Json::array({spec::layer("gain", Json{{"type", "line"}, {"point", true}}, std::move(rows),
                               Json{{"x", x}, {"y", spec::axis("gain_dB", "gain (dB)")}})});
  layers.front()["params"] = spec::zoom_on_x();
  const Json marks = figure_marks(r.figures);
  if (!marks.empty()) {
    for (auto& l : marks_layers(marks)) layers.push_back(std::move(l));
  }
  return {prefix + "_gain", "Gain of " + r.output + " against frequency",
          spec::chart("Gain of " + r.output + " / " + r.options.input,
                      "−3 dB corners and unity gain marked where the sweep reaches them",
                      std::move(layers))};
}

Chart phase_chart(const FrequencyResult& r, const std::string& prefix) {
  Json rows = Json::array();
  for (std::size_t k = 0; k < r.frequencies.size(); ++k) {
    rows.push_back(Json{{"frequency_Hz", r.frequencies[k]}, {"phase_deg", r.phase_deg[k]}});
  }
  Json layers =
      Json::array({spec::layer("phase", Json{{"type", "line"}, {"point", true}}, std::move(rows),
                               Json{{"x", spec::axis("frequency_Hz", "frequency (Hz)", true)},
                                    {"y", spec::axis("phase_deg", "phase (°)")}})});
  layers.front()["params"] = spec::zoom_on_x();
  return {prefix + "_phase", "Phase of " + r.output + " against frequency",
          spec::chart("Phase of " + r.output + " / " + r.options.input, "", std::move(layers))};
}

Chart impedance_chart(const FrequencyResult& r, const std::string& prefix) {
  Json rows = Json::array();
  int left_out = 0;
  const auto add = [&](const std::vector<std::complex<double>>& z, const char* series) {
    for (std::size_t k = 0; k < z.size(); ++k) {
      const double magnitude = std::abs(z[k]);
      if (!spec::drawable(magnitude) || magnitude <= 0) {
        ++left_out;
        continue;
      }
      rows.push_back(Json{
          {"frequency_Hz", r.frequencies[k]}, {"impedance_ohm", magnitude}, {"impedance", series}});
    }
  };
  add(r.input_impedance, "|Zin|");
  add(r.output_impedance, "|Zout| (load removed)");
  Json layers = Json::array(
      {spec::layer("impedance", Json{{"type", "line"}, {"point", true}}, std::move(rows),
                   Json{{"x", spec::axis("frequency_Hz", "frequency (Hz)", true)},
                        {"y", spec::axis("impedance_ohm", "|Z| (Ω)", true)},
                        {"color", spec::colour("impedance", "")}})});
  layers.front()["params"] = spec::zoom_on_x();
  const std::string subtitle =
      left_out == 0 ? ""
                    : std::to_string(left_out) + " infinite points left out (no current flows)";
  return {prefix + "_impedance", "Input and output impedance against frequency",
          spec::chart("Input and output impedance", subtitle, std::move(layers))};
}

}  // namespace

std::vector<Chart> charts_of(const FrequencyResult& r, const std::string& prefix) {
  return {gain_chart(r, prefix), phase_chart(r, prefix), impedance_chart(r, prefix)};
}

}  // namespace stage::report
