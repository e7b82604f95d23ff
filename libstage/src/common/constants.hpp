// Conversion constants used in more than one place, each with its source:
// the Celsius offset, turns and degrees to radians, decibels of an
// amplitude ratio, percent. (The Boltzmann constant and the elementary
// charge live with the semiconductor models, devices/physical_constants.hpp.)
#pragma once

#include <cmath>
#include <numbers>

namespace stage {

// 0 °C in kelvin: T / K = t / °C + 273.15, exact by definition (BIPM, "The
// International System of Units", 9th ed., 2.3.1, the degree Celsius).
inline constexpr double kZeroCelsius = 273.15;

// Radians in one turn: ω = 2π f.
inline constexpr double kTwoPi = 2.0 * std::numbers::pi;

// 180° = π rad (the degree's definition, SI brochure table 8).
constexpr double degrees_from_radians(double radians) { return radians * 180.0 / std::numbers::pi; }
constexpr double radians_from_degrees(double degrees) { return degrees * std::numbers::pi / 180.0; }

// An amplitude (voltage or current) ratio in decibels is 20 log10 of it,
// as a power ratio is 10 log10 of it (IEC 60027-3).
inline double db_from_amplitude_ratio(double ratio) { return 20.0 * std::log10(ratio); }
inline double amplitude_ratio_from_db(double db) { return std::pow(10.0, db / 20.0); }

// One percent is 0.01 (ISO 80000-1, the sign %).
inline constexpr double kPercent = 0.01;
constexpr double in_percent(double ratio) { return 100.0 * ratio; }

}  // namespace stage
