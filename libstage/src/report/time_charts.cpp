// Charts of a transient (the recorded signals against time, one plot per
// unit, with x-zoom and a readout at the pointer; long records decimated
// by min/max per bucket, as the subtitle says) and of a spectrum (the
// harmonics in dB relative to the fundamental, as bars, THD on the plot).
#include <algorithm>
#include <cmath>
#include <map>

#include "report/chart_spec.hpp"
#include "report/charts.hpp"
#include "report/decimate.hpp"

namespace stage::report {
namespace {

std::string unit_title(std::string_view unit) {
  return unit == "A" ? "current (A)" : unit == "V" ? "voltage (V)" : std::string(unit);
}

Chart signals_chart(const TransientResult& r, std::string_view unit,
                    const std::vector<const TransientSignal*>& signals, const std::string& name) {
  std::vector<const std::vector<double>*> series;
  for (const auto* s : signals) series.push_back(&s->values);
  const std::vector<std::size_t> kept = display_samples(r.time.size(), series);
  Json rows = Json::array();
  for (const std::size_t k : kept) {
    for (const auto* s : signals) {
      rows.push_back(Json{{"time_s", r.time[k]}, {"value", s->values[k]}, {"signal", s->name}});
    }
  }
  const Json x = spec::axis("time_s", "time (s)");
  const Json y = spec::axis("value", unit_title(unit));
  const Json colour = spec::colour("signal", "signal");
  Json lines{{"name", "signals"},
             {"mark", Json{{"type", "line"}, {"strokeWidth", 1.2}}},
             {"params", spec::zoom_on_x()},
             {"encoding", Json{{"x", x}, {"y", y}, {"color", colour}}}};
  // The readout: every signal's sample nearest the pointer in time, shown
  // with its value (a tooltip).
  Json readout{
      {"name", "readout"},
      {"mark", Json{{"type", "point"}, {"filled", true}, {"size", 36}}},
      {"params", Json::array({Json{{"name", "pointer"},
                                   {"select", Json{{"type", "point"},
                                                   {"encodings", {"x"}},
                                                   {"nearest", true},
                                                   {"on", "pointerover"},
                                                   {"clear", "pointerout"}}}}})},
      {"encoding",
       Json{{"x", x},
            {"y", y},
            {"color", colour},
            {"opacity",
             Json{{"condition", Json{{"param", "pointer"}, {"empty", false}, {"value", 1}}},
                  {"value", 0}}},
            {"tooltip",
             Json::array(
                 {Json{{"field", "signal"}},
                  Json{{"field", "time_s"}, {"title", "time (s)"}, {"format", ".5~g"}},
                  Json{{"field", "value"}, {"title", unit_title(unit)}, {"format", ".5~g"}}})}}}};
  const std::string subtitle =
      kept.size() == r.time.size()
          ? std::to_string(r.time.size()) + " samples, all drawn"
          : "decimated for display: " + std::to_string(r.time.size()) +
                " samples reduced to each signal's min and max in each of " +
                std::to_string(kDisplayBuckets) + " time buckets (" + std::to_string(kept.size()) +
                " drawn; peaks kept)";
  Json spec = spec::chart("Signals (" + std::string(unit) + ") against time", subtitle,
                          Json::array({std::move(lines), std::move(readout)}));
  spec["data"] = Json{{"values", std::move(rows)}};
  return {name, "Recorded signals in " + std::string(unit) + " against time", std::move(spec)};
}

}  // namespace

std::vector<Chart> charts_of(const TransientResult& r, const std::string& prefix) {
  std::map<std::string_view, std::vector<const TransientSignal*>> by_unit;
  for (const auto& s : r.signals) by_unit[signal_unit(s.name)].push_back(&s);
  std::vector<Chart> charts;
  // Voltages first: what a designer looks at first.
  for (const std::string_view unit : {"V", "A"}) {
    const auto group = by_unit.find(unit);
    if (group == by_unit.end()) continue;
    const std::string name = prefix + (unit == "V" ? "_voltages" : "_currents");
    charts.push_back(signals_chart(r, unit, group->second, name));
  }
  return charts;
}

std::vector<Chart> charts_of(const SpectrumResult& r, const std::string& prefix) {
  Json rows = Json::array();
  int left_out = 0;
  double lowest = 0;
  const double fundamental = r.harmonics.empty() ? 0.0 : r.harmonics.front().amplitude;
  for (const Harmonic& h : r.harmonics) {
    if (h.n == 1) continue;
    const double relative = 20 * std::log10(h.amplitude / fundamental);
    if (!spec::drawable(relative)) {
      ++left_out;
      continue;
    }
    lowest = std::min(lowest, relative);
    rows.push_back(
        Json{{"harmonic", h.n}, {"frequency_Hz", h.n * r.fundamental}, {"relative_dB", relative}});
  }
  // Bars rise from a floor 10 dB below the smallest, on a multiple of
  // 10 dB, so that the THD written at the top stays clear of them.
  const double floor = 10 * std::floor(lowest / 10) - 10;
  const std::string thd = "THD " + text::percent(r.thd) +
                          (r.thd_plus_noise ? ", THD+N " + text::percent(*r.thd_plus_noise) : "");
  Json layers = Json::array(
      {spec::layer(
           "harmonics", Json{{"type", "bar"}, {"color", "#2e6f9e"}}, std::move(rows),
           Json{{"x", Json{{"field", "harmonic"}, {"type", "ordinal"}, {"title", "harmonic n"}}},
                {"y", spec::axis("relative_dB", "dB re fundamental", floor, 0.0)},
                {"y2", Json{{"datum", floor}}},
                {"tooltip", Json::array({Json{{"field", "frequency_Hz"}, {"title", "Hz"}},
                                         Json{{"field", "relative_dB"},
                                              {"title", "dB re fundamental"},
                                              {"format", ".1f"}}})}}),
       spec::layer("thd",
                   Json{{"type", "text"},
                        {"x", "width"},
                        {"y", 0},
                        {"align", "right"},
                        {"baseline", "top"},
                        {"fontSize", 13},
                        {"fontWeight", "bold"}},
                   Json::array({Json{{"label", thd}}}), Json{{"text", Json{{"field", "label"}}}})});
  std::string subtitle = "fundamental " + text::si(fundamental, signal_unit(r.signal)) + " at " +
                         text::si(r.fundamental, "Hz") + ", over the last " +
                         std::to_string(r.periods) + " period(s)";
  if (left_out > 0)
    subtitle += "; " + std::to_string(left_out) + " harmonics of zero amplitude left out";
  return {{prefix + "_harmonics", "Harmonics of " + r.signal + " relative to the fundamental",
           spec::chart("Harmonics of " + r.signal, subtitle, std::move(layers))}};
}

}  // namespace stage::report
