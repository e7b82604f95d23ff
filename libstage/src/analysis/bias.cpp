// The bias result's look-ups and the names of the ways a bias point was
// found (the one-shot run_bias and run_sweep are in simulation/one_shot.cpp).
#include "stage/bias.hpp"

#include <algorithm>
#include <stdexcept>

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

double BiasResult::temperature_of(const std::string& element) const {
  return find_value(element_temperatures, element + ".temperature");
}

const BipolarOperatingPoint& BiasResult::bipolar(const std::string& name) const {
  return find_named(bipolars, name, "transistor");
}

const DiodeOperatingPoint& BiasResult::diode(const std::string& name) const {
  return find_named(diodes, name, "diode");
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

std::string_view to_string(Region region) {
  switch (region) {
    case Region::forward_active:
      return "forward_active";
    case Region::saturation:
      return "saturation";
    case Region::cutoff:
      return "cutoff";
    case Region::reverse_active:
      return "reverse_active";
  }
  return "cutoff";
}

}  // namespace stage
