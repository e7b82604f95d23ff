// The descriptors of the model kinds (spec section 4): the language's names
// of each kind, its parameter table, its choices (words, not numbers), the
// parameters a choice refuses, and what is settled once every parameter is
// read. The reader's model statements and validate() read models through them.
#pragma once

#include <optional>
#include <span>
#include <string_view>
#include <utility>
#include <variant>

#include "stage/models.hpp"

namespace stage::kinds {

// A parameter whose value is one word of a list (`form = ebers_moll`).
template <class Model>
struct ModelChoice {
  std::string_view name;
  std::span<const std::string_view> words;
  void (*set)(Model&, std::size_t word) = nullptr;
};

template <class Model>
struct ModelDescriptor {
  using model_type = Model;
  std::span<const std::string_view> keywords;  // `model m = <keyword> {…}`
  std::span<const ModelParameter<Model>> (*parameters)() = nullptr;
  std::span<const ModelChoice<Model>> choices = {};
  // Why the model, as chosen, refuses a parameter that is set; or nothing.
  std::optional<std::string_view> (*refuses)(const Model&, const ModelParameter<Model>&) = nullptr;
  // Settles what follows from others once all are read; may be empty.
  void (*settle)(Model&) = nullptr;
};

template <class Model>
struct ModelKindOf;

template <>
struct ModelKindOf<BipolarModel> {
  static constexpr std::string_view keywords[] = {"npn", "pnp"};
  static constexpr std::string_view forms[] = {"gummel_poon", "ebers_moll"};
  static constexpr ModelChoice<BipolarModel> choices[] = {
      {"form", forms, [](BipolarModel& m, std::size_t word) {
         m.form = word == 1 ? BipolarForm::ebers_moll : BipolarForm::gummel_poon;
       }}};
  static constexpr ModelDescriptor<BipolarModel> descriptor{
      .keywords = keywords,
      .parameters = bipolar_parameters,
      .choices = choices,
      .refuses = [](const BipolarModel& m,
                    const ModelParameter<BipolarModel>& p) -> std::optional<std::string_view> {
        if (m.form == BipolarForm::ebers_moll && p.gummel_poon_only) {
          return "is a Gummel–Poon parameter; form = ebers_moll does not take it";
        }
        return std::nullopt;
      },
      // Left unset (negative), the high-current base resistance is the
      // zero-bias one: no current crowding.
      .settle =
          [](BipolarModel& m) {
            if (m.base_resistance_min < 0) m.base_resistance_min = m.base_resistance;
          }};
};

template <>
struct ModelKindOf<DiodeModel> {
  static constexpr std::string_view keywords[] = {"diode"};
  static constexpr ModelDescriptor<DiodeModel> descriptor{.keywords = keywords,
                                                          .parameters = diode_parameters};
};

// Calls f(descriptor) for every model kind of `Models`, in its order.
template <class F>
void for_each_model_kind(F&& f) {
  [&]<std::size_t... I>(std::index_sequence<I...>) {
    (f(ModelKindOf<std::variant_alternative_t<I, AnyModel>>::descriptor), ...);
  }
  (std::make_index_sequence<std::variant_size_v<AnyModel>>{});
}

}  // namespace stage::kinds
