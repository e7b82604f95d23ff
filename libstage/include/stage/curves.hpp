// Model regression against handbook-style curves, and parameter fitting.
// A curve file (format: libstage/src/curves/curve-format.md) holds reference
// points of one kind of curve; the simulator computes the same curve for a
// model on a fixture circuit, compares point by point, and fits chosen model
// parameters to a set of curves by Levenberg–Marquardt.
//
//   const stage::Curve ref = stage::read_curve_file("small_npn_gummel.csv");
//   const auto model = stage::find_device_model(deck.circuit, "small_npn");
//   const stage::CurveCheckResult r = stage::check_curve(ref, model);
//   if (!r.passed()) std::cout << r.summary();
//
// Values in curve files are magnitudes: for a pnp transistor the collector
// current, the voltages and so on are given as for the mirrored npn, which
// the fixtures simulate (the Gummel–Poon equations are symmetric under the
// mirror), so one file serves either polarity.
#pragma once

#include <filesystem>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include "stage/circuit.hpp"
#include "stage/errors.hpp"
#include "stage/models.hpp"

namespace stage {

enum class CurveKind {
  forward_gummel,        // IC and IB vs VBE at fixed VCE
  current_gain,          // IC/IB vs IC at fixed VCE
  output_family,         // IC vs VCE at one or several IB
  saturation,            // VCE(sat) and VBE(sat) vs IC at forced IC/IB
  junction_capacitance,  // a junction's capacitance vs its reverse voltage
  transition_frequency,  // fT vs IC at fixed VCE
  diode_forward,         // diode current vs forward voltage
};

enum class CurveQuantity {
  base_emitter_voltage,
  collector_emitter_voltage,
  reverse_voltage,
  forward_voltage,
  collector_current,
  base_current,
  forward_current,
  current_gain,
  base_emitter_capacitance,
  base_collector_capacitance,
  diode_capacitance,
  transition_frequency,
  temperature,
  frequency,
  forced_beta,
};

std::string_view to_string(CurveKind kind);
std::string_view to_string(CurveQuantity quantity);
// The SI unit a quantity is kept in ("V", "A", "F", "Hz", "K", "1").
std::string_view unit_of(CurveQuantity quantity);
// Voltages are compared by difference; every other measured quantity by ratio.
bool compared_by_ratio(CurveQuantity quantity);

// Allowed deviation of one measured quantity: a fraction of the reference
// value (ratio quantities) or a value in the quantity's unit (voltages).
struct CurveTolerance {
  CurveQuantity quantity;
  double value = 0;
};

struct CurvePoint {
  int line = 0;                  // in the curve file; 0 for computed points
  double step = 0;               // the stepped quantity's value (output family), else 0
  double swept = 0;              // SI unit
  std::vector<double> measured;  // one per Curve::measured, SI unit
};

struct Curve {
  std::string name;  // the file's `name` line, or the file's stem
  std::filesystem::path file;
  CurveKind kind = CurveKind::forward_gummel;
  std::string model;        // the `model` line: which model the curve belongs to; may be empty
  SourceLocation model_at;  // where the `model` line names it (file, line, column)
  CurveQuantity swept = CurveQuantity::base_emitter_voltage;
  std::vector<CurveQuantity> measured;
  std::optional<CurveQuantity> stepped;  // a per-point condition column (base_current)
  std::vector<std::pair<CurveQuantity, double>> held;  // fixed conditions, SI units
  std::vector<CurveTolerance> tolerances;  // one per measured quantity (defaults filled in)
  std::vector<std::string> comments;       // the file's leading comment lines, without '#'
  std::vector<CurvePoint> points;

  std::optional<double> condition(CurveQuantity quantity) const;
  double tolerance(CurveQuantity quantity) const;
};

// Throws InputError naming the file and line of the first problem.
Curve read_curve_file(const std::filesystem::path& path);
Curve parse_curve(const std::string& text, const std::string& file_name);
// The curve in the file format (comments, header, points), in the header's SI units.
std::string format_curve(const Curve& curve);
void write_curve_file(const std::filesystem::path& path, const Curve& curve);

// A model from a model library, with its name and kind.
struct DeviceModel {
  std::string name;
  AnyModel parameters;
  bool is_bipolar() const { return std::holds_alternative<BipolarModel>(parameters); }
};

// A model library as read from its file: the models it defines.
struct ModelSource {
  std::string file;
  Models models;
};

// Searches the libraries in the order given: the first that defines `name`
// supplies the model. Throws InputError at `asked_at` (where the name was
// given) naming the model, every file searched and the models there are.
DeviceModel find_device_model(std::span<const ModelSource> libraries, const std::string& name,
                              const SourceLocation& asked_at);
// One library; an error is placed at the library file.
DeviceModel find_device_model(const Circuit& library, const std::string& name,
                              const std::string& library_file = "model library");

// The model's curve at the reference's conditions and swept values, computed
// by the simulator on a fixture circuit (see curve-format.md, "How each kind
// is computed"). Throws InputError when the kind does not fit the model
// (a diode curve for a transistor) and NumericalError when a point cannot be
// solved.
Curve compute_curve(const Curve& reference, const DeviceModel& model);

// One measured value of one point against its reference.
struct PointError {
  int line = 0;
  CurveQuantity quantity;
  double step = 0, swept = 0;
  double reference = 0, model = 0;
  // Ratio quantities: the ratio error, signed, symmetric on a log scale when
  // the curve spans a decade or more (model/reference - 1 if above,
  // 1 - reference/model if below). Voltages: model - reference in volts.
  double error = 0;
  double tolerance = 0;
  std::string describe(const Curve& curve) const;  // "line 14 (base_emitter_voltage = 0.65 V): ..."
};

struct CurveCheckResult {
  std::string curve;
  std::filesystem::path file;
  bool by_ratio = true;    // errors are fractions (true) or volts (false)
  double worst_error = 0;  // largest |error| over every point and measured quantity
  double rms_error = 0;    // root mean square of the errors
  double worst_over_tolerance = 0;
  PointError worst;
  std::vector<PointError> failing;  // |error| > tolerance, one per value
  std::size_t failing_points = 0;   // points (rows) with at least one value in `failing`
  Curve computed;                   // the model's curve

  bool passed() const { return failing.empty(); }
  std::string summary() const;  // the first failing points, or "within tolerance"
};

// Replaces the curve's tolerances: a fraction for every ratio quantity and a
// value in volts for every voltage, where given.
struct ToleranceOverride {
  std::optional<double> ratio;
  std::optional<double> voltage;
};

// A tolerance's unit as a curve file's `tolerance` line and the command's
// --tolerance write it: "%" for a ratio (factor 0.01), or volts with an
// optional SI prefix of the language ("mV": factor 1e-3); nothing for any
// other unit. The value times the factor is what ToleranceOverride holds.
struct ToleranceUnit {
  bool ratio = false;
  double factor = 1;
};
std::optional<ToleranceUnit> tolerance_unit(std::string_view text);

CurveCheckResult compare_curves(const Curve& reference, const Curve& computed);
CurveCheckResult check_curve(const Curve& reference, const DeviceModel& model);
void apply_tolerance(Curve& curve, const ToleranceOverride& override_with);

// The table the command prints: one row per curve with worst and RMS error.
std::string check_table(std::span<const CurveCheckResult> results);

struct FitOptions {
  int max_evaluations = 2000;   // model evaluations (curve sets), Jacobians included
  double relative_step = 1e-6;  // finite-difference step in the scaled parameters
};

struct FittedParameter {
  std::string name;
  Quantity quantity = Quantity::dimensionless;
  double start = 0, value = 0;
  double uncertainty = 0;  // one standard deviation, from s² (JᵀJ)⁻¹ at the optimum
  bool log_scale = false;  // fitted as ln(value)
  std::optional<std::pair<double, double>> bounds;  // open interval it was kept in
};

struct FitResult {
  DeviceModel model;  // the start model with the fitted values
  std::vector<FittedParameter> parameters;
  std::vector<CurveCheckResult> residuals;  // every curve against the fitted model
  double start_cost = 0, final_cost = 0;    // sum of squared tolerance-weighted residuals
  int residual_count = 0;
  int evaluations = 0;
  std::string stop_reason;  // why Levenberg–Marquardt stopped
  bool converged = false;

  // `model <name> = <base> { parameter = value  # unit, ± uncertainty (1 sd) ... }`,
  // the comment without `unit, ` for a dimensionless parameter; ends with a newline.
  std::string model_statement(const std::string& name) const;
  // Fitted values, uncertainties (two significant digits), residuals per curve.
  std::string report() const;
};

// Fits `parameter_names` (long names of the model's parameter table) of
// `start` to every curve. Throws InputError for an unknown parameter or one
// without a finite starting value its scale needs.
FitResult fit_model(const DeviceModel& start, std::span<const Curve> curves,
                    std::span<const std::string> parameter_names, const FitOptions& options = {});

}  // namespace stage
