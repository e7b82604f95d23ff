// Small builders of Vega-Lite specifications shared by the charts of every
// analysis: the frame of a chart, encodings, and layers with inline rows.
#pragma once

#include <string>

#include "report/format.hpp"

namespace stage::report::spec {

// A plot's size in CSS pixels: two plots without legends side by side on
// the page (its text column is 916 px wide).
inline constexpr int kWidth = 400;
inline constexpr int kHeight = 240;

// A layered chart: title, an optional subtitle (notes on the data, such as
// decimation) and its layers.
Json chart(const std::string& title, const std::string& subtitle, Json layers);

// A quantitative axis on `field`, titled, on a linear or a log scale.
Json axis(const std::string& field, const std::string& title, bool log = false);
// The same with a fixed domain.
Json axis(const std::string& field, const std::string& title, double low, double high);
// A colour by the nominal `field`, with a legend titled `title`.
Json colour(const std::string& field, const std::string& title);

// A layer named `name` drawing `mark` (a mark type or object) of `rows`.
Json layer(const std::string& name, Json mark, Json rows, Json encoding);

// The x-zoom (drag and wheel on the x scale) every continuous chart gets.
Json zoom_on_x();

// A finite number; a chart never carries an infinity or NaN.
bool drawable(double value);

}  // namespace stage::report::spec
