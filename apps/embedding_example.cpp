// Embedding stage in another tool: build an emitter follower in code, find
// its bias point and read typed results, with no circuit text involved.
#include <iostream>

#include "stage/bias.hpp"
#include "stage/circuit.hpp"

// Figures are kept in SI units (A, S, W); printed here in thousandths of
// them (mA, mS, mW). The library's own reports choose the prefix themselves.
constexpr double kMilliPerUnit = 1e3;

int main() {
  stage::Circuit follower;
  follower.title = "Emitter follower built in code";
  stage::BipolarModel npn;  // defaults: a plain Ebers–Moll transistor, beta 100
  npn.beta_forward = 150;
  npn.early_voltage_forward = 80;
  follower.add_model("generic_npn", npn);
  follower.add("vcc", stage::VoltageSource{"vcc", "gnd", 12.0});
  follower.add("r_top", stage::Resistor{"vcc", "base", 47e3});
  follower.add("r_bottom", stage::Resistor{"base", "gnd", 47e3});
  follower.add("q1", stage::Bipolar{stage::Polarity::npn, "vcc", "base", "out", {}, "generic_npn"});
  follower.add("r_emitter", stage::Resistor{"out", "gnd", 1e3});

  const stage::BiasResult bias = stage::run_bias(follower);
  const auto& q1 = bias.bipolar("q1");
  std::cout << follower.title << "\n"
            << "  v(out)        " << bias.voltage("out") << " V\n"
            << "  q1 region     " << to_string(q1.region) << "\n"
            << "  q1 collector  " << q1.collector_current * kMilliPerUnit << " mA\n"
            << "  q1 gm         " << q1.gm * kMilliPerUnit << " mS\n"
            << "  q1 power      " << q1.power * kMilliPerUnit << " mW\n"
            << "  supply power  " << bias.supplies.front().power * kMilliPerUnit << " mW\n";
  return 0;
}
