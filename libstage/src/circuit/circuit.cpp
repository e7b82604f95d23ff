// Building a Circuit in code: the element registry (models: stage/models.hpp).
// Elements are found by name through an open-addressing table of their
// positions, a few bytes an element (a large circuit has millions).
#include "stage/circuit.hpp"

#include <functional>
#include <utility>

#include "stage/errors.hpp"

namespace stage {

namespace {
// Slots per element at most, before the table doubles: probes stay short.
constexpr std::size_t kSlotsPerElement = 2;
}  // namespace

std::size_t Circuit::slot_of(std::string_view name) const {
  const std::size_t mask = slots_.size() - 1;
  for (std::size_t slot = std::hash<std::string_view>{}(name)&mask;; slot = (slot + 1) & mask) {
    if (slots_[slot] == 0 || elements_[slots_[slot] - 1].name == name) return slot;
  }
}

void Circuit::index_all(std::size_t slot_count) {
  std::size_t size = 16;
  while (size < slot_count) size *= 2;
  slots_.assign(size, 0);
  for (std::size_t k = 0; k < elements_.size(); ++k) {
    slots_[slot_of(elements_[k].name)] = static_cast<std::uint32_t>(k + 1);
  }
}

void Circuit::reserve(std::size_t count) {
  elements_.reserve(count);
  if (slots_.size() < count * kSlotsPerElement) index_all(count * kSlotsPerElement);
}

Circuit& Circuit::add(std::string name, ElementData data) {
  if (find(name) != nullptr) {
    throw Error(ErrorKind::invalid_request, "element '" + name + "' is already defined", {name});
  }
  elements_.push_back({std::move(name), std::move(data)});
  if (slots_.size() < elements_.size() * kSlotsPerElement) {
    index_all(elements_.size() * kSlotsPerElement);
  } else {
    slots_[slot_of(elements_.back().name)] = static_cast<std::uint32_t>(elements_.size());
  }
  return *this;
}

bool Circuit::remove(const std::string& name) {
  const Element* e = find(name);
  if (e == nullptr) return false;
  elements_.erase(elements_.begin() + (e - elements_.data()));
  index_all(slots_.size());
  return true;
}

const Element* Circuit::find(const std::string& name) const {
  if (slots_.empty()) return nullptr;
  const std::uint32_t at = slots_[slot_of(name)];
  return at == 0 ? nullptr : &elements_[at - 1];
}

Element* Circuit::find(const std::string& name) {
  return const_cast<Element*>(std::as_const(*this).find(name));
}

}  // namespace stage
