// Failed-analysis reports.
#include "report/failure_report.hpp"

namespace stage::report {
namespace {

// A CSV cell holding text: quoted, inner quotes doubled (RFC 4180).
std::string csv_text(const std::string& text) {
  std::string cell = "\"";
  for (char c : text) cell += c == '"' ? std::string("\"\"") : std::string(1, c);
  return cell + '"';
}

}  // namespace

Json to_json(const AnalysisFailure& f) {
  return Json{{"kind", f.kind},
              {"error", f.message},
              {"error_kind", to_string(f.error_kind)},
              {"involved", f.involved},
              {"line", f.where.line}};
}

void print_table(std::ostream& out, const AnalysisFailure& f) {
  out << "Failed: analyze " << f.kind << " at " << f.where.file << ':' << f.where.line << ':'
      << f.where.column << " (" << to_string(f.error_kind) << ")\n  " << f.message << '\n';
}

void write_csv(std::ostream& out, const AnalysisFailure& f) {
  out << "error_kind,error,involved\n"
      << to_string(f.error_kind) << ',' << csv_text(f.message) << ','
      << csv_text(text::joined(f.involved, " ")) << '\n';
}

}  // namespace stage::report
