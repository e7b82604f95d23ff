// The `curves` subcommands: read model libraries (.stage files with `model`
// statements) and curve files, then check the models against them or fit
// chosen parameters to them. Output is readable tables on stdout; the
// model's curves go to CSV files with --csv, the fitted model statement to
// stdout and, with --output, to a file.
#include "command_curves.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <span>

#include "exit_status.hpp"
#include "stage/curves.hpp"
#include "stage/errors.hpp"
#include "stage/reader.hpp"
#include "stage/report.hpp"

namespace {

constexpr const char* kExamples = R"(
Examples:
  stage curves check models/transistors.stage models/curves/small_npn_*.csv
  stage curves check models/transistors.stage models/diodes.stage models/curves/*.csv
  stage curves check models/transistors.stage gummel.csv --model small_npn --tolerance 2%
  stage curves fit models/transistors.stage gummel.csv output.csv --model small_npn \
      --params saturation_current beta_forward early_voltage_forward --output fitted.stage

Files ending in .stage are model libraries, searched in the order given: the
first that defines a model supplies it. Every other file is a curve file:
libstage/src/curves/curve-format.md. Exit status: 0 every curve within
tolerance (check) or a converged fit, 1 a curve out of tolerance or no convergence,
2 bad input, 3 a point the simulator could not solve.)";

struct CurvesSettings {
  std::vector<std::string> files;  // model libraries and curve files, in any order
  std::string model;
  std::vector<std::string> tolerances;
  std::string csv_dir;
  std::vector<std::string> params;
  std::string fitted_name;
  std::string output;
};

// "5%" for every ratio quantity, "20mV" or "0.02 V" for every voltage: the
// units of a curve file's `tolerance` line (stage::tolerance_unit).
stage::ToleranceOverride parse_tolerances(const std::vector<std::string>& texts) {
  stage::ToleranceOverride o;
  for (const auto& text : texts) {
    std::size_t used = 0;
    double value = 0;
    try {
      value = std::stod(text, &used);
    } catch (const std::exception&) {
      used = 0;
    }
    std::string unit = text.substr(used);
    unit.erase(0, unit.find_first_not_of(' '));
    const auto scale = stage::tolerance_unit(unit);
    if (used == 0 || !scale || !(value > 0)) {
      throw stage::InputError({"--tolerance", 0, 0},
                              "expected a percentage (5%) or a voltage (20mV), got '" + text + "'");
    }
    (scale->ratio ? o.ratio : o.voltage) = value * scale->factor;
  }
  return o;
}

// The model a curve is checked against or fitted from: --model, else the
// curve file's `model` line, else the libraries' only model.
stage::DeviceModel model_for(const stage::Curve& curve, const CurvesSettings& s,
                             std::span<const stage::ModelSource> libraries) {
  if (!s.model.empty()) return stage::find_device_model(libraries, s.model, {"--model", 0, 0});
  if (!curve.model.empty()) return stage::find_device_model(libraries, curve.model, curve.model_at);
  std::vector<std::string> names;
  for (const auto& library : libraries) {
    for (const std::string& n : library.models.names()) names.push_back(n);
  }
  if (names.size() == 1) return stage::find_device_model(libraries, names.front(), {});
  throw stage::InputError({curve.file.string(), 0, 0},
                          "the curve names no model and the model libraries hold several: give "
                          "--model NAME");
}

// Reference and model side by side, one row per point, for plotting.
void write_comparison_csv(const std::filesystem::path& path, const stage::CurveCheckResult& r,
                          const stage::Curve& reference) {
  std::ofstream out(path);
  auto column = [](stage::CurveQuantity q) {
    return std::string(stage::to_string(q)) + "_" + std::string(stage::unit_of(q));
  };
  if (reference.stepped) out << column(*reference.stepped) << ",";
  out << column(reference.swept);
  for (auto q : reference.measured)
    out << "," << column(q) << "_reference," << column(q) << "_model";
  out << "\n";
  out.precision(10);
  for (std::size_t i = 0; i < reference.points.size(); ++i) {
    const auto& p = reference.points[i];
    if (reference.stepped) out << p.step << ",";
    out << p.swept;
    for (std::size_t k = 0; k < p.measured.size(); ++k) {
      out << "," << p.measured[k] << "," << r.computed.points[i].measured[k];
    }
    out << "\n";
  }
  if (!out) {
    throw stage::Error(stage::ErrorKind::not_written,
                       "cannot write the CSV file '" + path.string() + "'", {path.string()});
  }
}

struct Inputs {
  std::vector<stage::ModelSource> libraries;
  std::vector<stage::Curve> curves;
  std::vector<std::string> curve_files;
};

// Files ending in .stage are model libraries; every other file is a curve.
Inputs read_inputs(const CurvesSettings& s) {
  stage::ReadOptions options;
  options.model_path = stage::default_model_path();
  Inputs in;
  for (const auto& file : s.files) {
    if (std::filesystem::path(file).extension() == ".stage") {
      in.libraries.push_back({file, stage::read_file(file, options).circuit.models()});
    } else {
      in.curves.push_back(stage::read_curve_file(file));
      in.curve_files.push_back(file);
    }
  }
  if (in.libraries.empty() || in.curves.empty()) {
    throw stage::InputError({"command line", 0, 0},
                            "expected at least one model library (a .stage file) and one curve "
                            "file (any other name)");
  }
  return in;
}

int check(const CurvesSettings& s) {
  Inputs in = read_inputs(s);
  const auto tolerance = parse_tolerances(s.tolerances);
  std::vector<stage::CurveCheckResult> results;
  for (auto& curve : in.curves) {
    stage::apply_tolerance(curve, tolerance);
    results.push_back(stage::check_curve(curve, model_for(curve, s, in.libraries)));
    if (!s.csv_dir.empty()) {
      stage::create_output_folder(s.csv_dir);
      const auto path = std::filesystem::path(s.csv_dir) / (curve.name + "_model.csv");
      write_comparison_csv(path, results.back(), curve);
      spdlog::info("wrote {}", path.string());
    }
  }
  std::cout << stage::check_table(results);
  int status = 0;
  for (const auto& r : results) {
    if (r.passed()) continue;
    std::cout << "\n" << r.summary();
    status = 1;
  }
  return status;
}

// The written model derives from the start model, so the file includes the
// library that defines it, by a path relative to the file's own folder (the
// reader looks there first), and reads on its own.
std::string include_line(std::span<const stage::ModelSource> libraries, const std::string& model,
                         const std::filesystem::path& written) {
  namespace fs = std::filesystem;
  for (const auto& library : libraries) {
    const auto names = library.models.names();
    if (std::find(names.begin(), names.end(), model) == names.end()) continue;
    const fs::path absolute = fs::weakly_canonical(library.file);
    const fs::path relative =
        absolute.lexically_relative(fs::weakly_canonical(written).parent_path());
    return "include \"" + (relative.empty() ? absolute : relative).generic_string() + "\"\n";
  }
  return {};
}

int fit(const CurvesSettings& s) {
  const Inputs in = read_inputs(s);
  const stage::DeviceModel start = model_for(in.curves.front(), s, in.libraries);
  const std::string& name = start.name;
  for (const auto& curve : in.curves) {
    if (model_for(curve, s, in.libraries).name != name) {
      throw stage::InputError({curve.file.string(), 0, 0}, "the curves name different models ('" +
                                                               name + "' and '" + curve.model +
                                                               "'): give --model NAME");
    }
  }
  const stage::FitResult result = stage::fit_model(start, in.curves, s.params);
  std::cout << result.report() << "\n";
  const std::string statement =
      result.model_statement(s.fitted_name.empty() ? name + "_fitted" : s.fitted_name);
  std::cout << statement;
  if (!s.output.empty()) {
    std::ofstream out(s.output);
    out << "# Fitted by `stage curves fit` to:";
    for (const auto& file : in.curve_files) out << " " << file;
    out << "\n" << include_line(in.libraries, name, s.output) << statement;
    if (!out) {
      throw stage::Error(stage::ErrorKind::not_written,
                         "cannot write the model file '" + s.output + "'", {s.output});
    }
  }
  return result.converged ? 0 : 1;
}

int guarded(int (*command)(const CurvesSettings&), const CurvesSettings& s) {
  return run_guarded([&] { return command(s); });
}

}  // namespace

CLI::App* add_curves_commands(CLI::App& app, int& exit_status) {
  auto s = std::make_shared<CurvesSettings>();
  CLI::App* curves =
      app.add_subcommand("curves", "Check or fit device models against reference curves");
  curves->footer(kExamples);
  curves->require_subcommand(1);

  auto common = [&](CLI::App* cmd) {
    cmd->add_option("files", s->files,
                    "Model libraries (.stage files with `model` statements; the first that "
                    "defines a model supplies it) and reference curve files, in any order")
        ->required();
    cmd->add_option("--model", s->model, "Model to use (default: the curve file's `model` line)");
  };

  CLI::App* check_cmd = curves->add_subcommand("check", "Compare a model with reference curves");
  common(check_cmd);
  check_cmd->add_option("--tolerance", s->tolerances,
                        "Replace the files' tolerances: 5% for currents, gains, capacitances and "
                        "frequencies, 20mV for voltages (repeatable)");
  check_cmd->add_option("--csv", s->csv_dir, "Write reference and model side by side into DIR");
  check_cmd->callback([s, &exit_status] { exit_status = guarded(check, *s); });

  CLI::App* fit_cmd = curves->add_subcommand("fit", "Fit model parameters to reference curves");
  common(fit_cmd);
  fit_cmd->add_option("--params", s->params, "Parameters to fit, by their long names")->required();
  fit_cmd->add_option("--name", s->fitted_name, "Name of the fitted model (default MODEL_fitted)");
  fit_cmd->add_option("--output", s->output, "Also write the fitted model statement to FILE");
  fit_cmd->callback([s, &exit_status] { exit_status = guarded(fit, *s); });
  return curves;
}
