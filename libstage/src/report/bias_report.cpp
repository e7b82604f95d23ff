// Bias and sweep reports.
#include "report/bias_report.hpp"

#include <cmath>

#include "report/operating_points.hpp"
#include "report/ratings_report.hpp"

namespace stage::report {
namespace {

// JSON has no infinity: an infinite output resistance is written as null.
Json number(double value) { return std::isfinite(value) ? Json(value) : Json(nullptr); }

// One record's JSON: its words, then its figures.
template <class Point>
Json record_json(const Point& point, const PointReport<Point>& report) {
  Json json = Json::object();
  for (const auto& w : report.words) json[std::string(w.key)] = w.text(point);
  for (const auto& f : report.figures) json[std::string(f.key)] = number(point.*f.value);
  return json;
}

// One table per kind with records: the name, the headed words and figures.
template <class Point>
void print_records(std::ostream& out, const std::vector<Point>& records,
                   const PointReport<Point>& report) {
  if (records.empty()) return;
  std::vector<std::string> header{std::string(report.heading)};
  for (const auto& w : report.words) {
    if (!w.heading.empty()) header.emplace_back(w.heading);
  }
  for (const auto& f : report.figures) {
    if (!f.heading.empty()) header.emplace_back(f.heading);
  }
  TextTable table(header);
  for (const Point& point : records) {
    std::vector<std::string> row{point.name};
    for (const auto& w : report.words) {
      if (!w.heading.empty()) row.push_back(w.text(point));
    }
    for (const auto& f : report.figures) {
      if (!f.heading.empty()) row.push_back(si(point.*f.value, f.unit));
    }
    table.add_row(std::move(row));
  }
  out << '\n';
  table.print(out);
}

// A named value of a bias point as a column of a sweep or a row of a CSV.
struct Cell {
  std::string name;
  std::string text;
};

// Every device's words and figures as cells: for CSV all of them, named as
// in the JSON ("q1.collector_current") and written in full; for a table the
// headed ones ("q1 IC") in engineering notation.
enum class Layout { table, csv };
std::vector<Cell> device_cells(const BiasResult& r, Layout layout) {
  std::vector<Cell> cells;
  const bool csv = layout == Layout::csv;
  const auto name = [csv](const std::string& device, std::string_view key,
                          std::string_view heading) {
    return device + (csv ? "." + std::string(key) : " " + std::string(heading));
  };
  for_each_device_kind(r, [&](const auto& records, const auto& report) {
    for (const auto& point : records) {
      for (const auto& w : report.words) {
        if (csv || !w.heading.empty())
          cells.push_back({name(point.name, w.key, w.heading), w.text(point)});
      }
      for (const auto& f : report.figures) {
        const double value = point.*f.value;
        if (csv || !f.heading.empty())
          cells.push_back(
              {name(point.name, f.key, f.heading), csv ? csv_number(value) : si(value, f.unit)});
      }
    }
  });
  return cells;
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

// The swept value as the table shows it: a temperature in °C, a ratio in
// percent, else in the unit of what was swept.
std::string swept_text(const SweepOptions& options, double value) {
  if (options.target == SweepOptions::Target::temperature) return temperature_text(value);
  switch (options.quantity) {
    case Quantity::temperature:
      return temperature_text(value);
    case Quantity::dimensionless:
      return si(value, "");
    case Quantity::ratio:
      return percent(value);
    default:
      return si(value, unit_name(options.quantity));
  }
}

}  // namespace

Json to_json(const BiasResult& r) {
  Json devices = Json::object();
  for_each_device_kind(r, [&](const auto& records, const auto& report) {
    for (const auto& point : records) devices[point.name] = record_json(point, report);
  });
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
            {"devices", std::move(devices)},
            {"supplies", std::move(supplies)}};
  if (!r.warnings.empty()) json["warnings"] = r.warnings;
  if (!r.rating_violations.empty()) json["ratings_exceeded"] = ratings_json(r.rating_violations);
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

  for_each_device_kind(
      r, [&](const auto& records, const auto& report) { print_records(out, records, report); });
  if (!r.supplies.empty()) {
    out << '\n';
    TextTable t({"supply", "current", "power delivered"});
    for (const auto& s : r.supplies) t.add_row({s.name, si(s.current, "A"), si(s.power, "W")});
    t.print(out);
  }
  print_ratings(out, r.rating_violations);
}

void write_csv(std::ostream& out, const BiasResult& r) {
  out << "quantity,value\n";
  for (const auto& [name, v] : r.node_voltages) out << name << ',' << csv_number(v) << '\n';
  for (const auto& [name, i] : r.element_currents) out << name << ',' << csv_number(i) << '\n';
  for (const auto& cell : device_cells(r, Layout::csv))
    out << cell.name << ',' << cell.text << '\n';
}

Json to_json(const SweepResult& r) {
  static constexpr const char* kTargets[] = {"source", "parameter", "temperature"};
  Json points = Json::array();
  for (const auto& p : r.points) {
    Json point{{"value", p.value}};
    Json bias = to_json(p.bias);
    for (auto it = bias.begin(); it != bias.end(); ++it) {
      if (it.key() != "kind") point[it.key()] = std::move(it.value());
    }
    points.push_back(std::move(point));
  }
  return Json{{"kind", "sweep"},
              {"target", kTargets[static_cast<int>(r.options.target)]},
              {"name", r.options.name},
              {"points", std::move(points)}};
}

void print_table(std::ostream& out, const SweepResult& r) {
  const bool temperature = r.options.target == SweepOptions::Target::temperature;
  out << "Sweep of " << (temperature ? "temperature" : r.options.name) << ": "
      << text::counted(r.points.size(), "point", "points") << "\n\n";
  if (r.points.empty()) return;
  std::vector<std::string> header{temperature ? "temperature" : r.options.name};
  const BiasResult& first = r.points.front().bias;
  for (const auto& [name, v] : first.node_voltages) header.push_back(name);
  for (const auto& [name, v] : first.element_currents) header.push_back(name);
  for (auto& cell : device_cells(first, Layout::table)) header.push_back(std::move(cell.name));
  TextTable t(header);
  for (const auto& p : r.points) {
    std::vector<std::string> row{swept_text(r.options, p.value)};
    for (const auto& [name, v] : p.bias.node_voltages) row.push_back(si(v, "V"));
    for (const auto& [name, i] : p.bias.element_currents) row.push_back(si(i, "A"));
    for (auto& cell : device_cells(p.bias, Layout::table)) row.push_back(std::move(cell.text));
    t.add_row(row);
  }
  t.print(out);
  for (const auto& p : r.points) {
    for (const auto& warning : p.bias.warnings) {
      out << "warning at " << swept_text(r.options, p.value) << ": " << warning << '\n';
    }
  }
}

void write_csv(std::ostream& out, const SweepResult& r) {
  if (r.points.empty()) return;
  out << (r.options.target == SweepOptions::Target::temperature ? "temperature_K" : r.options.name);
  const BiasResult& first = r.points.front().bias;
  for (const auto& [name, v] : first.node_voltages) out << ',' << name;
  for (const auto& [name, v] : first.element_currents) out << ',' << name;
  for (const auto& cell : device_cells(first, Layout::csv)) out << ',' << cell.name;
  out << '\n';
  for (const auto& p : r.points) {
    out << csv_number(p.value);
    for (const auto& [name, v] : p.bias.node_voltages) out << ',' << csv_number(v);
    for (const auto& [name, i] : p.bias.element_currents) out << ',' << csv_number(i);
    for (const auto& cell : device_cells(p.bias, Layout::csv)) out << ',' << cell.text;
    out << '\n';
  }
}

}  // namespace stage::report
