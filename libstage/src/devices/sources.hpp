// Independent voltage and current sources: a DC value, an optional waveform
// for transients and a small-signal (AC) phasor.
#pragma once

#include <memory>
#include <optional>

#include "devices/stamp.hpp"
#include "stage/circuit.hpp"

namespace stage::mna {
class Topology;
}

namespace stage::devices {

// What a source holds or drives: DC value, waveform, AC phasor.
class SourceValue {
 public:
  SourceValue(double dc, std::optional<Waveform> wave, double ac_magnitude, double ac_phase_deg);
  // The value an evaluation asks for: DC (or the waveform at `time`),
  // scaled by the request's source_scale.
  double at(const mna::EvalRequest& request) const;
  std::complex<double> phasor() const { return phasor_; }
  const std::optional<Waveform>& wave() const { return wave_; }
  double dc() const { return dc_; }
  void set_dc(double value) { dc_ = value; }
  void set_wave(std::optional<Waveform> wave) { wave_ = std::move(wave); }

 private:
  double dc_;
  std::optional<Waveform> wave_;
  std::complex<double> phasor_;
};

// Common face of both sources: the value that set_value and set_waveform
// change, and the source capability the analyses read (mna::SourceAccess).
class IndependentSource : public mna::Device, public mna::SourceAccess {
 public:
  IndependentSource(std::string name, SourceValue value)
      : Device(std::move(name)), value_(std::move(value)) {}
  // A source's own value is its DC value.
  bool set_value(double dc) override {
    value_.set_dc(dc);
    return true;
  }
  bool set_waveform(const std::optional<Waveform>& wave) override {
    value_.set_wave(wave);
    return true;
  }
  void corners(double from, double to, std::vector<double>& out) const override;
  bool has_excitation() const override { return true; }
  const mna::SourceAccess* source() const override { return this; }
  double value(const mna::EvalRequest& at) const override { return value_.at(at); }
  std::complex<double> phasor() const override { return value_.phasor(); }
  std::optional<double> reported_current(const mna::EvalRequest& at) const override {
    return delivered_current(at);
  }
  double delivered_power(const mna::EvalRequest& at) const override;

 protected:
  SourceValue value_;
};

// Branch current k is the current the source delivers: out of p into the
// circuit. Row k holds v(p) - v(n) = V.
class VoltageSourceDevice final : public IndependentSource {
 public:
  VoltageSourceDevice(std::string name, mna::Index p, mna::Index n, mna::Index branch,
                      SourceValue value);
  void declare(mna::PatternBuilder& pattern) override;
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void add_excitation(const mna::EvalRequest& request, double* f) const override;
  void ac_excitation(std::complex<double>* b) const override;
  void describe_topology(mna::TopologyCheck& check) const override;
  mna::Index branch() const override { return k_; }
  Ports ports() const override { return {Drives::voltage, p_, n_, k_}; }
  double delivered_current(const mna::EvalRequest& at) const override { return at.x[k_]; }

 private:
  mna::Index p_, n_, k_;
  BranchSlots slots_;
};

// Drives I from a through the source into b.
class CurrentSourceDevice final : public IndependentSource {
 public:
  CurrentSourceDevice(std::string name, mna::Index a, mna::Index b, SourceValue value);
  void declare(mna::PatternBuilder&) override {}
  void evaluate(const mna::EvalRequest& request, mna::EvalOutput& out) override;
  void add_excitation(const mna::EvalRequest& request, double* f) const override;
  void ac_excitation(std::complex<double>* b) const override;
  void describe_topology(mna::TopologyCheck& check) const override;
  Ports ports() const override { return {Drives::current, b_, a_, mna::kGroundIndex}; }
  double delivered_current(const mna::EvalRequest& at) const override { return value_.at(at); }

 private:
  mna::Index a_, b_;
};

// The factory's overloads (see devices/passive.hpp).
std::unique_ptr<mna::Device> make_device(const std::string& name, const VoltageSource& e,
                                         const Circuit& circuit, mna::Topology& topology);
std::unique_ptr<mna::Device> make_device(const std::string& name, const CurrentSource& e,
                                         const Circuit& circuit, mna::Topology& topology);

}  // namespace stage::devices
