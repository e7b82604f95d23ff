// Whole-run reports: dispatch on each analysis result to its own report.
#include <fstream>

#include "report/bias_report.hpp"
#include "report/characterize_report.hpp"
#include "report/charts.hpp"
#include "report/failure_report.hpp"
#include "report/frequency_report.hpp"
#include "report/headroom_report.hpp"
#include "report/spectrum_report.hpp"
#include "report/transient_report.hpp"
#include "stage/errors.hpp"
#include "stage/report.hpp"

namespace stage {
namespace {

using report::Json;

}  // namespace

std::string json_document(const RunResult& run, int indent) {
  Json analyses = Json::array();
  for (const auto& result : run.analyses) {
    analyses.push_back(std::visit([](const auto& r) { return report::to_json(r); }, result));
  }
  const Json document{
      {"title", run.title}, {"temperature_K", run.temperature}, {"analyses", std::move(analyses)}};
  return document.dump(indent);
}

void print_report(std::ostream& out, const RunResult& run) {
  if (!run.title.empty()) out << run.title << "\n\n";
  bool first = true;
  for (const auto& result : run.analyses) {
    if (!first) out << '\n';
    first = false;
    std::visit([&](const auto& r) { report::print_table(out, r); }, result);
  }
}

void create_output_folder(const std::filesystem::path& dir) {
  std::error_code ec;
  std::filesystem::create_directories(dir, ec);
  if (ec) {
    throw Error(ErrorKind::not_written,
                "cannot create the folder '" + dir.string() + "': " + ec.message(), {dir.string()});
  }
}

std::vector<std::filesystem::path> write_csv_files(const std::filesystem::path& dir,
                                                   const RunResult& run) {
  create_output_folder(dir);
  std::vector<std::filesystem::path> written;
  for (std::size_t i = 0; i < run.analyses.size(); ++i) {
    const auto path = dir / (report::analysis_prefix(run, i) + ".csv");
    std::ofstream file(path);
    std::visit([&](const auto& r) { report::write_csv(file, r); }, run.analyses[i]);
    if (!file) {
      throw Error(ErrorKind::not_written, "cannot write '" + path.string() + "'", {path.string()});
    }
    written.push_back(path);
  }
  return written;
}

}  // namespace stage
