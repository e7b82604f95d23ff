// A bipolar transistor's state against its model's maximum ratings (spec
// section 4, "Ratings"): the voltage, current and dissipation limits, the
// dissipation derated with the case temperature, and the safe-operating-area
// boundary.
#pragma once

#include <string>

#include "mna/rating_log.hpp"
#include "stage/models.hpp"

namespace stage::devices {

// Terminal quantities in the transistor's own sense (an npn's VCE, VCB, VEB
// and collector current; a pnp's negated), and the power it dissipates.
struct BipolarStress {
  double vce = 0, vcb = 0, veb = 0, collector_current = 0, power = 0;
};

bool has_ratings(const BipolarModel& model);

// The dissipation allowed at a case temperature: max_dissipation up to the
// rated case temperature, then falling linearly to zero at the maximum
// junction temperature (the linear derating of handbooks, slope
// 1 / R_th(junction-case) with R_th = (Tj,max - Tc,rated) / P_max).
double derated_dissipation(const BipolarModel& model, double case_kelvin);

// The collector current the safe operating area allows at vce > 0: the
// smallest of the current rating, the derated dissipation over vce, and,
// beyond second_breakdown_voltage, the second-breakdown segment.
double safe_area_current(const BipolarModel& model, double vce, double case_kelvin);

// Records every rating `stress` exceeds into `log`.
void check_ratings(const std::string& device, const BipolarModel& model,
                   const BipolarStress& stress, double case_kelvin, double time,
                   mna::RatingLog& log);

}  // namespace stage::devices
