// A reusable finite-difference check of a device's analytic derivatives:
// builds the device on its own Topology and PatternBuilder (both declare
// passes, as the real system does), evaluates f, q, G = df/dx and C = dq/dx
// at a state x, and compares every column of G and C with central
// differences of f and q. Any device can be checked this way:
//
//   DerivativeCheck check([&](stage::mna::Topology& t) { return make_x(..., t); });
//   auto x = check.state({{"a", 0.7}});
//   auto result = check.compare(x);
//   EXPECT_LT(result.worst, 1e-6) << result.where;
#pragma once

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <map>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include "mna/device.hpp"
#include "mna/pattern.hpp"
#include "mna/topology.hpp"

namespace stage::testing {

class DerivativeCheck {
 public:
  using Factory = std::function<std::unique_ptr<mna::Device>(mna::Topology&)>;

  explicit DerivativeCheck(const Factory& make) : pattern_(topology_), device_(make(topology_)) {
    device_->declare(pattern_);
    pattern_.compress();
    device_->declare(pattern_);
  }

  mna::Device& device() { return *device_; }
  const mna::Topology& topology() const { return topology_; }
  int size() const { return topology_.size(); }

  // A state (n + 1 entries, x[0] = 0) with the named circuit nodes set and
  // every internal node at `internal(name)` if given, else 0.
  std::vector<double> state(const std::map<std::string, double>& nodes,
                            const std::function<double(const std::string&)>& internal = {}) const {
    std::vector<double> x(size() + 1, 0.0);
    for (const auto& [name, value] : nodes) {
      const auto index = topology_.find_node(name);
      if (!index) throw std::invalid_argument("no node " + name);
      x[*index] = value;
    }
    for (int i = 1; i <= size(); ++i) {
      if (internal && topology_.is_internal_node(i)) {
        x[i] = internal(topology_.name(i));
      }
    }
    return x;
  }

  struct Evaluation {
    Eigen::VectorXd f, q;  // unknowns 1..n at 0..n-1
    Eigen::MatrixXd g, c;
  };

  Evaluation evaluate(const std::vector<double>& x, double kelvin = kRoomTemperature,
                      bool limit = false) {
    const auto& p = pattern_.pattern();
    std::vector<double> f(size() + 1, 0.0), q(size() + 1, 0.0);
    std::vector<double> g(p.nnz() + 1, 0.0), c(p.nnz() + 1, 0.0);
    mna::EvalRequest request;
    request.x = x.data();
    request.temperature = kelvin;
    request.limit = limit;
    mna::EvalOutput out{f.data(), q.data(), g.data(), c.data()};
    device_->evaluate(request, out);
    Evaluation e{Eigen::VectorXd(size()), Eigen::VectorXd(size()),
                 Eigen::MatrixXd::Zero(size(), size()), Eigen::MatrixXd::Zero(size(), size())};
    for (int i = 0; i < size(); ++i) {
      e.f[i] = f[i + 1];
      e.q[i] = q[i + 1];
    }
    for (int col = 0; col < p.n; ++col) {
      for (int k = p.column_start[col]; k < p.column_start[col + 1]; ++k) {
        e.g(p.row[k], col) = g[k];
        e.c(p.row[k], col) = c[k];
      }
    }
    return e;
  }

  struct Result {
    double worst = 0;  // largest scaled error over every entry of G and C
    // Largest |analytic - difference| / max(|analytic|, |difference|, floor)
    // before the rounding allowance: what the comparison actually resolved.
    double worst_raw = 0;
    std::string where;  // the entry it was found at
  };

  // Central differences with step h (volts or amperes). Entry (i, j) passes
  // when |analytic - difference| <= noise_i + tol * max(|analytic|, floor_i)
  // and its reported error is (|analytic - difference| - noise_i) /
  // max(|analytic|, |difference|, floor_i), where
  //   noise_i = 1e3 eps max|f_i| / h: the rounding of f_i itself (evaluated
  //   to ~1e3 eps through exponentials and sums), divided by the step;
  //   floor_i = 1e-4 * largest |entry| of row i: entries far below the rest
  //   of their row are held to an absolute tolerance.
  // With h = 1 uV and junction exponentials on a scale of n kT/q ~ 26 mV,
  // truncation is about (h / 26 mV)^2 / 6 ~ 3e-10 relative
  // (central-difference error analysis, common practice).
  Result compare(const std::vector<double>& x, double kelvin = kRoomTemperature, double h = 1e-6) {
    const Evaluation at = evaluate(x, kelvin);
    Result result;
    for (int j = 0; j < size(); ++j) {
      std::vector<double> up = x, down = x;
      up[j + 1] += h;
      down[j + 1] -= h;
      const Evaluation plus = evaluate(up, kelvin);
      const Evaluation minus = evaluate(down, kelvin);
      const Eigen::VectorXd dg = (plus.f - minus.f) / (2 * h);
      const Eigen::VectorXd dc = (plus.q - minus.q) / (2 * h);
      score(at.g, dg, noise(at.f, plus.f, minus.f, h), j, "G", result);
      score(at.c, dc, noise(at.q, plus.q, minus.q, h), j, "C", result);
    }
    return result;
  }

 private:
  static Eigen::VectorXd noise(const Eigen::VectorXd& a, const Eigen::VectorXd& b,
                               const Eigen::VectorXd& c, double h) {
    const double eps = std::numeric_limits<double>::epsilon();
    return 1e3 * eps * a.cwiseAbs().cwiseMax(b.cwiseAbs()).cwiseMax(c.cwiseAbs()) / h;
  }

  void score(const Eigen::MatrixXd& analytic, const Eigen::VectorXd& difference,
             const Eigen::VectorXd& noise, int j, const char* matrix, Result& result) const {
    for (int i = 0; i < size(); ++i) {
      const double floor = 1e-4 * analytic.row(i).cwiseAbs().maxCoeff();
      const double scale = std::max({std::abs(analytic(i, j)), std::abs(difference[i]), floor});
      const double gap = std::abs(analytic(i, j) - difference[i]);
      if (scale > 0) result.worst_raw = std::max(result.worst_raw, gap / scale);
      const double excess = gap - noise[i];
      if (excess <= 0) continue;
      const double error = scale > 0 ? excess / scale : kInfinity;
      if (error > result.worst) {
        result.worst = error;
        result.where = std::string(matrix) + "(" + topology_.name(i + 1) + ", " +
                       topology_.name(j + 1) + "): analytic " + number(analytic(i, j)) +
                       ", difference " + number(difference[i]);
      }
    }
  }

  static std::string number(double v) {
    char text[32];
    std::snprintf(text, sizeof text, "%.9g", v);
    return text;
  }

  mna::Topology topology_;
  mna::PatternBuilder pattern_;
  std::unique_ptr<mna::Device> device_;
};

}  // namespace stage::testing
