// The report descriptions of each device kind's operating point (spec
// section 7's "devices" keys, the table's columns).
#include "report/operating_points.hpp"

namespace stage::report {
namespace {

using Q = BipolarOperatingPoint;
constexpr Word<Q> kBipolarWords[] = {
    {"kind", "type",
     [](const Q& q) { return std::string(q.polarity == Polarity::npn ? "npn" : "pnp"); }},
    {"region", "region", [](const Q& q) { return std::string(to_string(q.region)); }}};
constexpr Figure<Q> kBipolarFigures[] = {{"collector_current", "IC", "A", &Q::collector_current},
                                         {"base_current", "IB", "A", &Q::base_current},
                                         {"emitter_current", "", "A", &Q::emitter_current},
                                         {"vbe", "VBE", "V", &Q::vbe},
                                         {"vce", "VCE", "V", &Q::vce},
                                         {"vbc", "", "V", &Q::vbc},
                                         {"gm", "gm", "S", &Q::gm},
                                         {"r_pi", "r_pi", "Ω", &Q::r_pi},
                                         {"r_out", "r_out", "Ω", &Q::r_out},
                                         {"c_pi", "", "F", &Q::c_pi},
                                         {"c_mu", "", "F", &Q::c_mu},
                                         {"c_cs", "", "F", &Q::c_cs},
                                         {"power", "power", "W", &Q::power},
                                         {"rated_dissipation", "", "W", &Q::rated_dissipation}};

using D = DiodeOperatingPoint;
constexpr Word<D> kDiodeWords[] = {{"kind", "", [](const D&) { return std::string("diode"); }}};
constexpr Figure<D> kDiodeFigures[] = {{"current", "current", "A", &D::current},
                                       {"voltage", "voltage", "V", &D::voltage},
                                       {"resistance", "resistance", "Ω", &D::resistance},
                                       {"capacitance", "", "F", &D::capacitance},
                                       {"power", "power", "W", &D::power}};

}  // namespace

const PointReport<BipolarOperatingPoint> kBipolarReport{"transistor", kBipolarWords,
                                                        kBipolarFigures};
const PointReport<DiodeOperatingPoint> kDiodeReport{"diode", kDiodeWords, kDiodeFigures};

}  // namespace stage::report
