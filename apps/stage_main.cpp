// The `stage` command: reads a `.stage` circuit description, runs its
// analyses and prints readable tables (default), JSON or CSV.
//
// Exit status: 0 success, otherwise chosen from the error's kind in
// exit_status.hpp (2 bad input or request, 3 numerical failure, 1 a bug).
#include <spdlog/sinks/stdout_color_sinks.h>
#include <spdlog/spdlog.h>
#include <unistd.h>

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cstdlib>
#include <iostream>

#include "command_curves.hpp"
#include "exit_status.hpp"
#include "stage/errors.hpp"
#include "stage/reader.hpp"
#include "stage/report.hpp"
#include "stage/run.hpp"

namespace {

constexpr const char* kDescription =
    "stage: bias point, frequency response, transients and output headroom of discrete\n"
    "transistor stages, from a plain-text circuit description (.stage file).";

constexpr const char* kExamples = R"(
Examples:
  stage run follower.stage                 readable tables of every analysis in the file
  stage run follower.stage --json          one JSON document (keys as in the format spec)
  stage run follower.stage --csv results   one CSV file per analysis in results/
  stage run follower.stage --report r.html one HTML page with every analysis' charts (offline)
  stage run follower.stage --plots plots   every chart as an SVG file in plots/
  stage run follower.stage --set rl=16k    override a `let` parameter, written as in the file
  stage check follower.stage               read and check the file, run nothing
  stage curves check models/transistors.stage models/curves/small_npn_*.csv
                                           compare a model with its reference curves

Exit status: 0 done, 2 error in the input (file, line and column are shown, nothing ran), a
request that cannot be done as asked or an output that cannot be written, 3 the circuit could
not be solved (the nodes or elements involved are named), 4 with --strict: everything ran but a
device exceeds a maximum rating of its model, 5 out of memory, 1 a bug; every analysis that
finished is still printed, and a failed one shows its error and error kind in its place.
Charts: --report and --plots draw with Vega-Lite, installed by `bash cmake/bootstrap.sh` (npm ci
in report-bundles/); $STAGE_REPORT_BUNDLES names another folder where it is installed.
Models: `include "transistors.stage"` finds files next to the circuit, then in $STAGE_MODEL_PATH
(colon-separated), then in the installed model library.)";

struct Settings {
  std::string file;
  bool json = false;
  std::string csv_dir;
  std::string report_file;
  std::string plots_dir;
  std::vector<std::string> sets;
  std::vector<std::string> model_dirs;
  std::uintmax_t max_file_mib = stage::ReadOptions{}.max_file_size >> 20;
  bool verbose = false;
  bool strict = false;
};

stage::ReadOptions read_options(const Settings& s) {
  stage::ReadOptions options;
  for (const auto& dir : s.model_dirs) options.model_path.emplace_back(dir);
  options.max_file_size = s.max_file_mib << 20;
  const auto defaults = stage::default_model_path();
  options.model_path.insert(options.model_path.end(), defaults.begin(), defaults.end());
  for (const auto& assignment : s.sets) {
    const auto eq = assignment.find('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == assignment.size()) {
      throw stage::InputError({"--set", 0, 0},
                              "expected NAME=VALUE, the value as a let statement writes it "
                              "(for example rl=16k or rl=16kΩ), got '" +
                                  assignment + "'");
    }
    options.written_overrides[assignment.substr(0, eq)] = assignment.substr(eq + 1);
  }
  return options;
}

// "1 analysis", "3 analyses" (the library's reports have their own, internal).
std::string counted(std::size_t count, const char* one, const char* many) {
  return std::to_string(count) + " " + (count == 1 ? one : many);
}

// `stage check`: everything `run` checks before it solves anything. A file
// of models alone (a model library) has nothing to run and is fine.
int check(const Settings& s) {
  const stage::Deck deck = stage::read_file(s.file, read_options(s));
  const stage::Circuit& c = deck.circuit;
  const std::size_t models = c.models().size();
  if (c.elements().empty() && deck.analyses.empty()) {
    if (models == 0) throw stage::InputError({s.file, 0, 0}, "the file defines nothing");
    std::cout << s.file << ": " << counted(models, "model", "models")
              << ", no elements (a model library); no errors\n";
    return 0;
  }
  stage::check_deck(deck);
  std::cout << s.file << ": " << counted(c.elements().size(), "element", "elements") << ", "
            << counted(deck.analyses.size(), "analysis", "analyses") << "; no errors\n";
  return 0;
}

int run(const Settings& s) {
  const stage::Deck deck = stage::read_file(s.file, read_options(s));
  // Long work (headroom searches, sweeps) reports progress on one rewritten
  // line of stderr, only when stderr is a terminal.
  stage::RunOptions run_options;
  bool progress_shown = false;
  if (isatty(STDERR_FILENO) != 0) {
    run_options.progress = [&progress_shown](const std::string& what) {
      std::cerr << '\r' << what << "\x1b[K" << std::flush;
      progress_shown = true;
    };
  }
  const stage::RunResult result = stage::run_deck(deck, run_options);
  if (progress_shown) std::cerr << "\r\x1b[K" << std::flush;
  if (s.json) {
    std::cout << stage::json_document(result) << '\n';
  } else {
    stage::print_report(std::cout, result);
  }
  if (!s.csv_dir.empty()) {
    for (const auto& path : stage::write_csv_files(s.csv_dir, result)) {
      spdlog::info("wrote {}", path.string());
    }
  }
  if (!s.report_file.empty()) {
    stage::write_html_report(s.report_file, result);
    std::cerr << "report: " << s.report_file << '\n';
  }
  if (!s.plots_dir.empty()) {
    const auto plots = stage::write_plot_files(s.plots_dir, result);
    std::cerr << "plots: " << plots.size() << " SVG files in " << s.plots_dir << '\n';
  }
  // The results that were found are printed above; each failure is also
  // told on stderr, and the status (the most severe) says the run did not
  // complete.
  int status = 0;
  for (const auto& analysis : result.analyses) {
    if (const auto* failure = std::get_if<stage::AnalysisFailure>(&analysis)) {
      std::cerr << "error (" << to_string(failure->error_kind) << "): " << s.file << ':'
                << failure->where.line << ": analyze " << failure->kind << ": " << failure->message
                << '\n';
      status = std::max(status, exit_status(failure->error_kind));
    }
  }
  if (status == 0 && s.strict && result.exceeds_ratings()) {
    std::cerr << "error: a device exceeds a maximum rating of its model (--strict)\n";
    return kExitRatingsExceeded;
  }
  return status;
}

}  // namespace

int main(int argc, char** argv) {
  auto logger = spdlog::stderr_color_mt("stage");
  logger->set_pattern("%^%l%$: %v");
  spdlog::set_default_logger(logger);
  spdlog::set_level(spdlog::level::warn);

  CLI::App app(kDescription, "stage");
  // The help ends with the folders `include` searches here, in order.
  std::string search = "\nModel search path here:";
  for (const auto& folder : stage::default_model_path()) search += "\n  " + folder.string();
  app.footer(std::string(kExamples) + search);
  app.set_version_flag("--version", std::string("stage ") + STAGE_VERSION);
  app.require_subcommand(1);

  Settings s;
  CLI::App* run_cmd = app.add_subcommand("run", "Read FILE and run every analysis in it");
  run_cmd->add_option("file", s.file, "Circuit description (.stage)")->required();
  run_cmd->add_flag("--json", s.json, "Print one JSON document instead of tables");
  run_cmd->add_option("--csv", s.csv_dir, "Also write one CSV file per analysis into DIR");
  run_cmd->add_option("--report", s.report_file,
                      "Also write one self-contained HTML page with every analysis' charts");
  run_cmd->add_option("--plots", s.plots_dir, "Also write every chart as an SVG file into DIR");
  run_cmd->add_option("--set", s.sets, "Override a `let` parameter: NAME=VALUE (repeatable)");
  run_cmd->add_option("--model-path", s.model_dirs, "Extra folder searched by `include`");
  const auto add_max_file_size = [&](CLI::App* command) {
    command
        ->add_option("--max-file-size", s.max_file_mib,
                     "Largest circuit file read, each include alone, in MiB")
        ->check(CLI::Range(std::uintmax_t{1}, std::uintmax_t{2047}))
        ->capture_default_str();
  };
  add_max_file_size(run_cmd);
  run_cmd->add_flag("--verbose,-v", s.verbose, "Log the solver's steps to stderr");
  run_cmd->add_flag("--strict", s.strict,
                    "Exit with status 4 when a device exceeds a maximum rating of its model");

  CLI::App* check_cmd = app.add_subcommand("check", "Read and check FILE without running it");
  check_cmd->add_option("file", s.file, "Circuit description (.stage)")->required();
  check_cmd->add_option("--set", s.sets, "Override a `let` parameter: NAME=VALUE");
  check_cmd->add_option("--model-path", s.model_dirs, "Extra folder searched by `include`");
  add_max_file_size(check_cmd);

  int curves_status = 0;
  CLI::App* curves_cmd = add_curves_commands(app, curves_status);

  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : exit_status(stage::ErrorKind::input);
  }
  if (s.verbose) spdlog::set_level(spdlog::level::debug);
  if (curves_cmd->parsed()) return curves_status;

  return run_guarded([&] { return check_cmd->parsed() ? check(s) : run(s); });
}
