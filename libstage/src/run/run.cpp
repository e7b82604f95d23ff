// The deck runner: checks every analysis statement against the circuit,
// then runs them in order.
#include "stage/run.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>

#include "common/si_format.hpp"
#include "mna/system.hpp"
#include "simulation/assemble.hpp"
#include "stage/errors.hpp"
#include "stage/simulation.hpp"
#include "stage/validate.hpp"

namespace stage {
namespace {

// Why a spectrum cannot read the transient before it, or nothing.
std::optional<std::string> spectrum_error(const SpectrumOptions& spectrum,
                                          const TransientOptions* transient) {
  if (transient == nullptr) {
    return "a spectrum analyses the transient before it: put an `analyze transient(...)` "
           "statement first";
  }
  if (transient->stop - transient->from < 1 / spectrum.fundamental) {
    return "the transient before it keeps less than one period of the fundamental: make its "
           "stop at least " +
           text::si(transient->from + 1 / spectrum.fundamental, "s");
  }
  const auto& kept = transient->signals;
  if (!kept.empty() && std::find(kept.begin(), kept.end(), spectrum.signal) == kept.end()) {
    return "the transient before it does not keep " + spectrum.signal.label() +
           ": add it to its signals";
  }
  return std::nullopt;
}

}  // namespace

void check_deck(const Deck& deck) {
  if (deck.analyses.empty()) {
    throw InputError({deck.file.string(), 0, 0},
                     "no `analyze` statement: nothing to run (add one, for example "
                     "`analyze bias()`)");
  }
  // A problem of the circuit or of the solver settings, where its subject
  // was written (the file when it was not written in one place).
  const auto refuse = [&](const Problem& p) {
    const auto place = deck.places.find(p.subject);
    const SourceLocation where =
        place != deck.places.end() ? place->second : SourceLocation{deck.file.string(), 0, 0};
    throw InputError(where, p.message, deck.line_text(where));
  };
  if (auto p = validate(deck.circuit)) refuse(*p);
  if (auto p = validate(deck.solver)) refuse(*p);
  const TransientOptions* transient_before = nullptr;
  for (const auto& statement : deck.analyses) {
    const auto fail = [&](const std::string& message) {
      throw InputError(statement.where, message, deck.line_text(statement.where));
    };
    if (auto p = validate(deck.circuit, statement.options)) fail(p->message);
    if (const auto* spectrum = std::get_if<SpectrumOptions>(&statement.options)) {
      if (auto why = spectrum_error(*spectrum, transient_before)) fail(*why);
    }
    if (const auto* transient = std::get_if<TransientOptions>(&statement.options)) {
      transient_before = transient;
    }
  }
  // The circuit's graph: floating nodes, loops of voltage sources, cut-sets
  // of current sources, found before anything runs (NumericalError).
  const mna::System topology_checked = stage::assemble(deck.circuit);
}

SweepResult run_parameter_sweep(const Deck& deck, const SweepOptions& options,
                                const ProgressCallback& progress) {
  SweepResult result{options, {}};
  // One prepared simulation while the parameter changes element values only
  // (each point then starts from the one before); a new one when it changes
  // more (a model parameter).
  std::optional<Simulation> simulation;
  for (double value : options.values) {
    if (progress)
      progress("sweep of " + options.name + ": point " + std::to_string(result.points.size() + 1) +
               " of " + std::to_string(options.values.size()));
    const Circuit circuit = deck.with_parameter(options.name, value);
    if (!simulation || !simulation->take_values_from(circuit)) {
      simulation.emplace(circuit, deck.solver);
    }
    result.points.push_back({value, simulation->bias()});
    spdlog::debug("sweep {} = {:.6g}: {} Newton iterations", options.name, value,
                  result.points.back().bias.newton_iterations);
  }
  return result;
}

bool RunResult::failed() const {
  return std::any_of(analyses.begin(), analyses.end(), [](const AnalysisResult& r) {
    return std::holds_alternative<AnalysisFailure>(r);
  });
}

bool RunResult::exceeds_ratings() const {
  return std::any_of(analyses.begin(), analyses.end(), [](const AnalysisResult& r) {
    return std::visit(
        [](const auto& result) {
          if constexpr (requires { result.rating_violations; }) {
            return !result.rating_violations.empty();
          } else if constexpr (requires { result.exceeds_ratings(); }) {
            return result.exceeds_ratings();
          } else {
            return false;
          }
        },
        r);
  });
}

RunResult run_deck(const Deck& deck, const RunOptions& run_options) {
  check_deck(deck);
  RunResult run{deck.circuit.title, deck.circuit.temperature, {}};
  const Circuit& circuit = deck.circuit;
  std::optional<std::size_t> last_transient;  // index into run.analyses
  for (const auto& statement : deck.analyses) {
    const std::string kind(analysis_kind(statement.options));
    spdlog::debug("running analyze {}", kind);
    struct Visitor {
      const Deck& deck;
      const Circuit& circuit;
      const RunOptions& run_options;
      const TransientResult* last_transient;
      AnalysisResult operator()(const BiasOptions&) const { return run_bias(circuit, deck.solver); }
      AnalysisResult operator()(const SweepOptions& o) const {
        return o.target == SweepOptions::Target::parameter
                   ? run_parameter_sweep(deck, o, run_options.progress)
                   : run_sweep(circuit, o, deck.solver, run_options.progress);
      }
      AnalysisResult operator()(const FrequencyOptions& o) const {
        return run_frequency(circuit, o, deck.solver);
      }
      AnalysisResult operator()(const TransientOptions& o) const {
        return run_transient(circuit, o, deck.solver);
      }
      AnalysisResult operator()(const SpectrumOptions& o) const {
        return run_spectrum(*last_transient, o);
      }
      AnalysisResult operator()(const HeadroomOptions& o) const {
        return run_headroom(circuit, o, deck.solver, run_options.progress);
      }
      AnalysisResult operator()(const CharacterizeOptions& o) const {
        return run_characterize(circuit, o, deck.solver, run_options.progress);
      }
    };
    const TransientResult* transient =
        last_transient ? std::get_if<TransientResult>(&run.analyses[*last_transient]) : nullptr;
    if (std::holds_alternative<SpectrumOptions>(statement.options) && transient == nullptr) {
      // check_deck saw a transient before it, so that transient failed.
      const auto& failed = std::get<AnalysisFailure>(run.analyses[*last_transient]);
      run.analyses.push_back(AnalysisFailure{
          kind, failed.error_kind, statement.where, "not run: the transient before it failed", {}});
      continue;
    }
    try {
      run.analyses.push_back(
          std::visit(Visitor{deck, circuit, run_options, transient}, statement.options));
    } catch (const NumericalError& e) {
      spdlog::debug("analyze {} failed: {}", kind, e.what());
      run.analyses.push_back(
          AnalysisFailure{kind, e.kind(), statement.where, e.message(), e.involved()});
    }
    if (std::holds_alternative<TransientOptions>(statement.options)) {
      last_transient = run.analyses.size() - 1;
    }
  }
  return run;
}

}  // namespace stage
