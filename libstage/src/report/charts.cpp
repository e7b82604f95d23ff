// The charts of a run: each analysis' own (frequency_charts.cpp,
// time_charts.cpp, headroom_charts.cpp) and a sweep's quantities against the
// swept value.
#include "report/charts.hpp"

#include "report/chart_spec.hpp"

namespace stage::report {
namespace {

std::string swept_title(const SweepOptions& o) {
  const std::string what =
      o.target == SweepOptions::Target::temperature ? std::string("temperature") : o.name;
  const std::string_view unit = unit_name(o.quantity);
  return unit.empty() ? what : what + " (" + std::string(unit) + ")";
}

// One chart of a quantity read from each point's bias result.
template <class Read>
Chart sweep_chart(const SweepResult& r, const std::string& name, const std::string& title,
                  const std::string& y_title, Read read) {
  Json rows = Json::array();
  for (const SweepPoint& p : r.points) {
    read(p.bias, [&](const std::string& series, double value) {
      if (spec::drawable(value)) {
        rows.push_back(Json{{"swept", p.value}, {"value", value}, {"series", series}});
      }
    });
  }
  Json layers =
      Json::array({spec::layer("swept", Json{{"type", "line"}, {"point", true}}, std::move(rows),
                               Json{{"x", spec::axis("swept", swept_title(r.options))},
                                    {"y", spec::axis("value", y_title)},
                                    {"color", spec::colour("series", "")}})});
  layers.front()["params"] = spec::zoom_on_x();
  return {name, title, spec::chart(title, "", std::move(layers))};
}

}  // namespace

std::vector<Chart> charts_of(const BiasResult&, const std::string&) { return {}; }
std::vector<Chart> charts_of(const AnalysisFailure&, const std::string&) { return {}; }

std::vector<Chart> charts_of(const SweepResult& r, const std::string& prefix) {
  const std::string against = " against " + swept_title(r.options);
  std::vector<Chart> charts{sweep_chart(r, prefix + "_voltages", "Node voltages" + against,
                                        "voltage (V)", [](const BiasResult& b, auto add) {
                                          for (const auto& [node, v] : b.node_voltages)
                                            add(node, v);
                                        })};
  if (!r.points.empty() && !r.points.front().bias.bipolars.empty()) {
    charts.push_back(sweep_chart(r, prefix + "_collector_currents", "Collector currents" + against,
                                 "IC (A)", [](const BiasResult& b, auto add) {
                                   for (const auto& q : b.bipolars)
                                     add(q.name, q.collector_current);
                                 }));
  }
  return charts;
}

std::string kind_of(const AnalysisResult& result) {
  static constexpr std::string_view kKinds[] = {"bias",     "sweep",    "frequency",    "transient",
                                                "spectrum", "headroom", "characterize", ""};
  static_assert(std::size(kKinds) == std::variant_size_v<AnalysisResult>);
  if (const auto* failure = std::get_if<AnalysisFailure>(&result)) return failure->kind + "_failed";
  return std::string(kKinds[result.index()]);
}

std::string analysis_prefix(const RunResult& run, std::size_t index) {
  return std::to_string(index + 1) + "_" + kind_of(run.analyses[index]);
}

std::vector<Chart> charts(const RunResult& run) {
  std::vector<Chart> all;
  for (std::size_t i = 0; i < run.analyses.size(); ++i) {
    const std::string prefix = analysis_prefix(run, i);
    for (auto& c :
         std::visit([&](const auto& r) { return charts_of(r, prefix); }, run.analyses[i])) {
      all.push_back(std::move(c));
    }
  }
  return all;
}

}  // namespace stage::report
