// Physical quantities and their unit symbols, for unit checking in the reader
// and unit labels in reports.
#pragma once

#include <string_view>

namespace stage {

enum class Quantity {
  dimensionless,
  voltage,
  current,
  resistance,
  conductance,
  capacitance,
  inductance,
  time,
  frequency,
  power,
  temperature,
  energy,  // electron-volts in the language, kept in eV
  angle,   // degrees
  ratio,   // a fraction; `%` divides by 100
  decibel,
};

// The SI unit a value of this quantity is kept in, for messages ("Ω", "F").
std::string_view unit_name(Quantity quantity);

}  // namespace stage
