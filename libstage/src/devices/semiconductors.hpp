// Constructors of the semiconductor devices (diode, bipolar transistor), kept
// apart from the linear elements so the factory needs only this header.
#pragma once

#include <memory>
#include <string>

#include "mna/device.hpp"

namespace stage::mna {
class Topology;
}

namespace stage::devices {

std::unique_ptr<mna::Device> make_diode(const std::string& name, const Diode& element,
                                        const DiodeModel& model, mna::Topology& topology);

std::unique_ptr<mna::Device> make_bipolar(const std::string& name, const Bipolar& element,
                                          const BipolarModel& model, mna::Topology& topology);

}  // namespace stage::devices
