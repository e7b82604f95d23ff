// Building a Circuit in code: the element registry (models: stage/models.hpp).
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

bool Circuit::remove(const std::string& name) {
  const auto it = index_.find(name);
  if (it == index_.end()) return false;
  elements_.erase(elements_.begin() + static_cast<std::ptrdiff_t>(it->second));
  index_.clear();
  for (std::size_t k = 0; k < elements_.size(); ++k) index_.emplace(elements_[k].name, k);
  return true;
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
