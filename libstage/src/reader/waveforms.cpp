// Reading the waveforms of spec section 3 (`sine`, `pulse`, `piecewise`):
// arguments by name only, a pulse given as a designer specifies it.
#include <string>
#include <string_view>

#include "reader/elaborator.hpp"
#include "reader/suggest.hpp"

namespace stage::elaborate {

namespace x3 = boost::spirit::x3;

namespace {

constexpr std::string_view kSineForm =
    "sine(amplitude = …, frequency = …, offset = …, delay = …, phase = …, damping = …)";
constexpr std::string_view kPulseForm =
    "pulse(low = …, high = …, period = …, high_time = … or duty = …, rise = …, fall = …, "
    "delay = …)";

// The named arguments of one waveform call, evaluated in its scope.
class WaveArguments {
 public:
  WaveArguments(const ast::Call& call, std::span<const Slot> slots, std::string_view form,
                const reader::Scope& scope, const reader::SourceText& source)
      : args_(keywords_only(call, form, source), slots, call.name, source),
        scope_(scope),
        source_(source) {}

  bool given(std::string_view slot) const { return args_.get(slot) != nullptr; }
  int offset(std::string_view slot) const { return args_.offset(slot); }
  [[noreturn]] void fail(std::string_view slot, const std::string& message) const {
    source_.fail(args_.offset(slot), message);
  }

  double value(std::string_view slot, Quantity q, double fallback) const {
    const ast::Expr* e = args_.get(slot);
    return e ? reader::evaluate_as(*e, q, scope_, source_) : fallback;
  }
  double non_negative(std::string_view slot, Quantity q, double fallback) const {
    const double v = value(slot, q, fallback);
    if (v < 0) fail(slot, std::string(slot) + " cannot be negative");
    return v;
  }

 private:
  // A positional argument is an error at its place showing the keyword form.
  static const ast::Call& keywords_only(const ast::Call& call, std::string_view form,
                                        const reader::SourceText& source) {
    for (const ast::Argument& a : call.arguments) {
      if (!a.key) {
        source.fail(a.offset, "waveform arguments are given by name: " + std::string(form));
      }
    }
    return call;
  }

  BoundArguments args_;
  const reader::Scope& scope_;
  const reader::SourceText& source_;
};

SineWave sine_wave(const ast::Call& c, Quantity level, const reader::Scope& scope,
                   const reader::SourceText& source) {
  static constexpr Slot slots[] = {{"amplitude"}, {"frequency"}, {"offset"},
                                   {"delay"},     {"phase"},     {"damping"}};
  const WaveArguments args(c, slots, kSineForm, scope, source);
  SineWave w;
  w.amplitude = args.value("amplitude", level, w.amplitude);
  w.frequency = args.non_negative("frequency", Quantity::frequency, w.frequency);
  w.offset = args.value("offset", level, w.offset);
  w.delay = args.non_negative("delay", Quantity::time, w.delay);
  w.phase_deg = args.value("phase", Quantity::angle, w.phase_deg);
  w.damping = args.value("damping", Quantity::frequency, w.damping);
  return w;
}

// The time high at half amplitude: `high_time`, or `duty` of the period
// (half the period when neither is given).
double pulse_high_time(const WaveArguments& args, double period) {
  if (args.given("high_time") && args.given("duty")) {
    args.fail("duty", "give high_time or duty, not both");
  }
  if (args.given("high_time")) return args.non_negative("high_time", Quantity::time, 0.0);
  const double duty = args.value("duty", Quantity::ratio, 0.5);
  if (!(duty >= 0 && duty <= 1)) args.fail("duty", "duty must be from 0 % to 100 %");
  return duty * period;
}

PulseWave pulse_wave(const ast::Call& c, Quantity level, const reader::Scope& scope,
                     const reader::SourceText& source) {
  static constexpr Slot slots[] = {{"low"},  {"high"}, {"period"}, {"high_time"},
                                   {"duty"}, {"rise"}, {"fall"},   {"delay"}};
  const WaveArguments args(c, slots, kPulseForm, scope, source);
  PulseWave w;
  w.low = args.value("low", level, w.low);
  w.high = args.value("high", level, w.high);
  w.period = args.value("period", Quantity::time, w.period);
  if (!(w.period > 0)) args.fail("period", "period must be positive");
  w.high_time = pulse_high_time(args, w.period);
  w.rise = args.non_negative("rise", Quantity::time, w.rise);
  w.fall = args.non_negative("fall", Quantity::time, w.fall);
  w.delay = args.non_negative("delay", Quantity::time, w.delay);
  if (const std::string why = pulse_problem(w); !why.empty()) {
    const bool edges_too_long = pulse_shape(w).top < 0;
    const std::string_view place = !edges_too_long           ? "period"
                                   : args.given("high_time") ? "high_time"
                                                             : "duty";
    args.fail(place, "the pulse " + why);
  }
  return w;
}

PiecewiseWave piecewise_wave(const ast::Call& c, Quantity level, const reader::Scope& scope,
                             const reader::SourceText& source) {
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
    const double t = reader::evaluate_as(point->get().items[0], Quantity::time, scope, source);
    const double v = reader::evaluate_as(point->get().items[1], level, scope, source);
    if (!w.points.empty() && t <= w.points.back().first) {
      source.fail(a.offset, "piecewise times must increase");
    }
    w.points.emplace_back(t, v);
  }
  if (w.points.empty()) source.fail(c.offset, "piecewise needs at least one (time, value) point");
  return w;
}

}  // namespace

Waveform Elaborator::waveform(const ast::Expr& e, Quantity level, const Frame& frame) {
  const reader::SourceText& source = frame.file->source;
  const auto* call = boost::get<x3::forward_ast<ast::Call>>(&ast::unwrap(e));
  if (!call) source.fail(ast::offset_of(e), "expected sine(…), pulse(…) or piecewise(…)");
  const ast::Call& c = call->get();
  if (c.name == "sine") return sine_wave(c, level, *frame.scope, source);
  if (c.name == "pulse") return pulse_wave(c, level, *frame.scope, source);
  if (c.name == "piecewise") return piecewise_wave(c, level, *frame.scope, source);
  source.fail(c.offset, "unknown waveform '" + c.name + "'" +
                            reader::suggestion(c.name, {"sine", "pulse", "piecewise"}));
}

}  // namespace stage::elaborate
