// Spectrum reports.
#include "report/spectrum_report.hpp"

#include <cmath>

namespace stage::report {
namespace {

// The spectrum of a statement reads the transient before it, whose `stop`
// is what the user lengthens.
std::string unsettled_warning(const SpectrumResult& r) {
  return r.message + "; a later stop in the transient before it lets it settle";
}

}  // namespace

Json to_json(const SpectrumResult& r) {
  Json harmonics = Json::array();
  for (const auto& h : r.harmonics) {
    harmonics.push_back(Json{{"n", h.n}, {"amplitude", h.amplitude}, {"phase_deg", h.phase_deg}});
  }
  Json j{{"kind", "spectrum"},
         {"signal", r.signal},
         {"fundamental_Hz", r.fundamental},
         {"dc", r.dc},
         {"harmonics", std::move(harmonics)},
         {"thd", r.thd}};
  if (r.thd_plus_noise) j["thd_plus_noise"] = *r.thd_plus_noise;
  j["settled"] = r.settled;
  if (!r.settled) j["warning"] = unsettled_warning(r);
  return j;
}

void print_table(std::ostream& out, const SpectrumResult& r) {
  const std::string_view unit = signal_unit(r.signal);
  out << "Spectrum of " << r.signal << ": fundamental " << si(r.fundamental, "Hz") << ", "
      << text::counted(static_cast<std::size_t>(r.periods), "period", "periods") << ", DC "
      << si(r.dc, unit) << "\n";
  out << "THD " << percent(r.thd);
  if (r.thd_plus_noise) out << ", THD+N " << percent(*r.thd_plus_noise);
  out << "\n";
  if (!r.settled) out << "warning: " << unsettled_warning(r) << "\n";
  out << '\n';
  TextTable table({"n", "frequency", "amplitude", "relative", "phase"});
  const double first = r.harmonics.empty() ? 0.0 : r.harmonics.front().amplitude;
  for (const auto& h : r.harmonics) {
    char phase[32];
    std::snprintf(phase, sizeof phase, "%.2f°", h.phase_deg);
    table.add_row({std::to_string(h.n), si(h.n * r.fundamental, "Hz"), si(h.amplitude, unit),
                   first > 0 ? percent(h.amplitude / first) : "-", phase});
  }
  table.print(out);
}

// The harmonics, DC as n = 0 (the constant term of the Fourier series), and
// the THD (and THD+N) of the whole spectrum on every row, as in the JSON.
void write_csv(std::ostream& out, const SpectrumResult& r) {
  const std::string distortion =
      csv_number(r.thd) + (r.thd_plus_noise ? "," + csv_number(*r.thd_plus_noise) : "");
  out << "n,frequency_Hz,amplitude,phase_deg,thd" << (r.thd_plus_noise ? ",thd_plus_noise" : "")
      << '\n';
  out << "0,0," << csv_number(r.dc) << ",0," << distortion << '\n';
  for (const auto& h : r.harmonics) {
    out << h.n << ',' << csv_number(h.n * r.fundamental) << ',' << csv_number(h.amplitude) << ','
        << csv_number(h.phase_deg) << ',' << distortion << '\n';
  }
}

}  // namespace stage::report
