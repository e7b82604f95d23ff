// Building a Circuit in code: the element registry (models: stage/models.hpp).
#include "stage/circuit.hpp"

#include "stage/errors.hpp"

namespace stage {

void Circuit::reserve(std::size_t count) {
  elements_.reserve(count);
  index_.rebuild(elements_.size(), names(), count);
}

Circuit& Circuit::add(std::string name, ElementData data) {
  if (find(name) != nullptr) {
    throw Error(ErrorKind::invalid_request, "element '" + name + "' is already defined", {name});
  }
  elements_.push_back({std::move(name), std::move(data)});
  index_.added(elements_.size() - 1, elements_.size(), names());
  return *this;
}

bool Circuit::remove(const std::string& name) {
  const std::optional<std::size_t> at = index_.find(name, names());
  if (!at) return false;
  elements_.erase(elements_.begin() + static_cast<std::ptrdiff_t>(*at));
  index_.rebuild(elements_.size(), names(), elements_.size());
  return true;
}

const Element* Circuit::find(const std::string& name) const {
  const std::optional<std::size_t> at = index_.find(name, names());
  return at ? &elements_[*at] : nullptr;
}

Element* Circuit::find(const std::string& name) {
  const std::optional<std::size_t> at = index_.find(name, names());
  return at ? &elements_[*at] : nullptr;
}

}  // namespace stage
