// `analyze` statements (spec section 6 and the extensions in the project's
// spec copy) into AnalysisStatements. They are read after every element, so
// the sources, loads and nodes they name are checked against the circuit.
#include <cmath>
#include <functional>
#include <map>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "reader/elaborator.hpp"
#include "reader/suggest.hpp"

namespace stage::elaborate {

namespace x3 = boost::spirit::x3;

namespace {
// A sweep longer than this is surely a mistaken step.
constexpr double kMaxSweepPoints = 1e6;
}  // namespace

std::string Elaborator::existing_element(const ast::Expr& e, const File& file,
                                         bool source_only) const {
  const std::string name = require_name(e, "an element name", file.source);
  const std::optional<std::string_view> kind = kind_of(name);
  if (!kind) {
    file.source.fail(ast::offset_of(e),
                     "no element named '" + name + "'" + reader::suggestion(name, element_names()));
  }
  if (source_only && *kind != "voltage" && *kind != "current") {
    file.source.fail(ast::offset_of(e), "'" + name + "' is a " + std::string(*kind) +
                                            "; expected a voltage or current source");
  }
  return name;
}

SignalRef Elaborator::signal(const ast::Expr& e, const File& file) const {
  const ast::Expr& inner = ast::unwrap(e);
  const auto known_node = [&](const ast::Expr& n) {
    const std::string name = require_name(n, "a node name", file.source);
    if (name != kGround && !has_node(name)) {
      file.source.fail(ast::offset_of(n),
                       "no node named '" + name + "'" + reader::suggestion(name, node_names()));
    }
    return name;
  };
  if (const auto* tuple = boost::get<x3::forward_ast<ast::Tuple>>(&inner)) {
    if (tuple->get().items.size() != 2) {
      file.source.fail(ast::offset_of(e), "expected a node, (node, node) or element.current");
    }
    return SignalRef::pair(known_node(tuple->get().items[0]), known_node(tuple->get().items[1]));
  }
  const std::string name = require_name(e, "a node, (node, node) or element.current", file.source);
  const std::string suffix = ".current";
  if (name.size() > suffix.size() && name.ends_with(suffix)) {
    const std::string element = name.substr(0, name.size() - suffix.size());
    if (!kind_of(element)) {
      file.source.fail(ast::offset_of(e), "no element named '" + element + "'" +
                                              reader::suggestion(element, element_names()));
    }
    return SignalRef::current(element);
  }
  return SignalRef::node(known_node(e));
}

namespace {

// What reading one `analyze` statement needs: the call, its text, the
// scope its values are evaluated in, the elements by kind, and the
// elaborator's look-ups of values, elements and signals.
struct AnalysisReading {
  const ast::Call& call;
  const reader::SourceText& source;
  const reader::Scope& globals;
  const Circuit& circuit;
  std::function<double(const BoundArguments&, std::string_view, Quantity, double)> value;
  std::function<std::string(const ast::Expr&, bool source_only)> element;
  std::function<SignalRef(const ast::Expr&)> signal;

  BoundArguments bind(std::span<const Slot> slots) const {
    return BoundArguments(call, slots, "analyze " + call.name, source);
  }
  double positive(const BoundArguments& args, std::string_view slot, Quantity q,
                  double fallback) const {
    const double v = value(args, slot, q, fallback);
    if (v <= 0) source.fail(args.offset(slot), std::string(slot) + " must be positive");
    return v;
  }
  int whole(const BoundArguments& args, std::string_view slot, int fallback) const {
    const double v = value(args, slot, Quantity::dimensionless, fallback);
    if (v < 1 || v > kMaxSweepPoints || v != std::floor(v)) {
      source.fail(args.offset(slot),
                  std::string(slot) + " must be a whole number from 1 to 1000000");
    }
    return static_cast<int>(v);
  }
  std::optional<std::string> optional_element(const BoundArguments& args,
                                              std::string_view slot) const {
    const ast::Expr* e = args.get(slot);
    return e ? std::optional<std::string>(element(*e, false)) : std::nullopt;
  }
  std::string input(const BoundArguments& args) const { return element(*args.get("input"), true); }
};

// What a sweep changes: the temperature, a source's value or a `let`
// parameter; the quantity its values are read as, unless a parameter
// without a unit leaves them unchecked.
struct SweepTarget {
  Quantity quantity = Quantity::dimensionless;
  bool checked = true;
};

SweepTarget sweep_target(const AnalysisReading& r, const BoundArguments& args,
                         SweepOptions& sweep) {
  const int targets =
      (args.get("target") ? 1 : 0) + (args.get("source") ? 1 : 0) + (args.get("parameter") ? 1 : 0);
  if (targets != 1) {
    r.source.fail(r.call.offset, "a sweep needs one of: temperature, source = …, parameter = …");
  }
  if (const ast::Expr* t = args.get("target")) {
    require_choice(*t, {"temperature"}, r.source);
    sweep.target = SweepOptions::Target::temperature;
    return {Quantity::temperature, true};
  }
  if (const ast::Expr* s = args.get("source")) {
    sweep.target = SweepOptions::Target::source;
    sweep.name = r.element(*s, true);
    const bool voltage = std::holds_alternative<VoltageSource>(r.circuit.find(sweep.name)->data);
    return {voltage ? Quantity::voltage : Quantity::current, true};
  }
  const ast::Expr* p = args.get("parameter");
  sweep.target = SweepOptions::Target::parameter;
  sweep.name = require_name(*p, "a let parameter name", r.source);
  const reader::Value* let = r.globals.find(sweep.name);
  if (!let) {
    r.source.fail(ast::offset_of(*p), "no let parameter named '" + sweep.name + "'" +
                                          reader::suggestion(sweep.name, r.globals.names()));
  }
  if (!let->quantity) return {Quantity::dimensionless, false};
  return {*let->quantity, true};
}

// from, to and step: every step from `from` towards `to`; steps that land
// within rounding of `to` count as reaching it, and `to` itself is always
// the last value.
std::vector<double> stepped_values(const AnalysisReading& r, const BoundArguments& args,
                                   const auto& read) {
  for (const char* key : {"from", "to", "step"}) {
    if (!args.get(key)) {
      r.source.fail(r.call.offset,
                    "analyze " + r.call.name + " needs " + key + " (or values = (…))");
    }
  }
  const double from = read(*args.get("from"), reader::EvaluationRules{});
  const double to = read(*args.get("to"), reader::EvaluationRules{});
  // A step in °C is a temperature difference, the same as in K.
  const double step = std::fabs(read(*args.get("step"), {.temperature_difference = true}));
  const double count = std::fabs(to - from) / step;
  if (step == 0 || !(count < kMaxSweepPoints)) {
    r.source.fail(args.offset("step"), "this step gives too many sweep points");
  }
  const double direction = to >= from ? 1 : -1;
  const auto n = static_cast<long>(std::floor(count + 1e-9));
  std::vector<double> values;
  for (long i = 0; i <= n; ++i) values.push_back(from + direction * step * i);
  if (std::fabs(values.back() - to) <= 1e-9 * std::max(std::fabs(to), step)) {
    values.back() = to;
  } else {
    values.push_back(to);
  }
  return values;
}

SweepOptions sweep_options(const AnalysisReading& r) {
  static constexpr Slot slots[] = {{"target", true}, {"source"}, {"parameter"}, {"from"},
                                   {"to"},           {"step"},   {"values"}};
  const BoundArguments args = r.bind(slots);
  SweepOptions sweep;
  const SweepTarget target = sweep_target(r, args, sweep);
  if (target.checked) sweep.quantity = target.quantity;
  const auto read = [&](const ast::Expr& e, reader::EvaluationRules rules) {
    if (target.checked) {
      return reader::evaluate_as(e, target.quantity, r.globals, r.source, false, rules);
    }
    return reader::evaluate(e, r.globals, r.source, rules).number;
  };
  const ast::Expr* values = args.get("values");
  if (!values) {
    sweep.values = stepped_values(r, args, read);
    return sweep;
  }
  if (args.get("from") || args.get("to") || args.get("step")) {
    r.source.fail(args.offset("values"), "give either values = (…) or from, to and step");
  }
  const ast::Expr& inner = ast::unwrap(*values);
  if (const auto* list = boost::get<x3::forward_ast<ast::Tuple>>(&inner)) {
    for (const ast::Expr& item : list->get().items) sweep.values.push_back(read(item, {}));
  } else {
    sweep.values.push_back(read(*values, {}));
  }
  return sweep;
}

FrequencyOptions frequency_options(const AnalysisReading& r) {
  static constexpr Slot slots[] = {
      {"from"}, {"to"}, {"per_decade"}, {"input", false, true}, {"output", false, true},
      {"load"}, {"at"}};
  const BoundArguments args = r.bind(slots);
  FrequencyOptions f;
  f.from = r.positive(args, "from", Quantity::frequency, f.from);
  f.to = r.positive(args, "to", Quantity::frequency, f.to);
  // to = from asks for the one frequency.
  if (f.to < f.from) r.source.fail(args.offset("to"), "to must not be below from");
  f.per_decade = r.whole(args, "per_decade", f.per_decade);
  f.input = r.input(args);
  f.output = r.signal(*args.get("output"));
  f.load = r.optional_element(args, "load");
  if (args.get("at")) f.at = r.positive(args, "at", Quantity::frequency, 0);
  return f;
}

TransientOptions transient_options(const AnalysisReading& r) {
  static constexpr Slot slots[] = {{"stop", false, true}, {"max_step"},    {"from"}, {"start"},
                                   {"signals"},           {"uniform_step"}};
  const BoundArguments args = r.bind(slots);
  TransientOptions t;
  t.stop = r.positive(args, "stop", Quantity::time, 0);
  t.max_step = r.value(args, "max_step", Quantity::time, 0);
  if (t.max_step < 0) r.source.fail(args.offset("max_step"), "max_step cannot be negative");
  t.from = r.value(args, "from", Quantity::time, 0);
  if (t.from < 0 || t.from >= t.stop) {
    r.source.fail(args.offset("from"), "from must be at least 0 and before stop");
  }
  if (const ast::Expr* s = args.get("start")) {
    t.start = require_choice(*s, {"bias", "zero"}, r.source) == "zero" ? TransientStart::zero
                                                                       : TransientStart::bias;
  }
  if (const ast::Expr* s = args.get("signals")) {
    // A bracketed list is always a list of signals, so a lone node pair is
    // written ((a, b)).
    const auto* list = boost::get<x3::forward_ast<ast::Tuple>>(&ast::unwrap(*s, true));
    if (list) {
      for (const ast::Expr& item : list->get().items) t.signals.push_back(r.signal(item));
    } else {
      t.signals.push_back(r.signal(*s));
    }
  }
  if (args.get("uniform_step"))
    t.resample_step = r.positive(args, "uniform_step", Quantity::time, 0);
  return t;
}

SpectrumOptions spectrum_options(const AnalysisReading& r) {
  static constexpr Slot slots[] = {
      {"signal", false, true}, {"fundamental"}, {"harmonics"}, {"include_noise"}};
  const BoundArguments args = r.bind(slots);
  SpectrumOptions s;
  s.signal = r.signal(*args.get("signal"));
  s.fundamental = r.positive(args, "fundamental", Quantity::frequency, s.fundamental);
  s.harmonics = r.whole(args, "harmonics", s.harmonics);
  if (const ast::Expr* e = args.get("include_noise")) {
    s.with_noise = require_choice(*e, {"true", "false"}, r.source) == "true";
  }
  return s;
}

HeadroomOptions headroom_options(const AnalysisReading& r) {
  static constexpr Slot slots[] = {{"input", false, true},
                                   {"output", false, true},
                                   {"frequency"},
                                   {"distortion_limit"},
                                   {"load"},
                                   {"settle_periods"}};
  const BoundArguments args = r.bind(slots);
  HeadroomOptions h;
  h.input = r.input(args);
  h.output = r.signal(*args.get("output"));
  h.frequency = r.positive(args, "frequency", Quantity::frequency, h.frequency);
  h.distortion_limit = r.positive(args, "distortion_limit", Quantity::ratio, h.distortion_limit);
  h.load = r.optional_element(args, "load");
  h.settle_periods = r.whole(args, "settle_periods", h.settle_periods);
  return h;
}

CharacterizeOptions characterize_options(const AnalysisReading& r) {
  static constexpr Slot slots[] = {
      {"input", false, true}, {"output", false, true}, {"frequency"}, {"load"}, {"settle_periods"}};
  const BoundArguments args = r.bind(slots);
  CharacterizeOptions c;
  c.input = r.input(args);
  c.output = r.signal(*args.get("output"));
  c.frequency = r.positive(args, "frequency", Quantity::frequency, c.frequency);
  c.load = r.optional_element(args, "load");
  c.settle_periods = r.whole(args, "settle_periods", c.settle_periods);
  return c;
}

AnalysisOptions analysis_options(const AnalysisReading& r) {
  const std::string& name = r.call.name;
  if (name == "bias") {
    r.bind({});
    return BiasOptions{};
  }
  if (name == "sweep") return sweep_options(r);
  if (name == "frequency") return frequency_options(r);
  if (name == "transient") return transient_options(r);
  if (name == "spectrum") return spectrum_options(r);
  if (name == "headroom") return headroom_options(r);
  if (name == "characterize") return characterize_options(r);
  r.source.fail(r.call.offset,
                "unknown analysis '" + name + "'" +
                    reader::suggestion(name, {"bias", "sweep", "frequency", "transient", "spectrum",
                                              "headroom", "characterize"}));
}

}  // namespace

void Elaborator::analysis(const ast::Analyze& analyze, const File& file) {
  const Frame frame{&file, "", {}, &globals_, {}};
  const AnalysisReading reading{
      analyze.call,
      file.source,
      globals_,
      deck_.circuit,
      [&](const BoundArguments& args, std::string_view slot, Quantity q, double fallback) {
        return value(args, slot, q, frame, fallback);
      },
      [&](const ast::Expr& e, bool source_only) { return existing_element(e, file, source_only); },
      [&](const ast::Expr& e) { return signal(e, file); }};
  deck_.analyses.push_back({analysis_options(reading), file.source.location(analyze.offset)});
}

}  // namespace stage::elaborate
