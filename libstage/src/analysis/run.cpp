// The deck runner: checks every analysis statement, then runs them in order.
#include "stage/run.hpp"

#include <spdlog/spdlog.h>

#include "analysis/operating_point.hpp"

namespace stage {
namespace {

bool available(const AnalysisOptions& options) {
  return std::holds_alternative<BiasOptions>(options) ||
         std::holds_alternative<SweepOptions>(options);
}

}  // namespace

void check_deck(const Deck& deck) {
  for (const auto& statement : deck.analyses) {
    if (!available(statement.options)) {
      throw InputError(statement.where,
                       "the '" + std::string(analysis_kind(statement.options)) +
                           "' analysis is not available in this version of stage; available: "
                           "bias, sweep");
    }
  }
}

SweepResult run_parameter_sweep(const Deck& deck, const SweepOptions& options) {
  SweepResult result{options, {}};
  std::vector<double> x;
  for (double value : options.values) {
    const Circuit circuit = deck.with_parameter(options.name, value);
    mna::System system(circuit);
    analysis::NewtonSolver newton(system, circuit.solver);
    if (x.size() != static_cast<std::size_t>(system.size()) + 1) {
      x.assign(static_cast<std::size_t>(system.size()) + 1, 0.0);
    }
    const auto how = analysis::solve_operating_point(newton, x);
    spdlog::debug("sweep {} = {:.6g}: {} Newton iterations", options.name, value,
                  how.newton_iterations);
    result.points.push_back({value, analysis::describe_operating_point(system, x, how)});
  }
  return result;
}

RunResult run_deck(const Deck& deck) {
  check_deck(deck);
  RunResult run{deck.circuit.title, deck.circuit.temperature, {}};
  for (const auto& statement : deck.analyses) {
    spdlog::debug("running analyze {}", analysis_kind(statement.options));
    if (std::holds_alternative<BiasOptions>(statement.options)) {
      run.analyses.emplace_back(run_bias(deck.circuit));
    } else if (const auto* sweep = std::get_if<SweepOptions>(&statement.options)) {
      run.analyses.emplace_back(sweep->target == SweepOptions::Target::parameter
                                    ? run_parameter_sweep(deck, *sweep)
                                    : run_sweep(deck.circuit, *sweep));
    }
  }
  return run;
}

}  // namespace stage
