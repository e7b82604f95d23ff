// Checking a model against reference curves: the model's curve from the
// fixtures, point-by-point errors, worst and RMS error per curve, the
// failing points named by file line, and the table the command prints.
#include <algorithm>
#include <array>
#include <cmath>
#include <sstream>

#include "common/constants.hpp"
#include "curves/curve_kinds.hpp"
#include "curves/fixtures.hpp"
#include "curves/residuals.hpp"
#include "report/format.hpp"
#include "stage/errors.hpp"

namespace stage {
namespace {

std::string with_unit(double value, CurveQuantity q) {
  const std::string_view unit = unit_of(q);
  return report::si(value, unit == "1" ? "" : unit);
}

std::string error_text(double error, bool by_ratio, bool sign = true) {
  if (!by_ratio) return report::si(error, "V");
  std::ostringstream s;
  s.precision(3);
  if (sign) s << std::showpos;
  s << in_percent(error) << " %";
  return s.str();
}

}  // namespace

DeviceModel find_device_model(std::span<const ModelSource> libraries, const std::string& name,
                              const SourceLocation& asked_at) {
  std::vector<std::string> files, known;
  for (const auto& library : libraries) {
    if (const auto model = library.models.find(name)) return {name, *model};
    files.push_back(library.file);
    for (const std::string& n : library.models.names()) known.push_back(n);
  }
  throw InputError(asked_at, "no model named '" + name + "' in " + text::joined(files) +
                                 "; the models there are: " +
                                 (known.empty() ? std::string("none") : text::joined(known)));
}

DeviceModel find_device_model(const Circuit& library, const std::string& name,
                              const std::string& library_file) {
  const std::array one{ModelSource{library_file, library.models()}};
  return find_device_model(one, name, {library_file, 0, 0});
}

Curve compute_curve(const Curve& reference, const DeviceModel& model) {
  Curve computed = reference;
  computed.model = model.name;
  computed.comments = {"Computed by the stage simulator for model '" + model.name +
                       "' at the points of " + reference.file.string()};
  const auto values = curves::simulate(reference, model);
  for (std::size_t i = 0; i < computed.points.size(); ++i) {
    computed.points[i].measured = values[i];
  }
  return computed;
}

std::string PointError::describe(const Curve& curve) const {
  std::string text = curve.file.string() + ":" + std::to_string(line) + ": ";
  if (curve.stepped)
    text += std::string(to_string(*curve.stepped)) + " = " + with_unit(step, *curve.stepped) + ", ";
  text += std::string(to_string(curve.swept)) + " = " + with_unit(swept, curve.swept) + ": " +
          std::string(to_string(quantity)) + " model " + with_unit(model, quantity) +
          ", reference " + with_unit(reference, quantity) + ", error " +
          error_text(error, compared_by_ratio(quantity)) + " (tolerance " +
          error_text(tolerance, compared_by_ratio(quantity), false) + ")";
  return text;
}

CurveCheckResult compare_curves(const Curve& reference, const Curve& computed) {
  CurveCheckResult r;
  r.curve = reference.name;
  r.file = reference.file;
  r.by_ratio = compared_by_ratio(reference.measured.front());
  r.computed = computed;
  double sum = 0;
  int count = 0;
  std::vector<bool> point_failed(reference.points.size(), false);
  for (std::size_t k = 0; k < reference.measured.size(); ++k) {
    const CurveQuantity q = reference.measured[k];
    const bool log_scale = curves::spans_decades(reference, k);
    const double tolerance = reference.tolerance(q);
    for (std::size_t i = 0; i < reference.points.size(); ++i) {
      const auto& p = reference.points[i];
      PointError e{p.line, q, p.step, p.swept, p.measured[k], computed.points[i].measured[k]};
      e.error = curves::point_error(e.reference, e.model, compared_by_ratio(q), log_scale);
      e.tolerance = tolerance;
      sum += e.error * e.error;
      ++count;
      // A point whose error is not a number (a model that left its range)
      // fails and is the worst: never within tolerance by default.
      const double over = std::abs(e.error) / tolerance;
      if (std::isnan(over) || over > r.worst_over_tolerance) {
        r.worst_over_tolerance = over;
        r.worst = e;
      }
      r.worst_error = std::max(r.worst_error, std::abs(e.error));
      if (!(over <= 1)) {
        r.failing.push_back(e);
        point_failed[i] = true;
      }
    }
  }
  r.failing_points = static_cast<std::size_t>(std::ranges::count(point_failed, true));
  r.rms_error = std::sqrt(sum / std::max(count, 1));
  return r;
}

CurveCheckResult check_curve(const Curve& reference, const DeviceModel& model) {
  return compare_curves(reference, compute_curve(reference, model));
}

void apply_tolerance(Curve& curve, const ToleranceOverride& override_with) {
  for (CurveQuantity q : curve.measured) {
    const auto& value = compared_by_ratio(q) ? override_with.ratio : override_with.voltage;
    if (!value) continue;
    std::erase_if(curve.tolerances, [&](const CurveTolerance& t) { return t.quantity == q; });
    curve.tolerances.push_back({q, *value});
  }
}

std::string CurveCheckResult::summary() const {
  if (passed()) return curve + ": within tolerance";
  std::string text = curve + ": " + text::counted(failing_points, "point", "points") +
                     " out of tolerance, worst at " + worst.describe(computed) + "\n";
  constexpr std::size_t kShown = 5;
  for (std::size_t i = 0; i < std::min(failing.size(), kShown); ++i) {
    text += "  " + failing[i].describe(computed) + "\n";
  }
  if (failing.size() > kShown)
    text += "  … and " + std::to_string(failing.size() - kShown) + " more\n";
  return text;
}

std::string check_table(std::span<const CurveCheckResult> results) {
  report::TextTable table(
      {"curve", "kind", "points", "worst error", "rms error", "worst/tolerance", "result"});
  for (const auto& r : results) {
    table.add_row(
        {r.curve, std::string(to_string(r.computed.kind)), std::to_string(r.computed.points.size()),
         error_text(r.worst_error, r.by_ratio, false), error_text(r.rms_error, r.by_ratio, false),
         report::si(r.worst_over_tolerance, "", 3),
         r.passed() ? "pass"
                    : "FAIL (" + text::counted(r.failing_points, "point", "points") + ")"});
  }
  std::ostringstream out;
  table.print(out);
  return out.str();
}

}  // namespace stage
