// The object type of the reports' JSON: keys kept in the order written
// (spec section 7 puts "kind" first) and found through a hash table once an
// object has more than a few keys. nlohmann::ordered_map finds keys by a
// linear scan, so filling an object with n node names took O(n²) time.
#pragma once

#include <algorithm>
#include <bit>
#include <compare>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <memory>
#include <stdexcept>
#include <utility>
#include <vector>

namespace stage::report {

// Shaped as nlohmann::basic_json's ObjectType parameter (a template of key,
// value, comparator and allocator; the last two are not used). The entries
// are a vector in insertion order. From kIndexedFrom entries on (below it a
// scan is quicker, and most report objects stay there) an open-addressing
// table of positions finds a key: one probe into a flat array, where a
// node-based hash map costs an allocation per key and scattered reads.
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

  iterator begin() noexcept { return entries_.begin(); }
  iterator end() noexcept { return entries_.end(); }
  const_iterator begin() const noexcept { return entries_.begin(); }
  const_iterator end() const noexcept { return entries_.end(); }
  const_iterator cbegin() const noexcept { return entries_.cbegin(); }
  const_iterator cend() const noexcept { return entries_.cend(); }
  size_type size() const noexcept { return entries_.size(); }
  size_type max_size() const noexcept { return entries_.max_size(); }
  bool empty() const noexcept { return entries_.empty(); }

  const_iterator find(const Key& key) const { return begin() + position(key); }
  iterator find(const Key& key) { return begin() + position(key); }
  size_type count(const Key& key) const { return find(key) == end() ? 0 : 1; }

  // Adds key → value at the end unless the key is there already (which
  // keeps its place and value), as std::map::emplace does.
  std::pair<iterator, bool> emplace(Key key, T value) {
    if (const auto it = find(key); it != end()) return {it, false};
    if (size() + 1 >= kEmpty) throw std::length_error("a JSON object of 2^32 keys");
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
    slots_.clear();
  }

  friend bool operator==(const IndexedObject& a, const IndexedObject& b) {
    return a.entries_ == b.entries_;
  }
  friend auto operator<=>(const IndexedObject& a, const IndexedObject& b) {
    return a.entries_ <=> b.entries_;
  }

 private:
  // A slot of the table: the key's hash and its entry's position, or kEmpty;
  // 32 bits each, so that the table of 100k keys stays in the cache.
  struct Slot {
    std::uint32_t hash = 0;
    std::uint32_t position = kEmpty;
  };
  static constexpr std::uint32_t kEmpty = static_cast<std::uint32_t>(-1);

  // The position of `key` among the entries, or size() if it is not there.
  std::ptrdiff_t position(const Key& key) const {
    if (slots_.empty()) {
      return std::find_if(begin(), end(), [&](const value_type& e) { return e.first == key; }) -
             begin();
    }
    const auto hash = static_cast<std::uint32_t>(std::hash<Key>{}(key));
    for (std::size_t s = hash;; ++s) {
      const Slot& slot = slots_[s & (slots_.size() - 1)];
      if (slot.position == kEmpty) return static_cast<std::ptrdiff_t>(size());
      if (slot.hash == hash && entries_[slot.position].first == key) {
        return static_cast<std::ptrdiff_t>(slot.position);
      }
    }
  }

  // Keeps the table at most half full, so that probes stay short.
  void index_last() {
    if (size() < kIndexedFrom) return;
    if (2 * size() > slots_.size()) {
      rebuild_index();
    } else {
      place(size() - 1);
    }
  }
  void rebuild_index() {
    slots_.clear();
    if (size() < kIndexedFrom) return;
    slots_.resize(std::bit_ceil(2 * size()));
    for (size_type i = 0; i < size(); ++i) place(i);
  }
  void place(size_type entry) {
    const auto hash = static_cast<std::uint32_t>(std::hash<Key>{}(entries_[entry].first));
    std::size_t s = hash;
    while (slots_[s & (slots_.size() - 1)].position != kEmpty) ++s;
    slots_[s & (slots_.size() - 1)] = {hash, static_cast<std::uint32_t>(entry)};
  }

  Entries entries_;
  std::vector<Slot> slots_;  // a power of two long; empty below kIndexedFrom entries
};

}  // namespace stage::report
