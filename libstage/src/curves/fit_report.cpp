// What a fit hands back to people: the derived `model` statement (spec
// section 4) that records the fitted values, and the readable report.
#include <spdlog/fmt/fmt.h>

#include <algorithm>
#include <cmath>
#include <sstream>

#include "common/constants.hpp"
#include "report/format.hpp"
#include "stage/curves.hpp"

namespace stage {
namespace {

std::string unit_of(const FittedParameter& p) {
  return p.quantity == Quantity::dimensionless ? std::string() : std::string(unit_name(p.quantity));
}

// "# A, ± 2e-16 (1 sd)"; "# ± 3 (1 sd)" for a dimensionless parameter.
std::string statement_comment(const FittedParameter& p) {
  const std::string unit = unit_of(p);
  return fmt::format("# {}± {:.2g} (1 sd)", unit.empty() ? "" : unit + ", ", p.uncertainty);
}

}  // namespace

std::string FitResult::model_statement(const std::string& name) const {
  std::string text = fmt::format("model {} = {} {{\n", name, model.name);
  std::size_t width = 0;
  for (const auto& p : parameters) width = std::max(width, p.name.size());
  for (const auto& p : parameters) {
    // Bare numbers are in the parameter's SI unit (spec section 1); the
    // comment keeps the unit and one standard deviation.
    text += fmt::format("  {:<{}} = {:<13.7g}  {}\n", p.name, width, p.value, statement_comment(p));
  }
  return text + "}\n";
}

std::string FitResult::report() const {
  report::TextTable table({"parameter", "start", "fitted", "± 1 sd", "± %", "scale"});
  for (const auto& p : parameters) {
    const std::string unit = unit_of(p);
    const std::string scale =
        p.log_scale ? "log" : fmt::format("in ({:g}, {:g})", p.bounds->first, p.bounds->second);
    table.add_row({p.name, report::si(p.start, unit), report::si(p.value, unit),
                   text::significant(p.uncertainty, unit, 2),
                   fmt::format("{:.2g}", in_percent(p.uncertainty) / std::abs(p.value)), scale});
  }
  std::ostringstream out;
  out << "Levenberg–Marquardt: " << stop_reason << (converged ? "" : " (NOT converged)")
      << " after " << evaluations << " evaluations\n";
  out << fmt::format(
      "cost (sum of squared residuals in tolerance units): {:.6g} -> {:.6g} over {} "
      "values; rms residual {:.3g} tolerances\n",
      start_cost, final_cost, residual_count, std::sqrt(final_cost / std::max(residual_count, 1)));
  table.print(out);
  out << "residuals against the fitted model:\n" << check_table(residuals);
  return out.str();
}

}  // namespace stage
