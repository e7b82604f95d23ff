// Physical constants shared by the semiconductor models. Since the 2019
// revision of the SI the Boltzmann constant and the elementary charge are
// exact by definition (CODATA 2018 lists them without uncertainty).
#pragma once

namespace stage::devices {

inline constexpr double kBoltzmann = 1.380649e-23;            // J/K, exact
inline constexpr double kElementaryCharge = 1.602176634e-19;  // C, exact

// kT/q in volts: the voltage scale of every junction exponential.
constexpr double thermal_voltage(double kelvin) { return kBoltzmann * kelvin / kElementaryCharge; }

}  // namespace stage::devices
