// validate(const Circuit&, const AnalysisOptions&): the rules of
// stage/validate.hpp for each analysis request, one function per kind.
#include <cmath>

#include "circuit/element_kinds.hpp"
#include "stage/frequency.hpp"
#include "stage/validate.hpp"

namespace stage {
namespace {

// Bounds on what a request may ask for, so that no input makes the program
// run without end or exhaust memory (our own limits, written into the spec).
constexpr double kMaxSweepPoints = 1e6;
constexpr double kMaxFrequencyPoints = 1e6;
constexpr double kMaxResampledPoints = 1e7;
constexpr double kMaxSteps = 1e8;  // stop / max_step: a run the step bound alone makes endless
constexpr std::size_t kMaxWaveformCorners = 10'000'000;  // waveform corners up to stop
constexpr int kMaxHarmonics = 1000;
constexpr int kMaxHeadroomRuns = 1000;
// Two periods are the fewest that show whether a waveform repeats; 10 000 of
// 400 steps each bound one run's work.
constexpr int kMinSettlePeriods = 2, kMaxSettlePeriods = 10000;

std::optional<Problem> problem(std::string subject, std::string message) {
  return Problem{std::move(subject), std::move(message)};
}

bool positive_finite(double v) { return std::isfinite(v) && v > 0; }

std::optional<Problem> settle_periods_in_range(int periods) {
  if (periods < kMinSettlePeriods || periods > kMaxSettlePeriods) {
    return problem("settle_periods", "settle_periods must be a whole number from 2 to 10000");
  }
  return std::nullopt;
}

std::optional<Problem> independent_source(const Circuit& circuit, const std::string& input) {
  const Element* e = circuit.find(input);
  if (e != nullptr && kinds::has_role(e->data, kinds::Role::independent_source)) {
    return std::nullopt;
  }
  return problem("input",
                 "the input '" + input + "' must be an independent voltage or current source");
}

// A large-signal drive (headroom, characterize) reads a node voltage.
std::optional<Problem> large_signal_output(const SignalRef& output) {
  if (output.kind != SignalRef::Kind::element_current) return std::nullopt;
  return problem("output",
                 "a large-signal output must be a node or a node pair, not " + output.label());
}

std::optional<Problem> load_exists(const Circuit& circuit, const std::optional<std::string>& load) {
  if (!load || circuit.find(*load) != nullptr) return std::nullopt;
  return problem("load", "the load '" + *load + "' is not an element of the circuit");
}

std::optional<Problem> check(const Circuit&, const BiasOptions&) { return std::nullopt; }

std::optional<Problem> check(const Circuit& circuit, const SweepOptions& o) {
  if (o.values.empty()) return problem("values", "a sweep needs at least one value");
  if (static_cast<double>(o.values.size()) > kMaxSweepPoints) {
    return problem("values", "a sweep takes at most 1000000 points");
  }
  for (double v : o.values) {
    if (!std::isfinite(v)) return problem("values", "every swept value must be finite");
    if (o.target == SweepOptions::Target::temperature && !(v > 0)) {
      return problem("values", "a swept temperature must be above 0 K");
    }
  }
  if (o.target == SweepOptions::Target::source) return independent_source(circuit, o.name);
  return std::nullopt;
}

std::optional<Problem> check(const Circuit& circuit, const FrequencyOptions& o) {
  if (auto why = frequency_options_error(circuit, o)) return problem("frequency", *why);
  if (std::log10(o.to / o.from) * o.per_decade > kMaxFrequencyPoints) {
    return problem("per_decade", "the frequency sweep would take more than 1000000 points");
  }
  return std::nullopt;
}

std::optional<Problem> check(const Circuit& circuit, const TransientOptions& o) {
  if (!positive_finite(o.stop))
    return problem("stop", "a transient's stop must be positive and finite");
  // Every corner is a step the transient lands on, listed before it starts.
  for (const Element& e : circuit.elements()) {
    const auto* wave = std::visit(
        [](const auto& data) -> const std::optional<Waveform>* {
          if constexpr (requires { data.wave; }) {
            return &data.wave;
          } else {
            return nullptr;
          }
        },
        e.data);
    if (wave != nullptr && wave->has_value() &&
        waveform_corner_count(**wave, o.stop) > kMaxWaveformCorners) {
      return problem("stop", "the waveform of '" + e.name + "' has more than " +
                                 std::to_string(kMaxWaveformCorners) +
                                 " corners up to stop; each is a step the transient must land on");
    }
  }
  if (!(o.from >= 0 && o.from < o.stop)) {
    return problem("from", "a transient's from must be at least 0 and before stop");
  }
  if (!(std::isfinite(o.max_step) && o.max_step >= 0)) {
    return problem("max_step", "max_step must be zero (chosen for you) or positive, and finite");
  }
  if (o.max_step > 0 && o.stop / o.max_step > kMaxSteps) {
    return problem("max_step", "max_step asks for more than 100000000 steps up to stop");
  }
  if (o.resample_step) {
    if (!positive_finite(*o.resample_step)) {
      return problem("uniform_step", "uniform_step must be positive and finite");
    }
    if ((o.stop - o.from) / *o.resample_step > kMaxResampledPoints) {
      return problem("uniform_step", "uniform_step gives more than 10000000 points");
    }
  }
  return std::nullopt;
}

std::optional<Problem> check(const Circuit&, const SpectrumOptions& o) {
  if (!positive_finite(o.fundamental)) {
    return problem("fundamental", "the fundamental must be positive and finite");
  }
  if (o.harmonics < 1 || o.harmonics > kMaxHarmonics) {
    return problem("harmonics", "harmonics must be a whole number from 1 to 1000");
  }
  return std::nullopt;
}

std::optional<Problem> check(const Circuit& circuit, const HeadroomOptions& o) {
  if (!positive_finite(o.frequency)) return problem("frequency", "the frequency must be positive");
  if (!(o.distortion_limit > 0 && o.distortion_limit < 1)) {
    return problem("distortion_limit", "the distortion limit must lie between 0 and 100 %");
  }
  if (o.first_input_amplitude && !positive_finite(*o.first_input_amplitude)) {
    return problem("first_input_amplitude", "the first input amplitude must be positive");
  }
  if (o.max_runs < 1 || o.max_runs > kMaxHeadroomRuns) {
    return problem("max_runs", "a headroom search takes from 1 to 1000 transient runs");
  }
  if (auto p = settle_periods_in_range(o.settle_periods)) return p;
  if (auto p = independent_source(circuit, o.input)) return p;
  if (auto p = large_signal_output(o.output)) return p;
  return load_exists(circuit, o.load);
}

std::optional<Problem> check(const Circuit& circuit, const CharacterizeOptions& o) {
  if (!positive_finite(o.frequency)) return problem("frequency", "the frequency must be positive");
  if (auto p = settle_periods_in_range(o.settle_periods)) return p;
  if (auto p = independent_source(circuit, o.input)) return p;
  if (auto p = large_signal_output(o.output)) return p;
  return load_exists(circuit, o.load);
}

}  // namespace

std::optional<Problem> validate(const Circuit& circuit, const AnalysisOptions& options) {
  return std::visit([&](const auto& o) { return check(circuit, o); }, options);
}

}  // namespace stage
