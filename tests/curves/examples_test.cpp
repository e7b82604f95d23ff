// The example reference curves in models/curves/ against the model library
// they were generated from: the regression the `curves check` command runs.
// They were computed by this simulator from these models, so every curve
// must pass, and far inside its tolerance (exact round trip up to the
// 10 significant digits written and the fixture solver's tolerance); a
// change to a model or a device equation shows up here first.
#include <gtest/gtest.h>

#include <filesystem>

#include "stage/curves.hpp"
#include "stage/reader.hpp"

namespace {

TEST(ExampleCurves, EveryCurvePassesAgainstItsModel) {
  const std::filesystem::path models = std::filesystem::path(STAGE_SOURCE_DIR) / "models";
  stage::Circuit library;
  for (const char* file : {"transistors.stage", "diodes.stage"}) {
    const stage::Deck deck = stage::read_file(models / file);
    for (const auto& [name, m] : deck.circuit.bipolar_models()) library.add_model(name, m);
    for (const auto& [name, m] : deck.circuit.diode_models()) library.add_model(name, m);
  }
  int checked = 0;
  for (const auto& entry : std::filesystem::directory_iterator(models / "curves")) {
    if (entry.path().extension() != ".csv") continue;
    const stage::Curve curve = stage::read_curve_file(entry.path());
    const auto result = stage::check_curve(curve, stage::find_device_model(library, curve.model));
    EXPECT_TRUE(result.passed()) << result.summary();
    EXPECT_LT(result.worst_over_tolerance, 1e-3) << curve.name;
    ++checked;
  }
  EXPECT_GE(checked, 14);
}

}  // namespace
