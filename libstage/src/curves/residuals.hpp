// How a model value is measured against a reference value, shared by the
// check (errors, pass or fail) and the fit (weighted residuals), so both
// judge a curve the same way.
#pragma once

#include <cstddef>

#include "stage/curves.hpp"

namespace stage::curves {

// True when ratio quantity column k of the curve spans a decade or more, so
// its errors are taken on a log scale.
bool spans_decades(const Curve& curve, std::size_t k);

// The error as PointError::error defines it.
double point_error(double reference, double model, bool by_ratio, bool log_scale);

// The error in units of the tolerance, on the scale it is judged on:
// ln(model/reference) / ln(1 + tolerance) on a log scale, the error over the
// tolerance otherwise. |residual| > 1 is out of tolerance.
double weighted_residual(double reference, double model, double tolerance, bool by_ratio,
                         bool log_scale);

}  // namespace stage::curves
