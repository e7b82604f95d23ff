// Builders of Vega-Lite specifications.
#include "report/chart_spec.hpp"

#include <cmath>

namespace stage::report::spec {

Json chart(const std::string& title, const std::string& subtitle, Json layers) {
  Json t{{"text", title}, {"anchor", "start"}};
  if (!subtitle.empty()) t["subtitle"] = subtitle;
  return Json{{"$schema", "https://vega.github.io/schema/vega-lite/v5.json"},
              {"title", std::move(t)},
              {"width", kWidth},
              {"height", kHeight},
              {"layer", std::move(layers)}};
}

Json axis(const std::string& field, const std::string& title, bool log) {
  Json a{{"field", field}, {"type", "quantitative"}, {"title", title}};
  if (log) a["scale"] = Json{{"type", "log"}};
  return a;
}

Json axis(const std::string& field, const std::string& title, double low, double high) {
  Json a = axis(field, title);
  a["scale"] = Json{{"domain", Json::array({low, high})}};
  return a;
}

Json colour(const std::string& field, const std::string& title) {
  return Json{{"field", field},
              {"type", "nominal"},
              {"title", title},
              {"legend", Json{{"labelLimit", 320}}}};
}

Json layer(const std::string& name, Json mark, Json rows, Json encoding) {
  return Json{{"name", name},
              {"data", Json{{"values", std::move(rows)}}},
              {"mark", std::move(mark)},
              {"encoding", std::move(encoding)}};
}

Json zoom_on_x() {
  return Json::array({Json{{"name", "zoom"},
                           {"select", Json{{"type", "interval"}, {"encodings", {"x"}}}},
                           {"bind", "scales"}}});
}

bool drawable(double value) { return std::isfinite(value); }

}  // namespace stage::report::spec
