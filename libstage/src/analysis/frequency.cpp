// analyze frequency(...): the small-signal sweep, with the input and output
// impedance read from the same factorisation through extra right-hand sides.
#include "stage/frequency.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "analysis/frequency_figures.hpp"
#include "analysis/frequency_response.hpp"
#include "analysis/small_signal.hpp"
#include "circuit/element_kinds.hpp"
#include "common/constants.hpp"

namespace stage {
namespace {

using analysis::Complex;
using analysis::Probe;
using analysis::SmallSignalSystem;

const Complex kInfiniteImpedance(std::numeric_limits<double>::infinity(), 0.0);

std::vector<double> frequency_grid(const FrequencyOptions& o) {
  const double decades = std::log10(o.to / o.from);
  const int steps = static_cast<int>(std::floor(decades * o.per_decade + 1e-9));
  std::vector<double> f;
  for (int k = 0; k <= steps; ++k) f.push_back(o.from * std::pow(10.0, double(k) / o.per_decade));
  if (f.back() < o.to * (1.0 - 1e-12)) f.push_back(o.to);
  return f;
}

std::string output_label(const SignalRef& s) {
  switch (s.kind) {
    case SignalRef::Kind::node_pair:
      return "(" + s.a + ", " + s.b + ")";
    case SignalRef::Kind::element_current:
      return s.a + ".current";
    case SignalRef::Kind::node_voltage:
      break;
  }
  return s.a;
}

Complex ratio_or_infinite(Complex num, Complex den) {
  return den == 0.0 ? kInfiniteImpedance : num / den;
}

// Everything a frequency point needs, built once: right-hand sides, the
// vectors they are solved in, and the read-outs.
class Sweep {
 public:
  Sweep(const Circuit& circuit, const FrequencyOptions& options, SmallSignalSystem& linear,
        std::vector<std::string>& notes);

  // Factors at f and solves every right-hand side.
  void solve_at(double f);
  Complex response() const { return output_.value(x_drive_, omega_) / input_phasor_; }
  Complex input_impedance() const;
  Complex output_impedance() const;
  bool has_output_impedance() const { return has_output_impedance_; }

 private:
  SmallSignalSystem& linear_;
  const mna::System& system_;
  double omega_ = 0;
  Complex input_phasor_;
  std::vector<Complex> drive_, input_unit_, output_unit_;  // right-hand sides
  std::vector<Complex> x_drive_, x_input_, x_output_;      // their solutions
  Probe output_;                                           // the requested output signal
  Probe input_reading_;  // delivered current (voltage source) or voltage (current source)
  bool input_is_voltage_ = true;
  bool has_output_impedance_ = false;
  Probe output_voltage_;  // v(p) - v(n) of the output node pair
  Probe load_current_;    // from the output's positive node through the load
};

Sweep::Sweep(const Circuit& circuit, const FrequencyOptions& options, SmallSignalSystem& linear,
             std::vector<std::string>& notes)
    : linear_(linear),
      system_(linear.system()),
      drive_(linear.make_vector()),
      input_unit_(linear.make_vector()),
      output_unit_(linear.make_vector()),
      x_drive_(linear.make_vector()),
      x_input_(linear.make_vector()),
      x_output_(linear.make_vector()) {
  const auto& topology = system_.topology();
  auto node = [&](const std::string& name) {
    return name == kGround ? mna::kGroundIndex : *topology.find_node(name);
  };

  // Every source with an AC value drives at once (superposition).
  std::vector<std::string> others;
  for (const auto& device : system_.devices()) {
    const mna::SourceAccess* source = device->source();
    if (source == nullptr) continue;
    device->ac_excitation(drive_.data());
    if (device->name() == options.input) {
      input_phasor_ = source->phasor();
    } else if (source->phasor() != 0.0) {
      others.push_back(device->name());
    }
  }
  if (!others.empty()) {
    std::string list;
    for (const auto& name : others) list += (list.empty() ? "" : ", ") + name;
    notes.push_back("other sources with an AC value also drive the circuit (" + list +
                    "): the response is the superposition of all, divided by the phasor of " +
                    options.input);
  }

  // The input alone at a unit phasor, for the impedance it sees: a voltage
  // source's unit value on its branch row, read back as the current it
  // delivers; a current source's unit current into `out`, read back as the
  // voltage it sees. The options were checked: the input is a source.
  const auto input = system_.find_device(options.input)->source()->ports();
  if (input.drives == mna::SourceAccess::Drives::voltage) {
    input_unit_[input.branch] = 1.0;
    input_reading_.terms.push_back({input.branch, 1.0, 0.0});
  } else {
    input_unit_[input.out] += 1.0;
    input_unit_[input.back] -= 1.0;
    input_reading_ = Probe::voltage(input.out, input.back);
    input_is_voltage_ = false;
  }

  const SignalRef& out = options.output;
  if (out.kind == SignalRef::Kind::element_current) {
    mna::Device* device = system_.find_device(out.a);
    if (device->branch() != mna::kGroundIndex) {
      output_.terms.push_back({device->branch(), 1.0, 0.0});
    } else {
      const auto names = kinds::nodes(circuit.find(out.a)->data);
      output_ = linear_.current_through(*device, node(names[0]), node(names[1]));
    }
    notes.push_back("the output is a current: output impedance is not defined and is omitted");
    if (options.load) notes.push_back("the load " + *options.load + " is not used");
    return;
  }

  const mna::Index p = node(out.a);
  const mna::Index n = out.kind == SignalRef::Kind::node_pair ? node(out.b) : mna::kGroundIndex;
  output_ = output_voltage_ = Probe::voltage(p, n);
  output_unit_[p] += 1.0;  // a unit current into p, back out of n
  output_unit_[n] -= 1.0;
  has_output_impedance_ = true;
  if (options.load)
    load_current_ = linear_.current_through(*system_.find_device(*options.load), p, n);
}

void Sweep::solve_at(double f) {
  omega_ = kTwoPi * f;
  linear_.factor(omega_);
  std::copy(drive_.begin(), drive_.end(), x_drive_.begin());
  std::copy(input_unit_.begin(), input_unit_.end(), x_input_.begin());
  linear_.solve(x_drive_);
  linear_.solve(x_input_);
  if (has_output_impedance_) {
    std::copy(output_unit_.begin(), output_unit_.end(), x_output_.begin());
    linear_.solve(x_output_);
  }
}

Complex Sweep::input_impedance() const {
  const Complex reading = input_reading_.value(x_input_, omega_);
  return input_is_voltage_ ? ratio_or_infinite(1.0, reading) : reading;
}

// The rest of the circuit takes the unit current less what the load draws,
// at the same voltage: Z = V / (1 - I_load), i.e. 1/Z = 1/Z_seen - Y_load.
Complex Sweep::output_impedance() const {
  const Complex v = output_voltage_.value(x_output_, omega_);
  return ratio_or_infinite(v, 1.0 - load_current_.value(x_output_, omega_));
}

}  // namespace

namespace analysis {

FrequencyResult frequency_response(const Circuit& circuit, const mna::System& system,
                                   const std::vector<double>& x, BiasResult bias,
                                   const FrequencyOptions& options) {
  FrequencyResult result;
  result.options = options;
  result.output = output_label(options.output);
  result.bias = std::move(bias);
  result.frequencies = frequency_grid(options);

  SmallSignalSystem linear(system, x);
  Sweep sweep(circuit, options, linear, result.notes);
  const std::size_t count = result.frequencies.size();
  result.response.reserve(count);
  result.gain_dB.reserve(count);
  result.phase_deg.reserve(count);
  result.input_impedance.reserve(count);
  if (sweep.has_output_impedance()) result.output_impedance.reserve(count);
  for (double f : result.frequencies) {
    sweep.solve_at(f);
    const Complex h = sweep.response();
    const double previous = result.phase_deg.empty() ? 0.0 : result.phase_deg.back();
    result.response.push_back(h);
    result.gain_dB.push_back(db_from_amplitude_ratio(std::abs(h)));
    result.phase_deg.push_back(analysis::unwrapped_phase_deg(h, previous));
    result.input_impedance.push_back(sweep.input_impedance());
    if (sweep.has_output_impedance()) result.output_impedance.push_back(sweep.output_impedance());
  }
  spdlog::debug("frequency sweep: {} points", count);

  const auto gain_dB_at = [&](double f) {
    sweep.solve_at(f);
    return db_from_amplitude_ratio(std::abs(sweep.response()));
  };
  result.figures = analysis::find_figures(result.frequencies, result.gain_dB, gain_dB_at);
  if (options.at) {
    // Continue the phase from the grid point nearest to `at` (in log f).
    const auto nearest = std::min_element(
        result.frequencies.begin(), result.frequencies.end(), [&](double a, double b) {
          return std::abs(std::log(a / *options.at)) < std::abs(std::log(b / *options.at));
        });
    const double reference = result.phase_deg[nearest - result.frequencies.begin()];
    sweep.solve_at(*options.at);
    result.figures.gain_at_dB = db_from_amplitude_ratio(std::abs(sweep.response()));
    result.figures.phase_at_deg = analysis::unwrapped_phase_deg(sweep.response(), reference);
  }
  return result;
}

}  // namespace analysis
}  // namespace stage
