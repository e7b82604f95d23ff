// The prepared simulation (stage/simulation.hpp): one MNA system and one
// Newton solver, whose sparse LU keeps KLU's symbolic analysis, serve every
// analysis run on it; the last bias point is kept as the next one's start.
#include "stage/simulation.hpp"

#include <spdlog/spdlog.h>

#include <cmath>
#include <functional>
#include <optional>

#include "analysis/frequency_response.hpp"
#include "analysis/newton.hpp"
#include "analysis/operating_point.hpp"
#include "analysis/transient.hpp"
#include "circuit/element_kinds.hpp"
#include "mna/system.hpp"
#include "simulation/assemble.hpp"
#include "simulation/simulation_access.hpp"
#include "stage/errors.hpp"
#include "stage/validate.hpp"

namespace stage {

// The circuit itself and the solver settings, checked before anything is
// built from them.
template <class Described>
const Described& validated(const Described& described) {
  if (auto p = validate(described))
    throw Error(ErrorKind::invalid_request, p->message, {p->subject});
  return described;
}

// A request, checked against the circuit before it runs.
void check_request(const Circuit& circuit, const AnalysisOptions& options) {
  if (auto p = validate(circuit, options))
    throw Error(ErrorKind::invalid_request, p->message, {p->subject});
}

struct Simulation::State {
  State(const Circuit& c, const SolverOptions& solver)
      : circuit(validated(c)), system(assemble(circuit)), newton(system, solver) {
    solution.assign(static_cast<std::size_t>(system.size()) + 1, 0.0);
    counters.systems_built = 1;
  }

  // Solves the bias point into `solution`, from the previous one if any.
  const BiasResult& solve_bias() {
    if (bias) {
      ++counters.bias_reused;
      return *bias;
    }
    if (has_solution) {
      ++counters.warm_bias_solves;
    } else {
      ++counters.cold_bias_solves;
    }
    std::vector<double> x = solution;
    const auto how = analysis::solve_operating_point(newton, x);
    solution = std::move(x);
    has_solution = true;
    bias = analysis::describe_operating_point(system, solution, how);
    return *bias;
  }

  Circuit circuit;
  mna::System system;
  analysis::NewtonSolver newton;
  std::vector<double> solution;  // the last bias point (n + 1 entries)
  bool has_solution = false;
  std::optional<BiasResult> bias;  // its report, while nothing has changed
  SimulationCounters counters;
};

Simulation::Simulation(const Circuit& circuit, const SolverOptions& solver)
    : state_(std::make_unique<State>(circuit, validated(solver))) {}
Simulation::~Simulation() = default;
Simulation::Simulation(Simulation&&) noexcept = default;
Simulation& Simulation::operator=(Simulation&&) noexcept = default;

const Circuit& Simulation::circuit() const { return state_->circuit; }

const SolverOptions& Simulation::solver() const { return state_->newton.options(); }

SimulationCounters Simulation::counters() const { return state_->counters; }

BiasResult Simulation::bias() { return state_->solve_bias(); }

SweepResult Simulation::sweep(const SweepOptions& options, const ProgressCallback& progress) {
  if (options.target == SweepOptions::Target::parameter) {
    throw Error(ErrorKind::invalid_request,
                "a parameter sweep needs the circuit's text: use run_deck", {options.name});
  }
  check_request(state_->circuit, options);
  const bool temperature = options.target == SweepOptions::Target::temperature;
  const double restore = temperature ? state_->system.temperature() : [&] {
    const Element* e = state_->circuit.find(options.name);
    if (e == nullptr || !kinds::has_role(e->data, kinds::Role::independent_source)) {
      throw Error(ErrorKind::invalid_request, "'" + options.name + "' is not an independent source",
                  {options.name});
    }
    return *kinds::own_value(e->data);
  }();
  // The swept value goes back to what it was however the sweep ends (a
  // point without a solution throws): the simulation stays the circuit given.
  const auto set = [&](double value) {
    if (temperature) {
      set_temperature(value);
    } else {
      set_value(options.name, value);
    }
  };
  struct Restore {
    std::function<void()> undo;
    ~Restore() { undo(); }
  } restored{[&] { set(restore); }};
  SweepResult result{options, {}};
  result.options.quantity =
      temperature ? Quantity::temperature
      : kinds::has_role(state_->circuit.find(options.name)->data, kinds::Role::holds_voltage)
          ? Quantity::voltage
          : Quantity::current;
  for (double value : options.values) {
    if (progress) {
      progress("sweep: point " + std::to_string(result.points.size() + 1) + " of " +
               std::to_string(options.values.size()));
    }
    set(value);  // each point starts from the one before
    result.points.push_back({value, bias()});
    spdlog::debug("sweep {} = {:.6g}: {} Newton iterations", options.name, value,
                  result.points.back().bias.newton_iterations);
  }
  return result;
}

FrequencyResult Simulation::frequency(const FrequencyOptions& options) {
  check_request(state_->circuit, options);
  BiasResult bias = state_->solve_bias();
  return analysis::frequency_response(state_->circuit, state_->system, state_->solution,
                                      std::move(bias), options);
}

TransientResult Simulation::transient(const TransientOptions& options) {
  check_request(state_->circuit, options);
  TransientResult result = SimulationAccess::transient(*this, options, {});
  return options.resample_step ? resample(result, *options.resample_step) : result;
}

const mna::System& SimulationAccess::system(const Simulation& simulation) {
  return simulation.state_->system;
}

const std::vector<double>& SimulationAccess::bias_point(Simulation& simulation) {
  simulation.state_->solve_bias();
  return simulation.state_->solution;
}

TransientResult SimulationAccess::transient(Simulation& simulation, const TransientOptions& options,
                                            const analysis::StepObserver& observer,
                                            const std::vector<double>& landings,
                                            const std::vector<double>* from) {
  const std::vector<double>* start = from != nullptr ? from
                                     : options.start == TransientStart::bias
                                         ? &bias_point(simulation)
                                         : nullptr;
  return analysis::integrate(simulation.state_->newton, options, observer, start, landings);
}

void Simulation::set_value(const std::string& element, double value) {
  Element* e = state_->circuit.find(element);
  mna::Device* device = state_->system.find_device(element);
  if (e == nullptr || device == nullptr) {
    throw Error(ErrorKind::invalid_request, "no element named '" + element + "'", {element});
  }
  if (auto why = kinds::own_value_error(e->data, value)) {
    throw Error(ErrorKind::invalid_request, "'" + element + "': " + *why, {element});
  }
  if (!state_->system.set_value(*device, value)) {
    throw Error(ErrorKind::invalid_request, "'" + element + "' has no single value to set",
                {element});
  }
  kinds::set_own_value(e->data, value);
  state_->bias.reset();
}

bool Simulation::take_values_from(const Circuit& other) {
  const Circuit& mine = state_->circuit;
  if (other.elements().size() != mine.elements().size() || other.models() != mine.models() ||
      other.temperature != mine.temperature) {
    return false;
  }
  for (std::size_t k = 0; k < mine.elements().size(); ++k) {
    Element same = mine.elements()[k];
    const Element& theirs = other.elements()[k];
    if (const auto value = kinds::own_value(theirs.data)) kinds::set_own_value(same.data, *value);
    if (!(same == theirs)) return false;
  }
  for (const Element& e : other.elements()) {
    const auto value = kinds::own_value(e.data);
    if (value && value != kinds::own_value(state_->circuit.find(e.name)->data)) {
      set_value(e.name, *value);
    }
  }
  return true;
}

void Simulation::set_waveform(const std::string& source, const std::optional<Waveform>& wave) {
  Element* e = state_->circuit.find(source);
  mna::Device* device = state_->system.find_device(source);
  std::optional<Waveform>* field = e == nullptr ? nullptr : kinds::waveform_of(e->data);
  if (device == nullptr || field == nullptr) {
    throw Error(ErrorKind::invalid_request, "'" + source + "' is not an independent source",
                {source});
  }
  std::optional<Waveform>& stored = *field;
  const std::optional<Waveform> before = stored;
  stored = wave;
  if (auto p = validate(state_->circuit)) {
    stored = before;
    throw Error(ErrorKind::invalid_request, p->message, {p->subject});
  }
  device->set_waveform(wave);
}

void Simulation::set_temperature(double kelvin) {
  if (!(std::isfinite(kelvin) && kelvin > 0)) {
    throw Error(ErrorKind::invalid_request,
                "a temperature must be a finite number of kelvin above zero", {"temperature"});
  }
  state_->system.set_temperature(kelvin);
  state_->circuit.temperature = kelvin;
  state_->bias.reset();
}

}  // namespace stage
