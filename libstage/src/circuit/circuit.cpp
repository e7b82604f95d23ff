// Building a Circuit in code: element and model registries.
#include "stage/circuit.hpp"

#include "stage/errors.hpp"

namespace stage {

Circuit& Circuit::add(std::string name, ElementData data) {
  if (index_.count(name) != 0) {
    throw Error(ErrorKind::invalid_request, "element '" + name + "' is already defined", {name});
  }
  index_.emplace(name, elements_.size());
  elements_.push_back({std::move(name), std::move(data)});
  return *this;
}

Circuit& Circuit::add_model(std::string name, BipolarModel model) {
  bipolar_models_[std::move(name)] = model;
  return *this;
}

Circuit& Circuit::add_model(std::string name, DiodeModel model) {
  diode_models_[std::move(name)] = model;
  return *this;
}

const Element* Circuit::find(const std::string& name) const {
  auto it = index_.find(name);
  return it == index_.end() ? nullptr : &elements_[it->second];
}

Element* Circuit::find(const std::string& name) {
  auto it = index_.find(name);
  return it == index_.end() ? nullptr : &elements_[it->second];
}

}  // namespace stage
