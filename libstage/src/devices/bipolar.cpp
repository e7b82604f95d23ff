// The bipolar transistor device (spec section 4): wires the Gummel–Poon
// equations of gummel_poon.hpp to the nodes, with internal nodes behind
// nonzero base, emitter and collector resistances, Newton limiting of both
// junctions, the excess-phase delay network, and the operating-point
// report. A pnp is the npn with every voltage and current mirrored.
#include <spdlog/fmt/fmt.h>

#include <cmath>

#include "devices/gummel_poon.hpp"
#include "devices/junction.hpp"
#include "devices/local_stamp.hpp"
#include "devices/ratings.hpp"
#include "devices/semiconductors.hpp"
#include "mna/topology.hpp"
#include "mna/topology_check.hpp"

namespace stage::devices {
namespace {

// Local nodes: the four terminals, then the internal collector, base and
// emitter (each the terminal itself when its resistance is zero), then the
// node and the inductor current of the excess-phase network (ground when
// there is no excess phase).
enum : int { kC, kB, kE, kS, kCi, kBi, kEi, kLag, kDelayed, kNodes };
using System = LocalSystem<kNodes>;

// A collector current this many times the forward knee current is far into
// high injection, beyond where a Gummel–Poon model is characterised (our own
// threshold, written into the spec).
constexpr double kFarBeyondKnee = 10;

// Internal junction voltage above which a junction counts as conducting when
// the region is named: the conduction edge of a silicon junction (common
// practice, e.g. Sedra and Smith, "Microelectronic Circuits", ch. 6).
constexpr double kConductionEdge = 0.5;

// The excess-phase network delays the transport current u (npn sense) by
// tau: u enters node kLag, which holds R, C = tau / (3 R) and an inductance
// L = R tau to ground; the inductor current i is the delayed transport
// current, u = L C i'' + (L / R) i' + i, the second-order Bessel low-pass
// 1 / (1 + s tau + (s tau)^2 / 3) of maximally flat delay tau (Thomson,
// "Delay networks having maximally flat frequency characteristics", Proc.
// IEE 1949). At DC the node sits at 0 V and i = u. Any R gives the same
// transfer; 1 ohm keeps the node's volts the size of the current's amperes.
constexpr double kLagResistance = 1;

struct JunctionVoltages {
  double vbe = 0, vbc = 0;
};

JunctionVoltages junction_voltages(double polarity, const std::array<double, kNodes>& x) {
  return {polarity * (x[kBi] - x[kEi]), polarity * (x[kBi] - x[kCi])};
}

// The transport current u, linearised as `transport`, through the
// excess-phase network (see kLagResistance) into the collector-emitter path.
template <class Sink>
void add_delayed_transport(Sink& s, double pol, const std::array<double, kNodes>& x,
                           double transport, const GummelPoonCurrents& i, double delay,
                           bool charges) {
  constexpr Quantity kI = Quantity::current, kQ = Quantity::charge;
  const double delayed = x[kDelayed];  // npn sense, c' -> e'
  s.add_value(kI, kCi, pol * delayed);
  s.add_value(kI, kEi, -pol * delayed);
  s.add_slope(kI, kCi, kDelayed, pol);
  s.add_slope(kI, kEi, kDelayed, -pol);
  // Node kLag: current leaving through R and L, the transport current entering.
  s.add_value(kI, kLag, x[kLag] / kLagResistance + delayed - transport);
  s.add_slope(kI, kLag, kLag, 1 / kLagResistance);
  s.add_slope(kI, kLag, kDelayed, 1);
  for (const auto& [node, slope] :
       {std::pair{kBi, i.dict_dvbe + i.dict_dvbc}, {kEi, -i.dict_dvbe}, {kCi, -i.dict_dvbc}}) {
    s.add_slope(kI, kLag, node, -pol * slope);
  }
  // The inductor's branch equation L i' - v(kLag) = 0.
  s.add_value(kI, kDelayed, -x[kLag]);
  s.add_slope(kI, kDelayed, kLag, -1);
  if (!charges) return;
  s.add_value(kQ, kLag, delay / (3 * kLagResistance) * x[kLag]);
  s.add_slope(kQ, kLag, kLag, delay / (3 * kLagResistance));
  s.add_value(kQ, kDelayed, kLagResistance * delay * delayed);
  s.add_slope(kQ, kDelayed, kDelayed, kLagResistance * delay);
}

// The device's equations with the junction-controlled currents and charges
// evaluated at `at` (limited voltages) and linearised back to the true
// junction voltages, as device.hpp asks, written into `s`. Without
// `charges` only f and G are written (a DC solve reads nothing else).
template <class Sink>
void stamp(Sink& s, const BipolarParameters& p, double pol, const std::array<double, kNodes>& x,
           JunctionVoltages at, bool charges) {
  const JunctionVoltages v = junction_voltages(pol, x);
  const double dbe = v.vbe - at.vbe, dbc = v.vbc - at.vbc;
  const GummelPoonCurrents i = gummel_poon_currents(p, at.vbe, at.vbc);
  const double transport = i.ict + i.dict_dvbe * dbe + i.dict_dvbc * dbc;
  if (p.excess_phase_delay > 0) {
    add_delayed_transport(s, pol, x, transport, i, p.excess_phase_delay, charges);
  } else {
    add_current(s, pol, kCi, kEi, transport, {{kBi, kEi, i.dict_dvbe}, {kBi, kCi, i.dict_dvbc}});
  }
  add_current(s, pol, kBi, kEi, i.ibe + i.dibe_dvbe * dbe, {{kBi, kEi, i.dibe_dvbe}});
  add_current(s, pol, kBi, kCi, i.ibc + i.dibc_dvbc * dbc, {{kBi, kCi, i.dibc_dvbc}});
  if (p.base_resistance > 0) {
    const BaseResistance r = base_resistance(p, i);
    const double vrb = pol * (x[kB] - x[kBi]);
    const double current = vrb / r.r;
    const double di_dvbe = -current / r.r * r.dr_dvbe;
    const double di_dvbc = -current / r.r * r.dr_dvbc;
    add_current(s, pol, kB, kBi, current + di_dvbe * dbe + di_dvbc * dbc,
                {{kB, kBi, 1 / r.r}, {kBi, kEi, di_dvbe}, {kBi, kCi, di_dvbc}});
  }
  if (p.emitter_resistance > 0)
    add_current(s, 1, kE, kEi, (x[kE] - x[kEi]) / p.emitter_resistance,
                {{kE, kEi, 1 / p.emitter_resistance}});
  if (p.collector_resistance > 0)
    add_current(s, 1, kC, kCi, (x[kC] - x[kCi]) / p.collector_resistance,
                {{kC, kCi, 1 / p.collector_resistance}});
  if (!charges) return;

  const double vbx = pol * (x[kB] - x[kCi]);
  const double vsc = pol * (x[kS] - x[kCi]);
  const GummelPoonCharges q = gummel_poon_charges(p, i, at.vbe, at.vbc, vbx, vsc);
  if (p.be_capacitance > 0 || p.forward_transit > 0) {
    add_charge(s, pol, kBi, kEi, q.qbe + q.cbe_vbe * dbe + q.cbe_vbc * dbc,
               {{kBi, kEi, q.cbe_vbe}, {kBi, kCi, q.cbe_vbc}});
  }
  if (p.bc_internal_fraction * p.bc_capacitance > 0 || p.reverse_transit > 0) {
    add_charge(s, pol, kBi, kCi, q.qbc + q.cbc * dbc, {{kBi, kCi, q.cbc}});
  }
  if ((1 - p.bc_internal_fraction) * p.bc_capacitance > 0)
    add_charge(s, pol, kB, kCi, q.qbx, {{kB, kCi, q.cbx}});
  if (p.cs_capacitance > 0) add_charge(s, pol, kS, kCi, q.qcs, {{kS, kCi, q.ccs}});
}

// The whole system, dense, at the true junction voltages: for the pattern and
// the report.
System local_system(const BipolarParameters& p, double pol, const std::array<double, kNodes>& x) {
  System s;
  stamp(s, p, pol, x, junction_voltages(pol, x), true);
  return s;
}

// Each local node's place at the terminals: an internal node is its
// terminal when no resistance separates them (the excess-phase network,
// when absent, sits on the emitter, where it carries nothing).
std::array<int, kNodes> terminal_alias(const BipolarParameters& p) {
  return {kC,
          kB,
          kE,
          kS,
          p.collector_resistance > 0 ? int{kCi} : int{kC},
          p.base_resistance > 0 ? int{kBi} : int{kB},
          p.emitter_resistance > 0 ? int{kEi} : int{kE},
          p.excess_phase_delay > 0 ? int{kLag} : int{kE},
          p.excess_phase_delay > 0 ? int{kDelayed} : int{kE}};
}

// Region by the internal junctions: forward_active when only B-E conducts,
// saturation when both do, reverse_active when only B-C does, else cutoff.
Region region(JunctionVoltages v) {
  const bool be = v.vbe > kConductionEdge, bc = v.vbc > kConductionEdge;
  if (be) return bc ? Region::saturation : Region::forward_active;
  return bc ? Region::reverse_active : Region::cutoff;
}

class BipolarDevice final : public mna::Device {
 public:
  BipolarDevice(const std::string& name, const Bipolar& element, const BipolarModel& model,
                mna::Topology& topology)
      : Device(name),
        model_(model),
        area_(element.area),
        polarity_(element.polarity),
        pol_(element.polarity == Polarity::npn ? 1.0 : -1.0),
        scatter_(nodes(name, element, model, topology)),
        params_(scale_bipolar(model, area_, kRoomTemperature)),
        kelvin_(kRoomTemperature),
        structure_(local_system(params_, pol_, {}).used),
        rated_(has_ratings(model)) {}

  void declare(mna::PatternBuilder& pattern) override { scatter_.declare(pattern, structure_); }

  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override {
    if (request.temperature != kelvin_) {
      params_ = scale_bipolar(model_, area_, request.temperature);
      kelvin_ = request.temperature;
    }
    const auto x = scatter_.gather(request.x);
    JunctionVoltages v = junction_voltages(pol_, x);
    if (request.limit) {
      const JunctionVoltages wanted = v;
      v.vbe =
          limit_junction_voltage(v.vbe, last_.vbe, params_.forward_ideality_vt, params_.vcrit_be);
      v.vbc =
          limit_junction_voltage(v.vbc, last_.vbc, params_.reverse_ideality_vt, params_.vcrit_bc);
      if (v.vbe != wanted.vbe || v.vbc != wanted.vbc) out.limited = true;
    }
    last_ = v;
    if (beyond_exponent_range(v.vbe, params_.forward_ideality_vt) ||
        beyond_exponent_range(v.vbc, params_.reverse_ideality_vt) ||
        (params_.be_leakage > 0 && beyond_exponent_range(v.vbe, params_.be_leakage_ideality_vt)) ||
        (params_.bc_leakage > 0 && beyond_exponent_range(v.vbc, params_.bc_leakage_ideality_vt))) {
      out.beyond_model_range = true;
    }
    const DirectStamp<kNodes> sink(scatter_, out);
    stamp(sink, params_, pol_, x, v, request.charges);
  }

  bool nonlinear() const override { return true; }
  void reset_limiting() override { last_ = {}; }

  void describe_topology(mna::TopologyCheck& check) const override {
    const auto& n = scatter_.nodes();
    for (const auto& [outer, inner] : {std::pair{kC, kCi}, {kB, kBi}, {kE, kEi}}) {
      if (n[outer] != n[inner]) check.conducts(n[outer], n[inner], name());
    }
    check.conducts(n[kBi], n[kEi], name());
    check.conducts(n[kBi], n[kCi], name());
    check.capacitive(n[kS], n[kCi], name());
    if (n[kLag] != mna::kGroundIndex) {
      check.conducts(n[kLag], mna::kGroundIndex, name());
      check.fixes_voltage(n[kLag], mna::kGroundIndex, name());
    }
  }

  void check_model_range(const mna::EvalRequest& at, mna::ModelRangeFindings& out) const override {
    const BipolarParameters p = scale_bipolar(model_, area_, at.temperature);
    const JunctionVoltages v = junction_voltages(pol_, scatter_.gather(at.x));
    const std::size_t invalid_before = out.invalid.size();
    check_exponent_range(name(), "base–emitter", v.vbe, p.forward_ideality_vt, out.invalid);
    check_exponent_range(name(), "base–collector", v.vbc, p.reverse_ideality_vt, out.invalid);
    if (p.be_leakage > 0)
      check_exponent_range(name(), "base–emitter", v.vbe, p.be_leakage_ideality_vt, out.invalid);
    if (p.bc_leakage > 0)
      check_exponent_range(name(), "base–collector", v.vbc, p.bc_leakage_ideality_vt, out.invalid);
    if (out.invalid.size() > invalid_before || p.inverse_knee_forward == 0) return;
    const double collector = gummel_poon_currents(p, v.vbe, v.vbc).ict;
    const double knee = 1 / p.inverse_knee_forward;
    if (collector > kFarBeyondKnee * knee) {
      out.extrapolated.push_back(
          {name(),
           fmt::format(
               "{}: collector current {:.3g} A is {:.0f} times its model's high-injection knee "
               "({:.3g} A), far outside the range such a model describes; the device's own ratings "
               "govern",
               name(), collector, collector / knee, knee)});
    }
  }

  bool rated() const override { return rated_; }
  void check_ratings(const mna::EvalRequest& at, double time, mna::RatingLog& log) const override {
    if (!rated_) return;
    const auto x = scatter_.gather(at.x);
    System s;
    const BipolarParameters p =
        at.temperature == kelvin_ ? params_ : scale_bipolar(model_, area_, at.temperature);
    stamp(s, p, pol_, x, junction_voltages(pol_, x), false);
    // The current into each terminal: its own row and those of the
    // internal nodes that coincide with it.
    std::array<double, 4> current{};
    const std::array<int, kNodes> alias = terminal_alias(p);
    for (int i = 0; i < kNodes; ++i) {
      if (alias[i] <= kS) current[alias[i]] += s.f[i];
    }
    BipolarStress stress;
    stress.vce = pol_ * (x[kC] - x[kE]);
    stress.vcb = pol_ * (x[kC] - x[kB]);
    stress.veb = pol_ * (x[kE] - x[kB]);
    stress.collector_current = pol_ * current[kC];
    for (int t = kC; t <= kS; ++t) stress.power += current[t] * x[t];
    devices::check_ratings(name(), model_, stress, at.temperature, time, log);
  }

  std::optional<mna::Conduction> conduction(const mna::EvalRequest& at) const override {
    BiasResult one;
    report(at, one);
    const BipolarOperatingPoint& op = one.bipolars.front();
    mna::Conduction c;
    c.state = op.region == Region::saturation       ? mna::Conduction::State::saturated
              : op.region == Region::cutoff         ? mna::Conduction::State::cut_off
              : op.region == Region::reverse_active ? mna::Conduction::State::reversed
                                                    : mna::Conduction::State::conducting;
    c.amplifies = true;
    c.current = op.collector_current;
    c.voltage = op.vce;
    c.transconductance = op.gm;
    return c;
  }

  void report(const mna::EvalRequest& at, BiasResult& out) const override {
    const BipolarParameters p = scale_bipolar(model_, area_, at.temperature);
    const auto x = scatter_.gather(at.x);
    const JunctionVoltages v = junction_voltages(pol_, x);
    const System s = local_system(p, pol_, x);
    const TerminalView view = reduce_to_terminals(s, 4, terminal_alias(p));
    const auto& y = view.conductance;
    const GummelPoonCurrents i = gummel_poon_currents(p, v.vbe, v.vbc);
    const GummelPoonCharges q =
        gummel_poon_charges(p, i, v.vbe, v.vbc, pol_ * (x[kB] - x[kCi]), pol_ * (x[kS] - x[kCi]));

    BipolarOperatingPoint op;
    op.name = name();
    op.polarity = polarity_;
    op.region = region(v);
    op.collector_current = view.current[kC];
    op.base_current = view.current[kB];
    op.emitter_current = view.current[kE];
    op.vbe = x[kB] - x[kE];
    op.vce = x[kC] - x[kE];
    op.vbc = x[kB] - x[kC];
    // Common-emitter small-signal figures at the terminals: a change of one
    // terminal voltage with the others held is a change of VBE (base) or of
    // VCE (collector) with the other held.
    op.gm = y[kC][kB];
    op.r_pi = 1 / y[kB][kB];
    // Without an Early voltage a transistor whose base-collector junction
    // does not conduct has no output conductance in the model; what y holds
    // then is the reverse junction's leakage slope, e^(vbc/vt) small, whose
    // inverse (1e169 Ω) is no resistance a designer could use.
    const bool early_free_output =
        p.inverse_early_forward == 0 &&
        (op.region == Region::forward_active || op.region == Region::cutoff);
    op.r_out = early_free_output || y[kC][kC] <= 0 ? kInfinity : 1 / y[kC][kC];
    op.c_pi = q.cbe_vbe;
    op.c_mu = q.cbc + q.cbx;
    op.c_cs = q.ccs;
    for (int t = kC; t <= kS; ++t) op.power += view.current[t] * x[t];
    op.rated_dissipation = derated_dissipation(model_, at.temperature);
    out.bipolars.push_back(op);
  }

 private:
  static std::array<mna::Index, kNodes> nodes(const std::string& name, const Bipolar& element,
                                              const BipolarModel& model, mna::Topology& topology) {
    const mna::Index c = topology.node(element.collector);
    const mna::Index b = topology.node(element.base);
    const mna::Index e = topology.node(element.emitter);
    const mna::Index s = topology.node(element.substrate.value_or(kGround));
    auto inner = [&](double resistance, mna::Index outer, const char* suffix) {
      return resistance > 0 ? topology.internal_node(name, suffix) : outer;
    };
    const bool delayed = model.excess_phase_delay > 0;
    return {c,
            b,
            e,
            s,
            inner(model.collector_resistance, c, "collector"),
            inner(model.base_resistance, b, "base"),
            inner(model.emitter_resistance, e, "emitter"),
            delayed ? topology.internal_node(name, "excess_phase") : mna::kGroundIndex,
            delayed
                ? topology.internal_unknown(name, "excess_phase_current", mna::UnknownKind::current)
                : mna::kGroundIndex};
  }

  BipolarModel model_;
  double area_;
  Polarity polarity_;
  double pol_;  // +1 npn, -1 pnp
  LocalScatter<kNodes> scatter_;
  BipolarParameters params_;
  double kelvin_;
  std::array<std::array<bool, kNodes>, kNodes> structure_;
  bool rated_;             // the model carries a maximum rating
  JunctionVoltages last_;  // junction voltages of the last evaluation, for limiting
};

}  // namespace

std::unique_ptr<mna::Device> make_bipolar(const std::string& name, const Bipolar& element,
                                          const BipolarModel& model, mna::Topology& topology) {
  return std::make_unique<BipolarDevice>(name, element, model, topology);
}

std::unique_ptr<mna::Device> make_device(const std::string& name, const Bipolar& e,
                                         const Circuit& circuit, mna::Topology& t) {
  return make_bipolar(name, e, find_model(circuit.models().of<BipolarModel>(), e.model, name), t);
}

}  // namespace stage::devices
