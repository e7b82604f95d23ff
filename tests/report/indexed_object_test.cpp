// The reports' JSON object type against nlohmann::ordered_json, the
// reference: the same operations give the same document, key order
// included, below and above the size from which keys are hashed.
#include <gtest/gtest.h>

#include <string>

#include "report/format.hpp"

namespace {

using stage::report::Json;
using Reference = nlohmann::ordered_json;

constexpr std::size_t kIndexedFrom = Json::object_t::kIndexedFrom;

// Keys that do not come in sorted order, so an order kept by sorting shows.
std::string key(std::size_t k) { return "n" + std::to_string((k * 7919) % 1000); }

// Fills both objects with `count` keys through operator[] and overwrites
// every third one, which keeps its place.
void fill(Json& json, Reference& reference, std::size_t count) {
  for (std::size_t k = 0; k < count; ++k) {
    json[key(k)] = k;
    reference[key(k)] = k;
  }
  for (std::size_t k = 0; k < count; k += 3) {
    json[key(k)] = -static_cast<int>(k);
    reference[key(k)] = -static_cast<int>(k);
  }
}

TEST(IndexedObject, WritesAndFindsAsOrderedJsonAtEverySize) {
  for (const std::size_t count :
       {std::size_t{3}, kIndexedFrom - 1, kIndexedFrom, std::size_t{500}}) {
    Json json = Json::object();
    Reference reference = Reference::object();
    fill(json, reference, count);
    EXPECT_EQ(json.dump(), reference.dump()) << count << " keys";
    for (std::size_t k = 0; k < count; ++k) {
      ASSERT_TRUE(json.contains(key(k)));
      EXPECT_EQ(json.at(key(k)), reference.at(key(k)));
    }
    EXPECT_FALSE(json.contains("absent"));
    EXPECT_THROW(json.at("absent"), Json::out_of_range);
  }
}

TEST(IndexedObject, ErasingKeepsTheOthersFoundInOrder) {
  Json json = Json::object();
  Reference reference = Reference::object();
  fill(json, reference, 40);
  // Erase from the middle, by key and by iterator in turn, until the object
  // drops below the hashed size.
  for (std::size_t k = 10; json.size() >= kIndexedFrom - 2; ++k) {
    if (k % 2 == 0) {
      EXPECT_EQ(json.erase(key(k)), reference.erase(key(k)));
    } else {
      json.erase(json.find(key(k)));
      reference.erase(reference.find(key(k)));
    }
    EXPECT_EQ(json.dump(), reference.dump()) << "after erasing " << key(k);
    for (const auto& [name, value] : reference.items()) EXPECT_EQ(json.at(name), value);
  }
  json["added"] = 1;
  reference["added"] = 1;
  EXPECT_EQ(json.dump(), reference.dump());
}

TEST(IndexedObject, CopiesParsesAndComparesAsOrderedJson) {
  Json json = Json::object();
  Reference reference = Reference::object();
  fill(json, reference, 100);
  const Json copy = json;
  EXPECT_EQ(copy, json);
  EXPECT_EQ(copy.dump(), reference.dump());
  // A parsed duplicate key: the last value in the first place, as in the reference.
  const std::string text = R"({"b": 1, "a": 2, "b": 3})";
  EXPECT_EQ(Json::parse(text).dump(), Reference::parse(text).dump());
  EXPECT_EQ(Json::parse(reference.dump()), json);
}

}  // namespace
