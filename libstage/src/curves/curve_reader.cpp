// Reading curve files (curve-format.md): a header of key lines, then
// `points` and one row of numbers per point. Every problem is an InputError
// with the file, the line, the column of the offending field and the line.
#include <algorithm>
#include <charconv>
#include <cmath>
#include <fstream>
#include <sstream>

#include "common/si_format.hpp"
#include "curves/curve_kinds.hpp"
#include "curves/units.hpp"
#include "stage/errors.hpp"

namespace stage {
namespace {

using curves::info;

struct Field {
  std::string text;
  int column = 1;
};

std::string trim(std::string_view s) {
  const auto first = s.find_first_not_of(" \t\r");
  if (first == std::string_view::npos) return {};
  const auto last = s.find_last_not_of(" \t\r");
  return std::string(s.substr(first, last - first + 1));
}

// Columns count characters, not bytes, as InputError's caret does.
int column_of(const std::string& line, std::size_t byte) {
  int column = 1;
  for (std::size_t i = 0; i < byte && i < line.size(); ++i) {
    if ((static_cast<unsigned char>(line[i]) & 0xC0) != 0x80) ++column;
  }
  return column;
}

std::vector<Field> split(const std::string& line) {
  std::vector<Field> fields;
  std::size_t start = 0;
  for (;;) {
    const auto comma = line.find(',', start);
    const std::string raw =
        line.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    const auto lead = raw.find_first_not_of(" \t");
    fields.push_back({trim(raw), column_of(line, start + (lead == std::string::npos ? 0 : lead))});
    if (comma == std::string::npos) return fields;
    start = comma + 1;
  }
}

class CurveParser {
 public:
  CurveParser(std::string file_name) : file_(std::move(file_name)) {
    curve_.file = file_;
    curve_.name = std::filesystem::path(file_).stem().string();
  }

  Curve parse(const std::string& text) {
    std::istringstream in(text);
    bool header_comments = true;
    while (std::getline(in, line_)) {
      ++line_number_;
      const auto hash = line_.find('#');
      const std::string body = trim(std::string_view(line_).substr(0, hash));
      if (body.empty()) {
        if (header_comments && hash != std::string::npos) {
          curve_.comments.push_back(trim(std::string_view(line_).substr(hash + 1)));
        }
        continue;
      }
      header_comments = false;
      const auto fields = split(body);
      if (in_points_) {
        point(fields);
      } else {
        header(fields);
      }
    }
    line_ = {};
    if (!kind_seen_) fail_at_end("no `curve, KIND` line");
    if (!in_points_) fail_at_end("no `points` line: the header must end with `points`");
    if (curve_.points.empty()) fail_at_end("no points after `points`");
    return std::move(curve_);
  }

 private:
  [[noreturn]] void fail(const Field& field, const std::string& message) const {
    throw InputError({file_, line_number_, field.column}, message, line_);
  }
  [[noreturn]] void fail_at_end(const std::string& message) const {
    throw InputError({file_, 0, 0}, message);
  }

  void expect_count(const std::vector<Field>& fields, std::size_t count, const char* shape) const {
    if (fields.size() != count) {
      fail(fields[std::min(fields.size(), count) - 1],
           std::string("expected `") + shape + "` (" + std::to_string(count) + " fields), got " +
               std::to_string(fields.size()));
    }
  }

  CurveQuantity quantity(const Field& field) const {
    if (const auto q = curves::quantity_named(field.text)) return *q;
    std::string names;
    for (const auto& i : curves::all_quantities())
      names += std::string(names.empty() ? "" : ", ") + std::string(i.name);
    fail(field, "unknown quantity '" + field.text + "'; known: " + names);
  }

  curves::UnitScale unit(const Field& field, CurveQuantity q) const {
    const auto scale = curves::parse_unit(field.text, q);
    if (!scale)
      fail(field, "'" + field.text + "' is not a unit of " + std::string(info(q).name) + " (" +
                      curves::unit_help(q) + ")");
    return *scale;
  }

  double number(const Field& field) const {
    double value = 0;
    const char* begin = field.text.data();
    const char* end = begin + field.text.size();
    if (begin != end && *begin == '+') ++begin;
    const auto [ptr, ec] = std::from_chars(begin, end, value);
    if (ec != std::errc() || ptr != end || field.text.empty() || !std::isfinite(value)) {
      fail(field, "expected a number, got '" + field.text + "'");
    }
    return value;
  }

  // The number in SI units: one that overflows once its unit is applied
  // (1e308 GV) is an error at its place, never an infinity.
  double scaled(const Field& field, const curves::UnitScale& scale) const {
    const double value = scale.to_si(number(field));
    if (!std::isfinite(value)) {
      fail(field, "'" + field.text + "' in its unit is beyond the range of numbers");
    }
    return value;
  }

  void require_kind(const Field& field) const {
    if (!kind_seen_) fail(field, "the first line must be `curve, KIND`");
  }

  void header(const std::vector<Field>& fields) {
    const std::string& key = fields[0].text;
    if (key == "curve") {
      kind_line(fields);
      return;
    }
    require_kind(fields[0]);
    if (key == "name" || key == "model") {
      expect_count(fields, 2, (key + ", TEXT").c_str());
      (key == "name" ? curve_.name : curve_.model) = fields[1].text;
      if (key == "model") curve_.model_at = {file_, line_number_, fields[1].column};
    } else if (key == "sweep") {
      sweep_line(fields);
    } else if (key == "measure") {
      measure_line(fields);
    } else if (key == "step") {
      step_line(fields);
    } else if (key == "hold") {
      hold_line(fields);
    } else if (key == "tolerance") {
      expect_count(fields, 4, "tolerance, QUANTITY, VALUE, UNIT");
      tolerance(fields);
    } else if (key == "points") {
      expect_count(fields, 1, "points");
      finish_header(fields[0]);
    } else {
      fail(fields[0], "unknown key '" + key +
                          "'; expected curve, name, model, sweep, measure, step, hold, tolerance "
                          "or points");
    }
  }

  void kind_line(const std::vector<Field>& fields) {
    expect_count(fields, 2, "curve, KIND");
    if (kind_seen_) fail(fields[0], "`curve` is given twice");
    const auto kind = curves::kind_named(fields[1].text);
    if (!kind) {
      std::vector<std::string> names;
      for (const auto& r : curves::all_kinds()) names.emplace_back(r.name);
      fail(fields[1], "unknown curve kind '" + fields[1].text + "'; known: " + text::joined(names));
    }
    curve_.kind = *kind;
    curve_.swept = curves::rule(*kind).swept;
    kind_seen_ = true;
  }

  void sweep_line(const std::vector<Field>& fields) {
    const curves::KindRule& r = curves::rule(curve_.kind);
    expect_count(fields, 3, "sweep, QUANTITY, UNIT");
    const CurveQuantity q = quantity(fields[1]);
    if (q != r.swept) {
      fail(fields[1],
           "a " + std::string(r.name) + " curve sweeps " + std::string(info(r.swept).name));
    }
    swept_scale_ = unit(fields[2], q);
    sweep_seen_ = true;
  }

  void measure_line(const std::vector<Field>& fields) {
    const curves::KindRule& r = curves::rule(curve_.kind);
    expect_count(fields, 3, "measure, QUANTITY, UNIT");
    const CurveQuantity q = quantity(fields[1]);
    if (std::find(r.measurable.begin(), r.measurable.end(), q) == r.measurable.end()) {
      fail(fields[1], "a " + std::string(r.name) + " curve does not measure " + fields[1].text);
    }
    if (std::count(curve_.measured.begin(), curve_.measured.end(), q)) {
      fail(fields[1], fields[1].text + " is measured twice");
    }
    if (r.measure_exactly_one && !curve_.measured.empty()) {
      fail(fields[1], "a " + std::string(r.name) + " curve measures one quantity");
    }
    curve_.measured.push_back(q);
    measured_scale_.push_back(unit(fields[2], q));
  }

  void step_line(const std::vector<Field>& fields) {
    const curves::KindRule& r = curves::rule(curve_.kind);
    expect_count(fields, 3, "step, QUANTITY, UNIT");
    const CurveQuantity q = quantity(fields[1]);
    if (r.steppable != q)
      fail(fields[1], "a " + std::string(r.name) + " curve cannot step " + fields[1].text);
    if (curve_.stepped || curve_.condition(q)) fail(fields[0], fields[1].text + " is given twice");
    curve_.stepped = q;
    step_scale_ = unit(fields[2], q);
  }

  void hold_line(const std::vector<Field>& fields) {
    const curves::KindRule& r = curves::rule(curve_.kind);
    expect_count(fields, 4, "hold, QUANTITY, VALUE, UNIT");
    const CurveQuantity q = quantity(fields[1]);
    const bool allowed = std::count(r.required.begin(), r.required.end(), q) +
                         std::count(r.optional.begin(), r.optional.end(), q);
    if (!allowed)
      fail(fields[1], "a " + std::string(r.name) + " curve does not hold " + fields[1].text);
    if (curve_.condition(q) || curve_.stepped == q)
      fail(fields[1], fields[1].text + " is given twice");
    const double value = unit(fields[3], q).to_si(number(fields[2]));
    if (q != CurveQuantity::collector_emitter_voltage && !(value > 0)) {
      fail(fields[2], fields[1].text + " must be positive");
    }
    curve_.held.emplace_back(q, value);
  }

  void finish_header(const Field& at) {
    const curves::KindRule& r = curves::rule(curve_.kind);
    if (!sweep_seen_) fail(at, "no `sweep` line before `points`");
    if (curve_.measured.empty()) fail(at, "no `measure` line before `points`");
    for (CurveQuantity q : r.required) {
      if (!curve_.condition(q) && curve_.stepped != q) {
        fail(at, "a " + std::string(r.name) + " curve needs `hold, " + std::string(info(q).name) +
                     ", VALUE, UNIT`" + (r.steppable == q ? " or a `step` column" : ""));
      }
    }
    for (CurveQuantity q : curve_.measured) {
      if (!std::count_if(curve_.tolerances.begin(), curve_.tolerances.end(),
                         [&](const CurveTolerance& t) { return t.quantity == q; })) {
        curve_.tolerances.push_back({q, info(q).default_tolerance});
      }
    }
    in_points_ = true;
  }

  void tolerance(const std::vector<Field>& fields) {
    const CurveQuantity q = quantity(fields[1]);
    if (std::find(curve_.measured.begin(), curve_.measured.end(), q) == curve_.measured.end()) {
      fail(fields[1], fields[1].text +
                          " is not measured by this curve (or its `measure` line "
                          "comes later: put it first)");
    }
    const auto scale = curves::parse_tolerance_unit(fields[3].text, q);
    if (!scale) {
      fail(fields[3], std::string(info(q).by_ratio
                                      ? "a tolerance on " + fields[1].text + " is a ratio: write %"
                                      : "a tolerance on a voltage is in V or mV"));
    }
    const double value = number(fields[2]) * *scale;
    if (!(value > 0 && std::isfinite(value)))
      fail(fields[2], "a tolerance must be positive and finite");
    if (std::count_if(curve_.tolerances.begin(), curve_.tolerances.end(),
                      [&](const CurveTolerance& t) { return t.quantity == q; })) {
      fail(fields[1], "the tolerance on " + fields[1].text + " is given twice");
    }
    curve_.tolerances.push_back({q, value});
  }

  void point(const std::vector<Field>& fields) {
    const std::size_t expected = curve_.measured.size() + 1 + (curve_.stepped ? 1 : 0);
    if (fields.size() != expected) {
      fail(fields[std::min(fields.size(), expected) - 1],
           "expected " + std::to_string(expected) + " numbers per point (" + columns() + "), got " +
               std::to_string(fields.size()));
    }
    CurvePoint p;
    p.line = line_number_;
    std::size_t k = 0;
    if (curve_.stepped) p.step = positive(fields[k++], *curve_.stepped, step_scale_);
    p.swept = scaled(fields[k++], swept_scale_);
    for (std::size_t m = 0; m < curve_.measured.size(); ++m) {
      const CurveQuantity q = curve_.measured[m];
      p.measured.push_back(info(q).by_ratio ? positive(fields[k], q, measured_scale_[m])
                                            : scaled(fields[k], measured_scale_[m]));
      ++k;
    }
    curve_.points.push_back(std::move(p));
  }

  // Ratio quantities are compared on a log scale, so they must be positive:
  // magnitudes, as for the mirrored npn.
  double positive(const Field& field, CurveQuantity q, const curves::UnitScale& scale) const {
    const double value = scaled(field, scale);
    if (!(value > 0)) {
      fail(field, std::string(info(q).name) + " must be positive (give magnitudes, as for an npn)");
    }
    return value;
  }

  std::string columns() const {
    std::string text = curve_.stepped ? std::string(info(*curve_.stepped).name) + ", " : "";
    text += info(curve_.swept).name;
    for (CurveQuantity q : curve_.measured) text += ", " + std::string(info(q).name);
    return text;
  }

  std::string file_;
  std::string line_;
  int line_number_ = 0;
  Curve curve_;
  bool kind_seen_ = false, sweep_seen_ = false, in_points_ = false;
  curves::UnitScale swept_scale_, step_scale_;
  std::vector<curves::UnitScale> measured_scale_;
};

}  // namespace

Curve parse_curve(const std::string& text, const std::string& file_name) {
  return CurveParser(file_name).parse(text);
}

Curve read_curve_file(const std::filesystem::path& path) {
  std::ifstream in(path);
  if (!in) throw InputError({path.string(), 0, 0}, "cannot open the curve file");
  std::stringstream text;
  text << in.rdbuf();
  return parse_curve(text.str(), path.string());
}

}  // namespace stage
