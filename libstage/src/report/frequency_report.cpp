// Frequency-analysis reports, and FrequencyResult's own text reports (which
// are the table and a one-line summary of the same figures).
#include "report/frequency_report.hpp"

#include <algorithm>
#include <cmath>
#include <complex>
#include <cstdio>
#include <sstream>

#include "common/constants.hpp"
#include "report/bias_report.hpp"

namespace stage::report {
namespace {

using Impedances = std::vector<std::complex<double>>;

// JSON has no infinity: an infinite impedance is written as null.
Json number(double value) { return std::isfinite(value) ? Json(value) : Json(nullptr); }

Json optional_number(const std::optional<double>& value) {
  return value ? number(*value) : Json(nullptr);
}

template <class F>
Json each(const Impedances& z, F part) {
  Json array = Json::array();
  for (const auto& v : z) array.push_back(number(part(v)));
  return array;
}

void add_impedance(Json& json, const std::string& key, const Impedances& z) {
  json[key + "_ohm"] = each(z, [](std::complex<double> v) { return std::abs(v); });
  json[key + "_real_ohm"] = each(z, [](std::complex<double> v) { return v.real(); });
  json[key + "_imag_ohm"] = each(z, [](std::complex<double> v) { return v.imag(); });
}

double angle_deg(std::complex<double> z) { return degrees_from_radians(std::arg(z)); }

std::string magnitude_text(std::complex<double> z) { return si(std::abs(z), "Ω"); }
std::string angle_text(std::complex<double> z) {
  return std::isfinite(std::abs(z)) ? fixed(angle_deg(z), "°", 1) : "";
}

std::string optional_text(const std::optional<double>& value, std::string_view unit) {
  if (!value) return "not within the sweep";
  return unit == "Hz" ? si(*value, unit) : fixed(*value, unit);
}

}  // namespace

Json to_json(const FrequencyResult& r) {
  const FrequencyFigures& fig = r.figures;
  Json json{{"kind", "frequency"},
            {"frequency_Hz", r.frequencies},
            {"input", r.options.input},
            {"output", r.output},
            {"load", r.options.load ? Json(*r.options.load) : Json(nullptr)},
            {"gain_dB", r.gain_dB},
            {"phase_deg", r.phase_deg}};
  add_impedance(json, "input_impedance", r.input_impedance);
  if (!r.output_impedance.empty()) add_impedance(json, "output_impedance", r.output_impedance);
  json["peak_gain_dB"] = fig.peak_gain_dB;
  json["peak_frequency_Hz"] = fig.peak_frequency;
  json["midband_gain_dB"] = fig.midband_gain_dB;
  json["midband_frequency_Hz"] = fig.midband_frequency;
  json["lower_cutoff_Hz"] = optional_number(fig.lower_cutoff);
  json["upper_cutoff_Hz"] = optional_number(fig.upper_cutoff);
  json["unity_gain_frequency_Hz"] = optional_number(fig.unity_gain_frequency);
  if (r.options.at) {
    json["at_Hz"] = *r.options.at;
    json["gain_at_dB"] = optional_number(fig.gain_at_dB);
    json["phase_at_deg"] = optional_number(fig.phase_at_deg);
  }
  json["notes"] = r.notes;
  json["bias"] = to_json(r.bias);
  return json;
}

void print_table(std::ostream& out, const FrequencyResult& r) {
  out << "Frequency response of " << r.output << " relative to " << r.options.input << ": "
      << text::counted(r.frequencies.size(), "point", "points") << "\n\n";
  const bool with_output = !r.output_impedance.empty();
  std::vector<std::string> header{"frequency", "gain", "phase", "|Zin|", "∠Zin"};
  if (with_output) header.insert(header.end(), {"|Zout|", "∠Zout"});
  TextTable t(header);
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    std::vector<std::string> row{
        si(r.frequencies[i], "Hz"), fixed(r.gain_dB[i], "dB"), fixed(r.phase_deg[i], "°", 1),
        magnitude_text(r.input_impedance[i]), angle_text(r.input_impedance[i])};
    if (with_output) {
      row.push_back(magnitude_text(r.output_impedance[i]));
      row.push_back(angle_text(r.output_impedance[i]));
    }
    t.add_row(row);
  }
  t.print(out);

  const FrequencyFigures& fig = r.figures;
  out << '\n';
  // One frequency has no band: no midband, corners or unity-gain crossing.
  const bool band = r.frequencies.size() > 1;
  TextTable figures({"figure", "value"});
  figures.add_row({band ? "midband gain" : "gain",
                   fixed(fig.midband_gain_dB, "dB") + " at " + si(fig.midband_frequency, "Hz")});
  if (band) {
    figures.add_row(
        {"peak gain", fixed(fig.peak_gain_dB, "dB") + " at " + si(fig.peak_frequency, "Hz")});
    figures.add_row({"lower -3 dB frequency", optional_text(fig.lower_cutoff, "Hz")});
    figures.add_row({"upper -3 dB frequency", optional_text(fig.upper_cutoff, "Hz")});
    figures.add_row({"unity-gain frequency", optional_text(fig.unity_gain_frequency, "Hz")});
  }
  if (r.options.at) {
    figures.add_row({"gain at " + si(*r.options.at, "Hz"), optional_text(fig.gain_at_dB, "dB")});
    figures.add_row({"phase at " + si(*r.options.at, "Hz"), optional_text(fig.phase_at_deg, "°")});
  }
  figures.print(out);
  for (const auto& note : r.notes) out << "\nNote: " << note;
  if (!r.notes.empty()) out << '\n';
}

void write_csv(std::ostream& out, const FrequencyResult& r) {
  const bool with_output = !r.output_impedance.empty();
  out << "frequency_Hz,gain_dB,phase_deg,input_impedance_real_ohm,input_impedance_imag_ohm";
  if (with_output) out << ",output_impedance_real_ohm,output_impedance_imag_ohm";
  out << '\n';
  for (std::size_t i = 0; i < r.frequencies.size(); ++i) {
    out << csv_number(r.frequencies[i]) << ',' << csv_number(r.gain_dB[i]) << ','
        << csv_number(r.phase_deg[i]) << ',' << csv_number(r.input_impedance[i].real()) << ','
        << csv_number(r.input_impedance[i].imag());
    if (with_output) {
      out << ',' << csv_number(r.output_impedance[i].real()) << ','
          << csv_number(r.output_impedance[i].imag());
    }
    out << '\n';
  }
}

}  // namespace stage::report

namespace stage {

std::string FrequencyResult::brief_report() const {
  std::ostringstream out;
  const std::size_t m = static_cast<std::size_t>(
      std::find(frequencies.begin(), frequencies.end(), figures.midband_frequency) -
      frequencies.begin());
  const bool band = frequencies.size() > 1;
  out << output << " / " << options.input << ": " << (band ? "midband " : "")
      << report::fixed(figures.midband_gain_dB, "dB") << " at "
      << report::si(figures.midband_frequency, "Hz");
  if (band) {
    out << ", -3 dB "
        << (figures.lower_cutoff ? report::si(*figures.lower_cutoff, "Hz") : "below sweep")
        << " to "
        << (figures.upper_cutoff ? report::si(*figures.upper_cutoff, "Hz") : "above sweep");
  }
  out << ", |Zin| " << report::si(std::abs(input_impedance[m]), "Ω");
  if (!output_impedance.empty())
    out << ", |Zout| " << report::si(std::abs(output_impedance[m]), "Ω");
  return out.str();
}

std::string FrequencyResult::full_report() const {
  std::ostringstream out;
  report::print_table(out, *this);
  return out.str();
}

}  // namespace stage
