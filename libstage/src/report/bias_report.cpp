// Bias and sweep reports.
#include "report/bias_report.hpp"

#include <cmath>

namespace stage::report {
namespace {

// JSON has no infinity: an infinite output resistance is written as null.
Json number(double value) { return std::isfinite(value) ? Json(value) : Json(nullptr); }

Json bipolar_json(const BipolarOperatingPoint& q) {
  return Json{{"kind", q.polarity == Polarity::npn ? "npn" : "pnp"},
              {"region", std::string(to_string(q.region))},
              {"collector_current", q.collector_current},
              {"base_current", q.base_current},
              {"emitter_current", q.emitter_current},
              {"vbe", q.vbe},
              {"vce", q.vce},
              {"vbc", q.vbc},
              {"gm", q.gm},
              {"r_pi", number(q.r_pi)},
              {"r_out", number(q.r_out)},
              {"c_pi", q.c_pi},
              {"c_mu", q.c_mu},
              {"c_cs", q.c_cs},
              {"power", q.power}};
}

Json diode_json(const DiodeOperatingPoint& d) {
  return Json{{"kind", "diode"},
              {"current", d.current},
              {"voltage", d.voltage},
              {"resistance", number(d.resistance)},
              {"capacitance", d.capacitance},
              {"power", d.power}};
}

Json pairs_json(const std::vector<std::pair<std::string, double>>& pairs) {
  Json object = Json::object();
  for (const auto& [name, value] : pairs) object[name] = value;
  return object;
}

std::string temperature_text(double kelvin) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.2f °C", kelvin - 273.15);
  return buffer;
}

}  // namespace

Json to_json(const BiasResult& r) {
  Json devices = Json::object();
  for (const auto& q : r.bipolars) devices[q.name] = bipolar_json(q);
  for (const auto& d : r.diodes) devices[d.name] = diode_json(d);
  Json supplies = Json::object();
  for (const auto& s : r.supplies)
    supplies[s.name] = Json{{"current", s.current}, {"power", s.power}};
  Json json{{"kind", "bias"},
            {"converged", r.converged},
            {"newton_iterations", r.newton_iterations},
            {"method", std::string(to_string(r.method))},
            {"temperature_K", r.temperature},
            {"max_kcl_residual_A", r.max_kcl_residual},
            {"reciprocal_condition", r.reciprocal_condition},
            {"node_voltages", pairs_json(r.node_voltages)},
            {"element_currents", pairs_json(r.element_currents)},
            {"devices", devices},
            {"supplies", supplies}};
  if (!r.warnings.empty()) json["warnings"] = r.warnings;
  return json;
}

void print_table(std::ostream& out, const BiasResult& r) {
  out << "Bias point: " << r.newton_iterations << " Newton iterations (" << to_string(r.method)
      << "), " << temperature_text(r.temperature) << ", largest KCL residual "
      << si(r.max_kcl_residual, "A", 2) << "\n";
  for (const auto& warning : r.warnings) out << "warning: " << warning << '\n';
  out << '\n';

  TextTable nodes({"node", "voltage"});
  for (const auto& [name, v] : r.node_voltages) nodes.add_row({name, si(v, "V")});
  nodes.print(out);

  if (!r.bipolars.empty()) {
    out << '\n';
    TextTable t(
        {"transistor", "type", "region", "IC", "IB", "VBE", "VCE", "gm", "r_pi", "r_out", "power"});
    for (const auto& q : r.bipolars) {
      t.add_row({q.name, q.polarity == Polarity::npn ? "npn" : "pnp",
                 std::string(to_string(q.region)), si(q.collector_current, "A"),
                 si(q.base_current, "A"), si(q.vbe, "V"), si(q.vce, "V"), si(q.gm, "S"),
                 si(q.r_pi, "Ω"), si(q.r_out, "Ω"), si(q.power, "W")});
    }
    t.print(out);
  }
  if (!r.diodes.empty()) {
    out << '\n';
    TextTable t({"diode", "current", "voltage", "resistance", "power"});
    for (const auto& d : r.diodes) {
      t.add_row({d.name, si(d.current, "A"), si(d.voltage, "V"), si(d.resistance, "Ω"),
                 si(d.power, "W")});
    }
    t.print(out);
  }
  if (!r.supplies.empty()) {
    out << '\n';
    TextTable t({"supply", "current", "power delivered"});
    for (const auto& s : r.supplies) t.add_row({s.name, si(s.current, "A"), si(s.power, "W")});
    t.print(out);
  }
}

void write_csv(std::ostream& out, const BiasResult& r) {
  out << "quantity,value\n";
  for (const auto& [name, v] : r.node_voltages)
    out << "v(" << name << ")," << csv_number(v) << '\n';
  for (const auto& [name, i] : r.element_currents) out << name << ',' << csv_number(i) << '\n';
  for (const auto& q : r.bipolars) {
    const Json figures = bipolar_json(q);
    for (const auto& [key, value] : figures.items()) {
      if (value.is_number()) out << q.name << '.' << key << ',' << csv_number(value) << '\n';
    }
  }
  for (const auto& d : r.diodes) {
    const Json figures = diode_json(d);
    for (const auto& [key, value] : figures.items()) {
      if (value.is_number()) out << d.name << '.' << key << ',' << csv_number(value) << '\n';
    }
  }
}

Json to_json(const SweepResult& r) {
  static constexpr const char* kTargets[] = {"source", "parameter", "temperature"};
  Json points = Json::array();
  for (const auto& p : r.points) {
    Json point{{"value", p.value}};
    const Json bias = to_json(p.bias);
    for (const auto& [key, value] : bias.items()) {
      if (key != "kind") point[key] = value;
    }
    points.push_back(std::move(point));
  }
  return Json{{"kind", "sweep"},
              {"target", kTargets[static_cast<int>(r.options.target)]},
              {"name", r.options.name},
              {"points", points}};
}

void print_table(std::ostream& out, const SweepResult& r) {
  const bool temperature = r.options.target == SweepOptions::Target::temperature;
  out << "Sweep of " << (temperature ? "temperature" : r.options.name) << ": " << r.points.size()
      << " points\n\n";
  if (r.points.empty()) return;
  std::vector<std::string> header{temperature ? "temperature" : r.options.name};
  const BiasResult& first = r.points.front().bias;
  for (const auto& [name, v] : first.node_voltages) header.push_back("v(" + name + ")");
  for (const auto& [name, v] : first.element_currents) header.push_back(name);
  TextTable t(header);
  for (const auto& p : r.points) {
    std::vector<std::string> row{temperature ? temperature_text(p.value) : si(p.value, "")};
    for (const auto& [name, v] : p.bias.node_voltages) row.push_back(si(v, "V"));
    for (const auto& [name, i] : p.bias.element_currents) row.push_back(si(i, "A"));
    t.add_row(row);
  }
  t.print(out);
  for (const auto& p : r.points) {
    for (const auto& warning : p.bias.warnings) {
      out << "warning at " << (temperature ? temperature_text(p.value) : si(p.value, "")) << ": "
          << warning << '\n';
    }
  }
}

void write_csv(std::ostream& out, const SweepResult& r) {
  if (r.points.empty()) return;
  out << (r.options.target == SweepOptions::Target::temperature ? "temperature_K" : r.options.name);
  const BiasResult& first = r.points.front().bias;
  for (const auto& [name, v] : first.node_voltages) out << ",v(" << name << ")";
  for (const auto& [name, v] : first.element_currents) out << ',' << name;
  out << '\n';
  for (const auto& p : r.points) {
    out << csv_number(p.value);
    for (const auto& [name, v] : p.bias.node_voltages) out << ',' << csv_number(v);
    for (const auto& [name, i] : p.bias.element_currents) out << ',' << csv_number(i);
    out << '\n';
  }
}

}  // namespace stage::report
