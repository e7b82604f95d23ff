// The stage report: every figure of the stage in one place.
#include "report/characterize_report.hpp"

#include <cmath>

#include "common/constants.hpp"
#include "report/bias_report.hpp"
#include "report/headroom_report.hpp"
#include "report/ratings_report.hpp"

namespace stage::report {
namespace {

Json optional_number(const std::optional<double>& v) { return v ? Json(*v) : Json(nullptr); }

Json swing_json(const SwingPower& s) {
  Json json{{"input_amplitude", s.input_amplitude},
            {"output_amplitude", s.output_amplitude},
            {"thd", s.thd},
            {"supply_power_W", s.supply_power},
            {"drive_power_W", s.drive_power},
            {"load_power_W", s.load_power},
            {"dissipation_W", s.dissipation},
            {"stored_power_W", s.stored_power},
            {"energy_residual", s.energy_residual},
            {"efficiency", s.efficiency},
            {"settled", s.settled}};
  if (!s.rating_violations.empty()) json["ratings_exceeded"] = ratings_json(s.rating_violations);
  return json;
}

std::string impedance_text(std::complex<double> z) {
  return si(std::abs(z), "Ω") + " ∠ " + fixed(degrees_from_radians(std::arg(z)), "°", 1);
}

}  // namespace

Json to_json(const CharacterizeResult& r) {
  const auto& fig = r.frequency.figures;
  Json headroom = to_json(r.headroom);
  headroom.erase("kind");
  Json j{{"kind", "characterize"},
         {"output", r.output},
         {"frequency_Hz", r.options.frequency},
         {"bias", to_json(r.bias)},
         {"gain", r.gain},
         {"gain_dB", optional_number(fig.gain_at_dB)},
         {"midband_gain_dB", fig.midband_gain_dB},
         {"lower_cutoff_Hz", optional_number(fig.lower_cutoff)},
         {"upper_cutoff_Hz", optional_number(fig.upper_cutoff)},
         {"input_impedance_ohm", std::abs(r.input_impedance)},
         {"input_impedance_real_ohm", r.input_impedance.real()},
         {"input_impedance_imag_ohm", r.input_impedance.imag()},
         {"output_impedance_ohm", std::abs(r.output_impedance)},
         {"output_impedance_real_ohm", r.output_impedance.real()},
         {"output_impedance_imag_ohm", r.output_impedance.imag()},
         {"headroom", std::move(headroom)}};
  if (r.half_swing) j["half_swing"] = swing_json(*r.half_swing);
  if (r.full_swing) j["full_swing"] = swing_json(*r.full_swing);
  if (r.limit_swing) j["limit_swing"] = swing_json(*r.limit_swing);
  return j;
}

void print_table(std::ostream& out, const CharacterizeResult& r) {
  const auto& fig = r.frequency.figures;
  out << "Stage report: " << r.output << " from " << r.options.input << " at "
      << si(r.options.frequency, "Hz") << "\n\n";
  print_table(out, r.bias);
  out << "\n  gain " << si(r.gain, "") << " (" << fixed(fig.gain_at_dB.value_or(0), "dB")
      << "), midband " << fixed(fig.midband_gain_dB, "dB") << "; −3 dB band "
      << (fig.lower_cutoff ? si(*fig.lower_cutoff, "Hz") : "below the sweep") << " to "
      << (fig.upper_cutoff ? si(*fig.upper_cutoff, "Hz") : "above the sweep") << '\n'
      << "  input impedance " << impedance_text(r.input_impedance) << ", output impedance "
      << impedance_text(r.output_impedance) << "\n\n";
  print_table(out, r.headroom);
  if (r.full_swing || r.limit_swing) {
    out << '\n';
    TextTable t({"swing", "output amplitude", "THD", "supply power", "drive power", "load power",
                 "dissipated", "efficiency", "balance"});
    for (const auto& [name, s] : {std::pair{"half", &r.half_swing},
                                  {"full (clip level)", &r.full_swing},
                                  {"within 1 % limit", &r.limit_swing}}) {
      if (!*s) continue;
      const SwingPower& p = **s;
      t.add_row({name, si(p.output_amplitude, "V"), percent(p.thd), si(p.supply_power, "W"),
                 si(p.drive_power, "W"), si(p.load_power, "W"), si(p.dissipation, "W"),
                 percent(p.efficiency), si(p.energy_residual, "")});
    }
    t.print(out);
    out << "  balance: (supply + drive − load − dissipated − stored) / (supply + drive)\n";
    for (const auto& [name, s] : {std::pair{"half", &r.half_swing},
                                  {"full", &r.full_swing},
                                  {"within-limit", &r.limit_swing}}) {
      if (*s && !(*s)->settled) {
        out << "  note: the " << name << " swing is approximate: " << (*s)->unsettled
            << "; a larger settle_periods lets it settle\n";
      }
    }
    for (const auto& [name, s] : {std::pair{"half", &r.half_swing},
                                  {"full", &r.full_swing},
                                  {"within-limit", &r.limit_swing}}) {
      if (*s && !(*s)->rating_violations.empty()) {
        out << "\nAt the " << name << " swing:";
        print_ratings(out, (*s)->rating_violations);
      }
    }
  }
}

void write_csv(std::ostream& out, const CharacterizeResult& r) {
  out << "quantity,value\n"
      << "gain," << csv_number(r.gain) << '\n'
      << "input_impedance_ohm," << csv_number(std::abs(r.input_impedance)) << '\n'
      << "output_impedance_ohm," << csv_number(std::abs(r.output_impedance)) << '\n'
      << "positive_peak_V," << csv_number(r.headroom.positive.peak) << '\n'
      << "negative_peak_V," << csv_number(r.headroom.negative.peak) << '\n'
      << "positive_clip_peak_V," << csv_number(r.headroom.positive.clip.peak) << '\n'
      << "negative_clip_peak_V," << csv_number(r.headroom.negative.clip.peak) << '\n'
      << "symmetric_clip_peak_V," << csv_number(r.headroom.symmetric_clip_peak) << '\n';
  for (const auto& [name, s] :
       {std::pair{"half", r.half_swing}, {"full", r.full_swing}, {"limit", r.limit_swing}}) {
    if (!s) continue;
    const Json swing = swing_json(*s);
    for (const auto& [key, value] : swing.items()) {
      if (!value.is_number()) continue;
      out << name << "_swing." << key << ',' << csv_number(value) << '\n';
    }
  }
}

}  // namespace stage::report
