// analyze bias() and analyze sweep(...) over a source or the temperature.
#include "stage/bias.hpp"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <stdexcept>

#include "analysis/operating_point.hpp"
#include "devices/sources.hpp"

namespace stage {
namespace {

template <class Item>
const Item& find_named(const std::vector<Item>& items, const std::string& name, const char* what) {
  auto it = std::find_if(items.begin(), items.end(), [&](const Item& i) { return i.name == name; });
  if (it == items.end())
    throw std::out_of_range(std::string("no ") + what + " named '" + name + "'");
  return *it;
}

double find_value(const std::vector<std::pair<std::string, double>>& values,
                  const std::string& key) {
  for (const auto& [k, v] : values) {
    if (k == key) return v;
  }
  throw std::out_of_range("no value for '" + key + "'");
}

}  // namespace

double BiasResult::voltage(const std::string& node) const {
  if (node == kGround) return 0.0;
  return find_value(node_voltages, node);
}

double BiasResult::current(const std::string& element) const {
  return find_value(element_currents, element + ".current");
}

const BipolarOperatingPoint& BiasResult::bipolar(const std::string& name) const {
  return find_named(bipolars, name, "transistor");
}

const DiodeOperatingPoint& BiasResult::diode(const std::string& name) const {
  return find_named(diodes, name, "diode");
}

BiasResult run_bias(const Circuit& circuit) {
  mna::System system(circuit);
  analysis::NewtonSolver newton(system, circuit.solver);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  const auto how = analysis::solve_operating_point(newton, x);
  return analysis::describe_operating_point(system, x, how);
}

SweepResult run_sweep(const Circuit& circuit, const SweepOptions& options,
                      const ProgressCallback& progress) {
  if (options.target == SweepOptions::Target::parameter) {
    throw std::invalid_argument("a parameter sweep needs the circuit's text: use run_deck");
  }
  mna::System system(circuit);
  devices::IndependentSource* source = nullptr;
  if (options.target == SweepOptions::Target::source) {
    source = dynamic_cast<devices::IndependentSource*>(system.find_device(options.name));
    if (source == nullptr) {
      throw std::invalid_argument("'" + options.name + "' is not an independent source");
    }
  }
  analysis::NewtonSolver newton(system, circuit.solver);
  std::vector<double> x(static_cast<std::size_t>(system.size()) + 1, 0.0);
  SweepResult result{options, {}};
  for (double value : options.values) {
    if (progress) {
      progress("sweep: point " + std::to_string(result.points.size() + 1) + " of " +
               std::to_string(options.values.size()));
    }
    if (source != nullptr) {
      source->value().set_dc(value);
    } else {
      system.set_temperature(value);
    }
    // The previous point is the starting guess for the next.
    const auto how = analysis::solve_operating_point(newton, x);
    spdlog::debug("sweep {} = {:.6g}: {} Newton iterations", options.name, value,
                  how.newton_iterations);
    result.points.push_back({value, analysis::describe_operating_point(system, x, how)});
  }
  return result;
}

std::string_view to_string(BiasMethod method) {
  switch (method) {
    case BiasMethod::newton:
      return "newton";
    case BiasMethod::conductance_stepping:
      return "conductance_stepping";
    case BiasMethod::source_stepping:
      return "source_stepping";
  }
  return "newton";
}

}  // namespace stage
