// The one contract every circuit element implements.
//
// Modified nodal analysis writes the circuit as F(x, t) = f(x, t) + dq(x)/dt = 0
// where x holds the node voltages, the branch currents and any other unknown
// a device adds (a temperature; Topology::add_unknown and mna::UnknownKind),
// f are resistive currents (and branch equations, heat flows) and q are
// charges (and inductor fluxes, heats). Row k of F is KCL at node k (current
// leaving the node), the equation of branch k, or the heat balance of
// temperature k (heat flowing out). Every analysis is built from the same
// four quantities:
//
//   f (size n)    resistive residual       G = df/dx (sparse, n x n)
//   q (size n)    charge / flux            C = dq/dx (same pattern as G)
//
// DC solves f = 0 with Jacobian G; AC solves (G + jwC) X = B at the bias
// point; a transient integrates q and solves f + q' = 0 each step.
//
// Storage layout. A device declares once, in declare(), every (row, col) it
// will ever touch and keeps the Slot it gets back. In evaluate() it adds into
// g[slot] and c[slot] (the compressed-column value arrays of G and C) and into
// f[row] and q[row]. declare() is called twice: once to collect the pattern,
// once after compression to hand out final slots; it must ask for the same
// entries in the same order both times and keep the slots of the last call.
//
// Ground is index 0 (kGroundIndex) and unknowns are 1..n, so x, f and q have
// n + 1 entries: x[0] is always 0, f[0] and q[0] are trash, and entries of G
// and C in ground's row or column map to a trash slot at the end of g and c.
// Devices therefore never branch on ground. All arrays are zeroed by the
// caller before each evaluation; devices add.
#pragma once

#include <complex>
#include <optional>
#include <string>
#include <vector>

#include "mna/types.hpp"
#include "stage/waveform.hpp"

namespace stage {
struct BiasResult;
}  // namespace stage

namespace stage::mna {

class Topology;
class PatternBuilder;
class RatingLog;
class TopologyCheck;

// Where a solution lies against the range a device's model describes.
// `invalid`: the model's own equations were not evaluated there (a junction
// exponent beyond kMaxExponent, continued by its tangent only so that Newton
// stays finite), so the solution is not one of the model and must not be
// reported as a result. `extrapolated`: the equations hold, but far outside
// where such a model is characterised (a collector current many times the
// high-injection knee); the result stands with a warning naming the device.
struct ModelRangeFinding {
  std::string device;
  std::string message;  // names the device, its junction or current, and the bound
};
struct ModelRangeFindings {
  std::vector<ModelRangeFinding> invalid;
  std::vector<ModelRangeFinding> extrapolated;
};

// What an independent source offers the analyses, so that none of them needs
// its concrete class: the frequency response drives and reads its input
// through it, the bias report takes the supply powers from it.
//
// Every source delivers its current out of one node (`ports().out`) into the
// circuit and takes it back at another (`ports().back`): a voltage source's
// positive and negative nodes, a current source's second and first
// terminals (spec section 3). Power delivered is then the delivered current
// times x[out] - x[back]; negative when the source absorbs.
class SourceAccess {
 public:
  enum class Drives { voltage, current };
  struct Ports {
    Drives drives = Drives::voltage;
    Index out = kGroundIndex;
    Index back = kGroundIndex;
    // The row of the delivered current for a voltage source (its branch
    // unknown); kGroundIndex for a current source, whose current is its value.
    Index branch = kGroundIndex;
  };

  virtual Ports ports() const = 0;
  // Its own value (V or A) at an evaluation: the DC value, or the waveform
  // at request.time, times request.source_scale; the same value evaluate()
  // stamps.
  virtual double value(const EvalRequest& at) const = 0;
  // Its small-signal phasor (V or A); zero when it has no AC value.
  virtual std::complex<double> phasor() const = 0;
  // The current it delivers into the circuit at solution at.x (spec
  // section 3's sign convention: its reported current).
  virtual double delivered_current(const EvalRequest& at) const = 0;
  // The power it delivers into the circuit at solution at.x (W).
  virtual double delivered_power(const EvalRequest& at) const = 0;

 protected:
  ~SourceAccess() = default;
};

// How a device that carries or steers the signal stands at a solution, in
// terms every kind can give, so that the large-signal analyses (the limit
// classifier, the load line) read any kind without naming it.
struct Conduction {
  enum class State {
    conducting,  // as biased: a transistor's control junction on, its output free
    saturated,   // its output path has collapsed: the transistor no longer amplifies
    cut_off,     // nothing flows: every junction off
    reversed,    // a transistor conducting in its inverse direction
  };
  State state = State::conducting;
  bool amplifies = false;       // a transistor; a diode only steers (a bias chain)
  double current = 0;           // main path (A): into a collector; a diode's forward current
  double voltage = 0;           // across the main path (V): VCE; a diode's forward voltage
  double transconductance = 0;  // d current / d control voltage (S); 0 without a control
};

// A state an element holds at the start of a transient from given
// conditions (`start = zero`): unknowns x[plus] - x[minus] equal to value.
// A capacitor's initial voltage across its nodes; an inductor's initial
// current on its branch row (minus is ground). The zero start evaluates the
// device alone at such a point to learn the charge (or flux) it holds there.
struct InitialCondition {
  Index plus = kGroundIndex;
  Index minus = kGroundIndex;
  double value = 0;
};

class Device {
 public:
  explicit Device(std::string name) : name_(std::move(name)) {}
  virtual ~Device() = default;
  Device(const Device&) = delete;
  Device& operator=(const Device&) = delete;

  const std::string& name() const { return name_; }

  // Called once after construction: ask for every (row, col) entry used.
  virtual void declare(PatternBuilder& pattern) = 0;

  // Add f, q, G = df/dx and C = dq/dx at request.x into `out`.
  // With request.limit a junction device may evaluate at a limited junction
  // voltage v' near its last one and stamp the linearisation
  // f(v') + G (v - v'), so the Newton update stays consistent.
  virtual void evaluate(const EvalRequest& request, EvalOutput& out) = 0;

  // Changes the element's own value (a resistance, capacitance or
  // inductance, a source's DC value) in place: the matrix pattern stays, so
  // a prepared simulation keeps its factorisation's structure. False for a
  // kind that has no such value. The caller has checked the value, and calls
  // through System::set_value so that the system's constant stamp follows.
  virtual bool set_value(double /*value*/) { return false; }
  // Replaces an independent source's waveform (nothing: DC only), likewise
  // in place. False for a kind that has none.
  virtual bool set_waveform(const std::optional<Waveform>& /*wave*/) { return false; }

  // True if f or q depend nonlinearly on x (Newton must iterate).
  //
  // A linear device (not nonlinear) has f = G x + e and q = C x, with G and
  // C constant and e, its excitation, the only part that depends on the
  // request (time, source scale): an independent source's value. The system
  // stamps every linear device's G and C once, computes G x and C x by
  // sparse products, and asks only the devices with an excitation to add it
  // at each evaluation; evaluate() must agree with that split.
  virtual bool nonlinear() const { return false; }
  virtual bool has_excitation() const { return false; }
  // Adds e at the request into f (n + 1 entries).
  virtual void add_excitation(const EvalRequest& /*request*/, double* /*f*/) const {}

  // Forget limiting history (new analysis, new starting point).
  virtual void reset_limiting() {}

  // Small-signal excitation of this source, added into b (n + 1 entries, 0 is
  // trash) on the right-hand side of (G + jwC) X = b.
  virtual void ac_excitation(std::complex<double>* /*b*/) const {}

  // Times in (from, to] where this device's waveform has a corner.
  virtual void corners(double /*from*/, double /*to*/, std::vector<double>& /*out*/) const {}

  // Which pairs of nodes this device ties together at DC, for diagnosing a
  // singular system (floating nodes, loops of voltage sources, cut-sets).
  virtual void describe_topology(TopologyCheck& check) const = 0;

  // The current this element reports as "<name>.current" at solution x, in
  // the sign convention of spec section 3; nothing for elements that report
  // none. Cheap and allocation-free: transients read it at every step.
  virtual std::optional<double> reported_current(const EvalRequest& /*at*/) const {
    return std::nullopt;
  }

  // A semiconductor's operating-point record at solution x, added to its
  // kind's records in `out` (BiasResult::bipolars, ...).
  virtual void report(const EvalRequest& /*at*/, BiasResult& /*out*/) const {}

  // Its conduction at solution x (see Conduction); nothing for kinds that
  // neither amplify nor steer the signal.
  virtual std::optional<Conduction> conduction(const EvalRequest& /*at*/) const {
    return std::nullopt;
  }

  // Adds a message naming this device to `out` when solution x lies outside
  // its model's range (see ModelRangeFindings); adds nothing inside it.
  // Called once per accepted solution, so it may allocate when it finds
  // something, never otherwise.
  virtual void check_model_range(const EvalRequest& /*at*/, ModelRangeFindings& /*out*/) const {}

  // True if the device carries maximum ratings that check_ratings() tests.
  virtual bool rated() const { return false; }
  // Records into `log` every maximum rating the device exceeds at solution
  // at.x, at `time` (NaN at a bias point); the case sits at at.temperature.
  // Allocation-free unless it finds something: a transient calls it at
  // every accepted step.
  virtual void check_ratings(const EvalRequest& /*at*/, double /*time*/, RatingLog& /*log*/) const {
  }

  // The source capability of an independent source (see SourceAccess);
  // nullptr for every other kind. Valid as long as the device lives.
  virtual const SourceAccess* source() const { return nullptr; }

  // The state this element was given for a transient that starts from
  // given conditions; nothing for elements without one (or not given one).
  virtual std::optional<InitialCondition> initial_condition() const { return std::nullopt; }

  // Row of the branch current this device owns, if it has one (voltage
  // sources and inductors; current-controlled sources sense it).
  virtual Index branch() const { return kGroundIndex; }

 private:
  std::string name_;
};

}  // namespace stage::mna
