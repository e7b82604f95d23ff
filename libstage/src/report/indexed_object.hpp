// The object type of the reports' JSON: keys kept in the order written
// (spec section 7 puts "kind" first) and found through a hash index once an
// object has more than a few keys. nlohmann::ordered_map finds keys by a
// linear scan, so filling an object with n node names took O(n²) time.
#pragma once

#include <algorithm>
#include <cstddef>
#include <functional>
#include <initializer_list>
#include <memory>
#include <stdexcept>
#include <unordered_map>
#include <utility>
#include <vector>

namespace stage::report {

// Shaped as nlohmann::basic_json's ObjectType parameter (a template of key,
// value, comparator and allocator; the last two are not used). The entries
// are a vector in insertion order; the index maps a key to its position and
// exists only from kIndexedFrom entries on, below which a scan is quicker
// and most report objects stay.
template <class Key, class T, class IgnoredLess = std::less<Key>,
          class IgnoredAllocator = std::allocator<std::pair<const Key, T>>>
class IndexedObject {
  using Entries = std::vector<std::pair<const Key, T>>;

 public:
  using key_type = Key;
  using mapped_type = T;
  using value_type = typename Entries::value_type;
  using iterator = typename Entries::iterator;
  using const_iterator = typename Entries::const_iterator;
  using size_type = typename Entries::size_type;
  // Not transparent, so basic_json turns every key into a Key first.
  using key_compare = std::equal_to<Key>;

  static constexpr size_type kIndexedFrom = 16;

  IndexedObject() = default;
  template <class It>
  IndexedObject(It first, It last) {
    insert(first, last);
  }
  IndexedObject(std::initializer_list<value_type> init) : IndexedObject(init.begin(), init.end()) {}

  iterator begin() noexcept { return entries_.begin(); }
  iterator end() noexcept { return entries_.end(); }
  const_iterator begin() const noexcept { return entries_.begin(); }
  const_iterator end() const noexcept { return entries_.end(); }
  const_iterator cbegin() const noexcept { return entries_.cbegin(); }
  const_iterator cend() const noexcept { return entries_.cend(); }
  size_type size() const noexcept { return entries_.size(); }
  size_type max_size() const noexcept { return entries_.max_size(); }
  bool empty() const noexcept { return entries_.empty(); }

  const_iterator find(const Key& key) const {
    if (index_.empty()) {
      return std::find_if(begin(), end(), [&](const value_type& e) { return e.first == key; });
    }
    const auto hit = index_.find(key);
    return hit == index_.end() ? end() : begin() + static_cast<std::ptrdiff_t>(hit->second);
  }
  iterator find(const Key& key) {
    return begin() + (static_cast<const IndexedObject&>(*this).find(key) - cbegin());
  }
  size_type count(const Key& key) const { return find(key) == end() ? 0 : 1; }

  // Adds key → value at the end unless the key is there already (which
  // keeps its place and value), as std::map::emplace does.
  std::pair<iterator, bool> emplace(Key key, T value) {
    if (const auto it = find(key); it != end()) return {it, false};
    entries_.emplace_back(std::move(key), std::move(value));
    index_last();
    return {std::prev(end()), true};
  }
  std::pair<iterator, bool> insert(const value_type& entry) {
    return emplace(entry.first, entry.second);
  }
  template <class It>
  void insert(It first, It last) {
    for (; first != last; ++first) insert(*first);
  }

  T& operator[](const Key& key) { return emplace(key, T{}).first->second; }
  const T& operator[](const Key& key) const { return at(key); }
  T& at(const Key& key) { return const_cast<T&>(std::as_const(*this).at(key)); }
  const T& at(const Key& key) const {
    const auto it = find(key);
    if (it == end()) throw std::out_of_range("key not found");
    return it->second;
  }

  // Erasing shifts every later entry (a const key cannot be moved into
  // place, so the kept entries are rebuilt), as in nlohmann::ordered_map.
  iterator erase(const_iterator first, const_iterator last) {
    const auto offset = first - cbegin();
    Entries kept;
    kept.reserve(size() - static_cast<size_type>(last - first));
    for (auto it = begin(); it != end(); ++it) {
      if (it < first || it >= last) kept.push_back(std::move(*it));
    }
    entries_ = std::move(kept);
    rebuild_index();
    return begin() + offset;
  }
  iterator erase(const_iterator pos) { return erase(pos, std::next(pos)); }
  size_type erase(const Key& key) {
    const auto it = find(key);
    if (it == end()) return 0;
    erase(it);
    return 1;
  }
  void clear() noexcept {
    entries_.clear();
    index_.clear();
  }

  friend bool operator==(const IndexedObject& a, const IndexedObject& b) {
    return a.entries_ == b.entries_;
  }
  friend bool operator<(const IndexedObject& a, const IndexedObject& b) {
    return a.entries_ < b.entries_;
  }

 private:
  void index_last() {
    if (size() == kIndexedFrom) {
      rebuild_index();
    } else if (size() > kIndexedFrom) {
      index_.emplace(entries_.back().first, size() - 1);
    }
  }
  void rebuild_index() {
    index_.clear();
    if (size() < kIndexedFrom) return;
    index_.reserve(size());
    for (size_type i = 0; i < size(); ++i) index_.emplace(entries_[i].first, i);
  }

  Entries entries_;
  std::unordered_map<Key, size_type> index_;
};

}  // namespace stage::report
