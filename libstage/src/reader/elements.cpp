// Building each element kind of spec section 3 from its arguments: terminals
// become (hierarchical) node names, values are checked for unit and physical
// range, waveforms and controlling references are read.
#include <cmath>

#include "reader/elaborator.hpp"
#include "reader/suggest.hpp"

namespace stage::elaborate {

namespace x3 = boost::spirit::x3;

namespace {

constexpr Slot kTwoTerminal[] = {{"a", true, true}, {"b", true, true}};

// Terminal slots first, then the kind's own.
template <std::size_t N>
std::vector<Slot> with_terminals(const Slot (&terminals)[2], const Slot (&own)[N]) {
  std::vector<Slot> slots(std::begin(terminals), std::end(terminals));
  slots.insert(slots.end(), std::begin(own), std::end(own));
  return slots;
}

constexpr Slot kPositiveNegative[] = {{"p", true, true}, {"n", true, true}};
constexpr Slot kDiodeTerminals[] = {{"anode", true, true}, {"cathode", true, true}};

}  // namespace

double Elaborator::value(const BoundArguments& args, std::string_view name, Quantity q,
                         const Frame& frame, double fallback, bool allow_infinity) {
  const ast::Expr* e = args.get(name);
  if (!e) return fallback;
  return reader::evaluate_as(*e, q, *frame.scope, frame.file->source, allow_infinity);
}

void Elaborator::element(const ast::Instance& instance, const Frame& frame) {
  const std::string& kind = instance.call.name;
  const reader::SourceText& source = frame.file->source;
  const std::string name = element_name(instance.name, frame);
  const auto bind = [&](const std::vector<Slot>& slots) {
    return BoundArguments(instance.call, slots, kind, source);
  };
  const auto terminal = [&](const BoundArguments& args, std::string_view slot) {
    return node(*args.get(slot), frame);
  };
  const auto positive = [&](const BoundArguments& args, std::string_view slot, Quantity q,
                            const char* hint) {
    const double v = value(args, slot, q, frame);
    if (v <= 0) {
      source.fail(args.offset(slot), kind + " " + std::string(slot) + " must be positive" + hint);
    }
    return v;
  };
  const auto controlled_pair = [&](const BoundArguments& args) {
    const ast::Expr& e = ast::unwrap(*args.get("control"));
    const auto* tuple = boost::get<x3::forward_ast<ast::Tuple>>(&e);
    if (!tuple || tuple->get().items.size() != 2) {
      source.fail(args.offset("control"), "expected control = (node, node)");
    }
    return std::make_pair(node(tuple->get().items[0], frame), node(tuple->get().items[1], frame));
  };
  const auto sense = [&](const BoundArguments& args) {
    const std::string local = require_name(*args.get("sense"), "an element name", source);
    references_.push_back({frame.file, args.offset("sense"), element_name(local, frame),
                           Reference::Kind::sense_source});
    return element_name(local, frame);
  };

  ElementData data;
  if (kind == "resistor") {
    static constexpr Slot own[] = {{"resistance", true, true}};
    const BoundArguments args = bind(with_terminals(kTwoTerminal, own));
    data = Resistor{terminal(args, "a"), terminal(args, "b"),
                    positive(args, "resistance", Quantity::resistance,
                             " (for a short, give both ends the same node name)")};
  } else if (kind == "capacitor" || kind == "inductor") {
    const bool capacitor = kind == "capacitor";
    static constexpr Slot c_own[] = {{"capacitance", true, true}, {"initial"}};
    static constexpr Slot l_own[] = {{"inductance", true, true}, {"initial"}};
    const BoundArguments args =
        bind(capacitor ? with_terminals(kTwoTerminal, c_own) : with_terminals(kTwoTerminal, l_own));
    const std::string a = terminal(args, "a"), b = terminal(args, "b");
    std::optional<double> initial;
    if (args.get("initial")) {
      initial = value(args, "initial", capacitor ? Quantity::voltage : Quantity::current, frame);
    }
    if (capacitor) {
      data = Capacitor{a, b, positive(args, "capacitance", Quantity::capacitance, ""), initial};
    } else {
      data = Inductor{a, b, positive(args, "inductance", Quantity::inductance, ""), initial};
    }
  } else if (kind == "voltage" || kind == "current") {
    const bool voltage = kind == "voltage";
    static constexpr Slot own[] = {{"dc", true}, {"ac"}, {"ac_phase"}, {"wave"}};
    const BoundArguments args =
        bind(voltage ? with_terminals(kPositiveNegative, own) : with_terminals(kTwoTerminal, own));
    const Quantity level = voltage ? Quantity::voltage : Quantity::current;
    std::optional<Waveform> wave;
    if (const ast::Expr* e = args.get("wave")) wave = waveform(*e, level, frame);
    const double dc = args.get("dc") ? value(args, "dc", level, frame)
                      : wave         ? waveform_value(*wave, 0.0)
                                     : 0.0;
    const double ac = value(args, "ac", level, frame);
    const double phase = value(args, "ac_phase", Quantity::angle, frame);
    if (voltage) {
      data = VoltageSource{terminal(args, "p"), terminal(args, "n"), dc, ac, phase, wave};
    } else {
      data = CurrentSource{terminal(args, "a"), terminal(args, "b"), dc, ac, phase, wave};
    }
  } else if (kind == "vcvs" || kind == "vccs") {
    static constexpr Slot own[] = {{"control", false, true}, {"gain", false, true}};
    const bool vcvs = kind == "vcvs";
    const BoundArguments args =
        bind(vcvs ? with_terminals(kPositiveNegative, own) : with_terminals(kTwoTerminal, own));
    const auto [cp, cn] = controlled_pair(args);
    if (vcvs) {
      data = VoltageControlledVoltageSource{terminal(args, "p"), terminal(args, "n"), cp, cn,
                                            value(args, "gain", Quantity::dimensionless, frame)};
    } else {
      data = VoltageControlledCurrentSource{terminal(args, "a"), terminal(args, "b"), cp, cn,
                                            value(args, "gain", Quantity::conductance, frame)};
    }
  } else if (kind == "cccs" || kind == "ccvs") {
    static constexpr Slot own[] = {{"sense", false, true}, {"gain", false, true}};
    const bool cccs = kind == "cccs";
    const BoundArguments args =
        bind(cccs ? with_terminals(kTwoTerminal, own) : with_terminals(kPositiveNegative, own));
    if (cccs) {
      data = CurrentControlledCurrentSource{terminal(args, "a"), terminal(args, "b"), sense(args),
                                            value(args, "gain", Quantity::dimensionless, frame)};
    } else {
      data = CurrentControlledVoltageSource{terminal(args, "p"), terminal(args, "n"), sense(args),
                                            value(args, "gain", Quantity::resistance, frame)};
    }
  } else if (kind == "diode") {
    static constexpr Slot own[] = {{"model", false, true}, {"area"}};
    const BoundArguments args = bind(with_terminals(kDiodeTerminals, own));
    const std::string model = require_name(*args.get("model"), "a model name", source);
    references_.push_back({frame.file, args.offset("model"), model, Reference::Kind::diode_model});
    Diode diode{terminal(args, "anode"), terminal(args, "cathode"), model, 1};
    if (args.get("area")) diode.area = positive(args, "area", Quantity::dimensionless, "");
    data = diode;
  } else if (kind == "npn" || kind == "pnp") {
    static constexpr Slot slots[] = {{"collector", true, true}, {"base", true, true},
                                     {"emitter", true, true},   {"substrate"},
                                     {"model", false, true},    {"area"}};
    const BoundArguments args(instance.call, slots, kind, source);
    const std::string model = require_name(*args.get("model"), "a model name", source);
    references_.push_back(
        {frame.file, args.offset("model"), model,
         kind == "npn" ? Reference::Kind::npn_model : Reference::Kind::pnp_model});
    Bipolar q{kind == "npn" ? Polarity::npn : Polarity::pnp,
              terminal(args, "collector"),
              terminal(args, "base"),
              terminal(args, "emitter"),
              std::nullopt,
              model,
              1};
    if (args.get("substrate")) q.substrate = terminal(args, "substrate");
    if (args.get("area")) q.area = positive(args, "area", Quantity::dimensionless, "");
    data = q;
  } else {
    std::vector<std::string> kinds(kElementKinds.begin(), kElementKinds.end());
    for (const auto& [block, where] : blocks_) kinds.push_back(block);
    source.fail(instance.call.offset,
                "unknown element kind or block '" + kind + "'" + reader::suggestion(kind, kinds));
  }
  if (element_kinds_.count(name)) {
    source.fail(instance.offset, "an element named '" + name + "' already exists");
  }
  element_kinds_[name] = kind;
  deck_.places[name] = source.location(instance.offset);
  deck_.circuit.add(name, std::move(data));
}

Waveform Elaborator::waveform(const ast::Expr& e, Quantity level, const Frame& frame) {
  const reader::SourceText& source = frame.file->source;
  const auto* call = boost::get<x3::forward_ast<ast::Call>>(&ast::unwrap(e));
  if (!call) source.fail(ast::offset_of(e), "expected sine(…), pulse(…) or piecewise(…)");
  const ast::Call& c = call->get();
  const auto non_negative = [&](const BoundArguments& args, std::string_view slot, Quantity q,
                                double fallback) {
    const double v = value(args, slot, q, frame, fallback);
    if (v < 0) source.fail(args.offset(slot), std::string(slot) + " cannot be negative");
    return v;
  };
  if (c.name == "sine") {
    static constexpr Slot slots[] = {{"amplitude", true}, {"frequency", true}, {"offset", true},
                                     {"delay", true},     {"phase", true},     {"damping", true}};
    const BoundArguments args(c, slots, "sine", source);
    SineWave w;
    w.amplitude = value(args, "amplitude", level, frame, w.amplitude);
    w.frequency = non_negative(args, "frequency", Quantity::frequency, w.frequency);
    w.offset = value(args, "offset", level, frame, w.offset);
    w.delay = non_negative(args, "delay", Quantity::time, w.delay);
    w.phase_deg = value(args, "phase", Quantity::angle, frame, w.phase_deg);
    w.damping = value(args, "damping", Quantity::frequency, frame, w.damping);
    return w;
  }
  if (c.name == "pulse") {
    static constexpr Slot slots[] = {{"low", true},   {"high", true}, {"delay", true},
                                     {"rise", true},  {"fall", true}, {"width", true},
                                     {"period", true}};
    const BoundArguments args(c, slots, "pulse", source);
    PulseWave w;
    w.low = value(args, "low", level, frame, w.low);
    w.high = value(args, "high", level, frame, w.high);
    w.delay = non_negative(args, "delay", Quantity::time, w.delay);
    w.rise = non_negative(args, "rise", Quantity::time, w.rise);
    w.fall = non_negative(args, "fall", Quantity::time, w.fall);
    w.width = non_negative(args, "width", Quantity::time, w.width);
    w.period = non_negative(args, "period", Quantity::time, w.period);
    if (w.period < w.rise + w.width + w.fall) {
      source.fail(args.offset("period"), "the pulse period is shorter than rise + width + fall");
    }
    return w;
  }
  if (c.name == "piecewise") {
    PiecewiseWave w;
    for (const ast::Argument& a : c.arguments) {
      if (a.key) {
        if (*a.key != "repeat") {
          source.fail(a.offset, "piecewise has no argument '" + *a.key + "' (only repeat)");
        }
        w.repeat = require_choice(a.value, {"true", "false"}, source) == "true";
        continue;
      }
      const auto* point = boost::get<x3::forward_ast<ast::Tuple>>(&ast::unwrap(a.value));
      if (!point || point->get().items.size() != 2) {
        source.fail(a.offset, "expected a point (time, value)");
      }
      const double t =
          reader::evaluate_as(point->get().items[0], Quantity::time, *frame.scope, source);
      const double v = reader::evaluate_as(point->get().items[1], level, *frame.scope, source);
      if (!w.points.empty() && t <= w.points.back().first) {
        source.fail(a.offset, "piecewise times must increase");
      }
      w.points.emplace_back(t, v);
    }
    if (w.points.empty()) source.fail(c.offset, "piecewise needs at least one (time, value) point");
    return w;
  }
  source.fail(c.offset, "unknown waveform '" + c.name + "'" +
                            reader::suggestion(c.name, {"sine", "pulse", "piecewise"}));
}

}  // namespace stage::elaborate
