// `analyze` statements (spec section 6 and the extensions in the project's
// spec copy) into AnalysisStatements. They are read after every element, so
// the sources, loads and nodes they name are checked against the circuit.
#include <cmath>

#include "reader/elaborator.hpp"
#include "reader/suggest.hpp"

namespace stage::elaborate {

namespace x3 = boost::spirit::x3;

namespace {
// A sweep longer than this is surely a mistaken step.
constexpr double kMaxSweepPoints = 1e6;

std::vector<std::string> keys(const auto& map) {
  std::vector<std::string> names;
  for (const auto& entry : map) names.push_back(entry.first);
  return names;
}
}  // namespace

std::string Elaborator::existing_element(const ast::Expr& e, const File& file,
                                         bool source_only) const {
  const std::string name = require_name(e, "an element name", file.source);
  const auto it = element_kinds_.find(name);
  if (it == element_kinds_.end()) {
    file.source.fail(ast::offset_of(e), "no element named '" + name + "'" +
                                            reader::suggestion(name, keys(element_kinds_)));
  }
  if (source_only && it->second != "voltage" && it->second != "current") {
    file.source.fail(ast::offset_of(e), "'" + name + "' is a " + it->second +
                                            "; expected a voltage or current source");
  }
  return name;
}

SignalRef Elaborator::signal(const ast::Expr& e, const File& file) const {
  const ast::Expr& inner = ast::unwrap(e);
  const auto known_node = [&](const ast::Expr& n) {
    const std::string name = require_name(n, "a node name", file.source);
    if (name != kGround && !nodes_.count(name)) {
      const std::vector<std::string> all(nodes_.begin(), nodes_.end());
      file.source.fail(ast::offset_of(n),
                       "no node named '" + name + "'" + reader::suggestion(name, all));
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
    if (!element_kinds_.count(element)) {
      file.source.fail(ast::offset_of(e), "no element named '" + element + "'" +
                                              reader::suggestion(element, keys(element_kinds_)));
    }
    return SignalRef::current(element);
  }
  return SignalRef::node(known_node(e));
}

void Elaborator::analysis(const ast::Analyze& analyze, const File& file) {
  const ast::Call& call = analyze.call;
  const reader::SourceText& source = file.source;
  const Frame frame{&file, "", {}, &globals_, {}};
  const std::string what = "analyze " + call.name;
  const auto bind = [&](std::span<const Slot> slots) {
    return BoundArguments(call, slots, what, source);
  };
  const auto positive = [&](const BoundArguments& args, std::string_view slot, Quantity q,
                            double fallback) {
    const double v = value(args, slot, q, frame, fallback);
    if (v <= 0) source.fail(args.offset(slot), std::string(slot) + " must be positive");
    return v;
  };
  const auto whole = [&](const BoundArguments& args, std::string_view slot, int fallback) {
    const double v = value(args, slot, Quantity::dimensionless, frame, fallback);
    if (v < 1 || v > kMaxSweepPoints || v != std::floor(v)) {
      source.fail(args.offset(slot),
                  std::string(slot) + " must be a whole number from 1 to 1000000");
    }
    return static_cast<int>(v);
  };
  const auto optional_element = [&](const BoundArguments& args, std::string_view slot) {
    const ast::Expr* e = args.get(slot);
    return e ? std::optional<std::string>(existing_element(*e, file, false)) : std::nullopt;
  };
  const auto input = [&](const BoundArguments& args) {
    return existing_element(*args.get("input"), file, true);
  };

  AnalysisOptions options;
  if (call.name == "bias") {
    bind({});
    options = BiasOptions{};
  } else if (call.name == "sweep") {
    static constexpr Slot slots[] = {{"target", true}, {"source"}, {"parameter"}, {"from"},
                                     {"to"},           {"step"},   {"values"}};
    const BoundArguments args = bind(slots);
    SweepOptions sweep;
    Quantity quantity = Quantity::dimensionless;
    bool checked = true;
    const int targets = (args.get("target") ? 1 : 0) + (args.get("source") ? 1 : 0) +
                        (args.get("parameter") ? 1 : 0);
    if (targets != 1) {
      source.fail(call.offset, "a sweep needs one of: temperature, source = …, parameter = …");
    }
    if (const ast::Expr* t = args.get("target")) {
      require_choice(*t, {"temperature"}, source);
      sweep.target = SweepOptions::Target::temperature;
      quantity = Quantity::temperature;
    } else if (const ast::Expr* s = args.get("source")) {
      sweep.target = SweepOptions::Target::source;
      sweep.name = existing_element(*s, file, true);
      quantity = element_kinds_.at(sweep.name) == "voltage" ? Quantity::voltage : Quantity::current;
    } else {
      const ast::Expr* p = args.get("parameter");
      sweep.target = SweepOptions::Target::parameter;
      sweep.name = require_name(*p, "a let parameter name", source);
      const reader::Value* let = globals_.find(sweep.name);
      if (!let) {
        source.fail(ast::offset_of(*p), "no let parameter named '" + sweep.name + "'" +
                                            reader::suggestion(sweep.name, globals_.names()));
      }
      checked = let->quantity.has_value();
      if (checked) quantity = *let->quantity;
    }
    const auto read = [&](const ast::Expr& e, reader::EvaluationRules rules = {}) {
      if (checked) return reader::evaluate_as(e, quantity, globals_, source, false, rules);
      return reader::evaluate(e, globals_, source, rules).number;
    };
    if (const ast::Expr* values = args.get("values")) {
      if (args.get("from") || args.get("to") || args.get("step")) {
        source.fail(args.offset("values"), "give either values = (…) or from, to and step");
      }
      const ast::Expr& inner = ast::unwrap(*values);
      if (const auto* list = boost::get<x3::forward_ast<ast::Tuple>>(&inner)) {
        for (const ast::Expr& item : list->get().items) sweep.values.push_back(read(item));
      } else {
        sweep.values.push_back(read(*values));
      }
    } else {
      for (const char* key : {"from", "to", "step"}) {
        if (!args.get(key)) source.fail(call.offset, what + " needs " + key + " (or values = (…))");
      }
      const double from = read(*args.get("from"));
      const double to = read(*args.get("to"));
      // A step in °C is a temperature difference, the same as in K.
      const double step = std::fabs(read(*args.get("step"), {.temperature_difference = true}));
      const double count = std::fabs(to - from) / step;
      if (step == 0 || !(count < kMaxSweepPoints)) {
        source.fail(args.offset("step"), "this step gives too many sweep points");
      }
      // Steps that land within rounding of `to` count as reaching it; `to`
      // itself is always the last value.
      const double direction = to >= from ? 1 : -1;
      const auto n = static_cast<long>(std::floor(count + 1e-9));
      for (long i = 0; i <= n; ++i) sweep.values.push_back(from + direction * step * i);
      if (std::fabs(sweep.values.back() - to) <= 1e-9 * std::max(std::fabs(to), step)) {
        sweep.values.back() = to;
      } else {
        sweep.values.push_back(to);
      }
    }
    options = sweep;
  } else if (call.name == "frequency") {
    static constexpr Slot slots[] = {
        {"from"}, {"to"}, {"per_decade"}, {"input", false, true}, {"output", false, true},
        {"load"}, {"at"}};
    const BoundArguments args = bind(slots);
    FrequencyOptions f;
    f.from = positive(args, "from", Quantity::frequency, f.from);
    f.to = positive(args, "to", Quantity::frequency, f.to);
    if (f.to <= f.from) source.fail(args.offset("to"), "to must be above from");
    f.per_decade = whole(args, "per_decade", f.per_decade);
    f.input = input(args);
    f.output = signal(*args.get("output"), file);
    f.load = optional_element(args, "load");
    if (args.get("at")) f.at = positive(args, "at", Quantity::frequency, 0);
    options = f;
  } else if (call.name == "transient") {
    static constexpr Slot slots[] = {{"stop", false, true}, {"max_step"},    {"from"}, {"start"},
                                     {"signals"},           {"uniform_step"}};
    const BoundArguments args = bind(slots);
    TransientOptions t;
    t.stop = positive(args, "stop", Quantity::time, 0);
    t.max_step = value(args, "max_step", Quantity::time, frame, 0);
    if (t.max_step < 0) source.fail(args.offset("max_step"), "max_step cannot be negative");
    t.from = value(args, "from", Quantity::time, frame, 0);
    if (t.from < 0 || t.from >= t.stop) {
      source.fail(args.offset("from"), "from must be at least 0 and before stop");
    }
    if (const ast::Expr* s = args.get("start")) {
      t.start = require_choice(*s, {"bias", "zero"}, source) == "zero" ? TransientStart::zero
                                                                       : TransientStart::bias;
    }
    if (const ast::Expr* s = args.get("signals")) {
      // A bracketed list is always a list of signals, so a lone node pair is
      // written ((a, b)).
      const auto* list = boost::get<x3::forward_ast<ast::Tuple>>(&ast::unwrap(*s, true));
      if (list) {
        for (const ast::Expr& item : list->get().items) t.signals.push_back(signal(item, file));
      } else {
        t.signals.push_back(signal(*s, file));
      }
    }
    if (args.get("uniform_step"))
      t.resample_step = positive(args, "uniform_step", Quantity::time, 0);
    options = t;
  } else if (call.name == "spectrum") {
    static constexpr Slot slots[] = {
        {"signal", false, true}, {"fundamental"}, {"harmonics"}, {"include_noise"}};
    const BoundArguments args = bind(slots);
    SpectrumOptions s;
    s.signal = signal(*args.get("signal"), file);
    s.fundamental = positive(args, "fundamental", Quantity::frequency, s.fundamental);
    s.harmonics = whole(args, "harmonics", s.harmonics);
    if (const ast::Expr* e = args.get("include_noise")) {
      s.with_noise = require_choice(*e, {"true", "false"}, source) == "true";
    }
    options = s;
  } else if (call.name == "headroom") {
    static constexpr Slot slots[] = {{"input", false, true},
                                     {"output", false, true},
                                     {"frequency"},
                                     {"distortion_limit"},
                                     {"load"}};
    const BoundArguments args = bind(slots);
    HeadroomOptions h;
    h.input = input(args);
    h.output = signal(*args.get("output"), file);
    h.frequency = positive(args, "frequency", Quantity::frequency, h.frequency);
    h.distortion_limit = positive(args, "distortion_limit", Quantity::ratio, h.distortion_limit);
    h.load = optional_element(args, "load");
    options = h;
  } else if (call.name == "characterize") {
    static constexpr Slot slots[] = {
        {"input", false, true}, {"output", false, true}, {"frequency"}, {"load"}};
    const BoundArguments args = bind(slots);
    CharacterizeOptions c;
    c.input = input(args);
    c.output = signal(*args.get("output"), file);
    c.frequency = positive(args, "frequency", Quantity::frequency, c.frequency);
    c.load = optional_element(args, "load");
    options = c;
  } else {
    source.fail(call.offset,
                "unknown analysis '" + call.name + "'" +
                    reader::suggestion(call.name, {"bias", "sweep", "frequency", "transient",
                                                   "spectrum", "headroom", "characterize"}));
  }
  deck_.analyses.push_back({std::move(options), source.location(analyze.offset)});
}

}  // namespace stage::elaborate
