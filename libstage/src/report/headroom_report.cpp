// Headroom reports.
#include "report/headroom_report.hpp"

namespace stage::report {
namespace {

Json cause_json(const LimitCause& c) {
  Json j{{"mechanism", std::string(to_string(c.mechanism))}, {"device", c.device}};
  if (!c.detail.empty()) j["detail"] = c.detail;
  return j;
}

Json optional_number(const std::optional<double>& v) { return v ? Json(*v) : Json(nullptr); }

Json side_json(const SideLimit& s) {
  Json j = cause_json(s.cause);
  j["clip_peak_V"] = s.clip.peak;
  j["clip_input_amplitude"] = s.clip.input_amplitude;
  j["clip_cause"] = cause_json(s.clip.cause);
  j["clip_plateau"] = s.clip.plateau;
  j["compression_1dB_peak_V"] = optional_number(s.compression_1dB_peak);
  j["compression_1dB_input_amplitude"] = optional_number(s.compression_1dB_input_amplitude);
  j["input_amplitude"] = s.input_amplitude;
  j["shortfall"] = s.shortfall;
  j["limit_reached"] = s.found;
  if (s.at_largest_drive) {
    j["at_largest_drive"] = cause_json(*s.at_largest_drive);
    j["largest_drive_amplitude"] = s.largest_drive;
  }
  return j;
}

std::string cause_text(const LimitCause& c) {
  const std::string mechanism(to_string(c.mechanism));
  return c.device.empty() ? mechanism : mechanism + " (" + c.device + ")";
}

Json path_json(const std::optional<LoadLinePath>& path) {
  if (!path) return nullptr;
  Json vce = Json::array(), current = Json::array();
  for (const LoadLinePoint& p : path->points) {
    vce.push_back(p.vce);
    current.push_back(p.current);
  }
  return Json{{"input_amplitude", path->input_amplitude},
              {"vce_V", std::move(vce)},
              {"current_A", std::move(current)}};
}

Json runs_json(const std::vector<DrivePoint>& runs) {
  Json j = Json::array();
  for (const DrivePoint& r : runs) {
    j.push_back(Json{{"input_amplitude", r.input_amplitude},
                     {"positive_peak", r.positive_peak},
                     {"negative_peak", r.negative_peak},
                     {"thd", r.thd}});
  }
  return j;
}

}  // namespace

Json to_json(const LoadLineEstimate& e) {
  return Json{{"device", e.device},
              {"quiescent_current_A", e.quiescent_current},
              {"quiescent_vce_V", e.quiescent_vce},
              {"ac_load_ohm", e.ac_load},
              {"saturation_current_A", e.saturation_current},
              {"cutoff_vce_V", e.cutoff_vce},
              {"compliance_peak_to_peak_V", e.compliance_peak_to_peak},
              {"dc_load_ohm", e.dc_load},
              {"clean_path", path_json(e.clean_path)},
              {"clip_path", path_json(e.clip_path)}};
}

Json to_json(const HeadroomResult& r) {
  Json j{{"kind", "headroom"},
         {"output", r.output},
         {"frequency_Hz", r.options.frequency},
         {"distortion_limit", r.options.distortion_limit},
         {"positive_peak_V", r.positive.peak},
         {"negative_peak_V", r.negative.peak},
         {"symmetric_peak_to_peak_V", r.symmetric_peak_to_peak},
         {"positive_clip_peak_V", r.positive.clip.peak},
         {"negative_clip_peak_V", r.negative.clip.peak},
         {"symmetric_clip_peak_V", r.symmetric_clip_peak},
         {"symmetric_clip_input_amplitude", r.symmetric_clip_input_amplitude},
         {"largest_drive_allowed", r.largest_drive_allowed},
         {"positive_limit", side_json(r.positive)},
         {"negative_limit", side_json(r.negative)},
         {"transient_runs", r.transient_runs},
         {"runs", runs_json(r.runs)},
         {"small_signal_gain", r.small_signal_gain},
         {"bias_output_V", r.bias_output}};
  if (r.thd_limit_input_amplitude) {
    j["thd_limit_input_amplitude"] = *r.thd_limit_input_amplitude;
    j["thd_limit_output_amplitude"] = *r.thd_limit_output_amplitude;
  }
  if (r.thd_limit_cause) j["thd_limit_cause"] = cause_json(*r.thd_limit_cause);
  if (r.load_line) j["load_line"] = to_json(*r.load_line);
  if (!r.notes.empty()) j["notes"] = r.notes;
  return j;
}

void print_table(std::ostream& out, const LoadLineEstimate& e) {
  out << "  Load-line estimate (textbook hand analysis) for " << e.device << ":\n"
      << "    quiescent current " << si(e.quiescent_current, "A") << ", VCE "
      << si(e.quiescent_vce, "V") << ", AC load " << si(e.ac_load, "Ω") << '\n'
      << "    AC saturation current " << si(e.saturation_current, "A") << ", AC cutoff VCE "
      << si(e.cutoff_vce, "V") << '\n'
      << "    compliance 2·min(VCEQ, ICQ·R'ac) = " << si(e.compliance_peak_to_peak, "V")
      << " peak-to-peak\n";
}

void print_table(std::ostream& out, const HeadroomResult& r) {
  out << "Headroom of " << r.output << " at " << si(r.options.frequency, "Hz") << ", limit "
      << percent(r.options.distortion_limit) << " (" << r.transient_runs << " transient runs)\n"
      << "  small-signal gain " << si(r.small_signal_gain, "") << ", output at the bias point "
      << si(r.bias_output, "V") << "\n\n";
  TextTable clip({"side", "clip level", "input amplitude", "clipped by", "1 dB compression",
                  "input amplitude"});
  auto clip_row = [&](const char* name, const SideLimit& s) {
    clip.add_row(
        {name, si(s.clip.peak, "V"), si(s.clip.input_amplitude, "V"), cause_text(s.clip.cause),
         s.compression_1dB_peak ? si(*s.compression_1dB_peak, "V") : "not reached",
         s.compression_1dB_input_amplitude ? si(*s.compression_1dB_input_amplitude, "V") : ""});
  };
  clip_row("positive", r.positive);
  clip_row("negative", r.negative);
  clip.print(out);
  out << "  symmetric clip level " << si(r.symmetric_clip_peak, "V") << " peak at "
      << si(r.symmetric_clip_input_amplitude, "V") << " input amplitude (drive allowed up to "
      << si(r.largest_drive_allowed, "V") << ")\n\n"
      << "  within the " << percent(r.options.distortion_limit) << " limit:\n";
  TextTable t({"side", "peak", "input amplitude", "limited by", "at the largest drive"});
  auto row = [&](const char* name, const SideLimit& s) {
    t.add_row({name, si(s.peak, "V"), si(s.input_amplitude, "V"),
               s.found ? cause_text(s.cause) : "not reached",
               s.at_largest_drive
                   ? cause_text(*s.at_largest_drive) + " at " + si(s.largest_drive, "V")
                   : ""});
  };
  row("positive", r.positive);
  row("negative", r.negative);
  t.print(out);
  for (const SideLimit* s : {&r.positive, &r.negative}) {
    if (!s->cause.detail.empty()) {
      out << "  " << (s == &r.positive ? "positive" : "negative") << " peak: " << s->cause.detail
          << '\n';
    }
  }
  out << "  largest symmetric swing " << si(r.symmetric_peak_to_peak, "V") << " peak-to-peak";
  if (r.thd_limit_output_amplitude) {
    out << "; THD reaches the limit at " << si(*r.thd_limit_output_amplitude, "V")
        << " output amplitude";
  }
  if (r.thd_limit_cause) out << "; THD past the limit: " << cause_text(*r.thd_limit_cause);
  out << '\n';
  if (r.load_line) {
    out << '\n';
    print_table(out, *r.load_line);
    out << "    simulated: " << si(r.positive.clip.peak + r.negative.clip.peak, "V")
        << " peak-to-peak between the two clip levels, "
        << si(r.positive.peak + r.negative.peak, "V") << " between the two side limits\n";
  }
  for (const auto& note : r.notes) out << "  note: " << note << '\n';
}

void write_csv(std::ostream& out, const HeadroomResult& r) {
  out << "quantity,value\n"
      << "positive_peak_V," << csv_number(r.positive.peak) << '\n'
      << "negative_peak_V," << csv_number(r.negative.peak) << '\n'
      << "positive_input_amplitude," << csv_number(r.positive.input_amplitude) << '\n'
      << "negative_input_amplitude," << csv_number(r.negative.input_amplitude) << '\n'
      << "symmetric_peak_to_peak_V," << csv_number(r.symmetric_peak_to_peak) << '\n'
      << "positive_clip_peak_V," << csv_number(r.positive.clip.peak) << '\n'
      << "negative_clip_peak_V," << csv_number(r.negative.clip.peak) << '\n'
      << "positive_clip_input_amplitude," << csv_number(r.positive.clip.input_amplitude) << '\n'
      << "negative_clip_input_amplitude," << csv_number(r.negative.clip.input_amplitude) << '\n'
      << "symmetric_clip_peak_V," << csv_number(r.symmetric_clip_peak) << '\n'
      << "largest_drive_allowed," << csv_number(r.largest_drive_allowed) << '\n'
      << "small_signal_gain," << csv_number(r.small_signal_gain) << '\n'
      << "transient_runs," << r.transient_runs << '\n';
  for (const auto& [name, s] : {std::pair{"positive", &r.positive}, {"negative", &r.negative}}) {
    if (s->compression_1dB_peak) {
      out << name << "_compression_1dB_peak_V," << csv_number(*s->compression_1dB_peak) << '\n'
          << name << "_compression_1dB_input_amplitude,"
          << csv_number(*s->compression_1dB_input_amplitude) << '\n';
    }
  }
  if (r.load_line) {
    const Json line = to_json(*r.load_line);
    for (const auto& [key, value] : line.items()) {
      if (value.is_number()) out << "load_line." << key << ',' << csv_number(value) << '\n';
    }
  }
}

}  // namespace stage::report
