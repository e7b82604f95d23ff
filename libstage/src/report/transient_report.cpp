// Transient reports.
#include "report/transient_report.hpp"

#include <algorithm>

#include "report/ratings_report.hpp"

namespace stage::report {
namespace {

// Up to this many samples the table shows them all.
constexpr std::size_t kFullTableRows = 30;

const char* method_name(Integration integration) {
  switch (integration) {
    case Integration::tr_bdf2:
      return "TR-BDF2";
    case Integration::trapezoidal:
      return "trapezoidal rule";
    case Integration::bdf2:
      return "BDF2";
  }
  return "";  // not reached: every method is named above
}

}  // namespace

Json to_json(const TransientResult& r) {
  Json signals = Json::object();
  for (const auto& s : r.signals) signals[s.name] = s.values;
  Json json{{"kind", "transient"}, {"time_s", r.time}, {"signals", std::move(signals)}};
  if (!r.rating_violations.empty()) json["ratings_exceeded"] = ratings_json(r.rating_violations);
  return json;
}

void print_table(std::ostream& out, const TransientResult& r) {
  out << "Transient: " << r.time.size() << " points";
  if (!r.time.empty())
    out << " from " << si(r.time.front(), "s") << " to " << si(r.time.back(), "s");
  out << "; " << method_name(r.integration) << ", " << r.accepted_steps << " steps accepted, "
      << r.rejected_steps << " rejected, ";
  if (r.damped_steps > 0) out << r.damped_steps << " damped (ringing), ";
  out << r.newton_iterations << " Newton iterations, " << r.factorizations << " factorisations\n\n";
  if (r.time.size() <= kFullTableRows) {
    std::vector<std::string> header{"time"};
    for (const auto& s : r.signals) header.push_back(s.name);
    TextTable table(header);
    for (std::size_t k = 0; k < r.time.size(); ++k) {
      std::vector<std::string> row{si(r.time[k], "s")};
      for (const auto& s : r.signals) row.push_back(si(s.values[k], signal_unit(s.name)));
      table.add_row(row);
    }
    table.print(out);
    print_ratings(out, r.rating_violations);
    return;
  }
  TextTable table({"signal", "min", "max", "final"});
  for (const auto& s : r.signals) {
    const auto [lo, hi] = std::minmax_element(s.values.begin(), s.values.end());
    const auto unit = signal_unit(s.name);
    table.add_row({s.name, si(*lo, unit), si(*hi, unit), si(s.values.back(), unit)});
  }
  table.print(out);
  print_ratings(out, r.rating_violations);
}

void write_csv(std::ostream& out, const TransientResult& r) {
  out << "time_s";
  for (const auto& s : r.signals) out << ',' << s.name;
  out << '\n';
  for (std::size_t k = 0; k < r.time.size(); ++k) {
    out << csv_number(r.time[k]);
    for (const auto& s : r.signals) out << ',' << csv_number(s.values[k]);
    out << '\n';
  }
}

}  // namespace stage::report
