// Reduction of a device's local system to its terminals, for report().
#include "devices/local_stamp.hpp"

#include <Eigen/Dense>

namespace stage::devices {

TerminalView reduce_to_terminals(int size, int terminals, const double* f, const double* g,
                                 const int* alias) {
  // Position of each local node after folding aliases: terminals first, then
  // the internal nodes that are really separate.
  std::vector<int> position(size);
  int kept = terminals;
  for (int i = 0; i < size; ++i) {
    if (i < terminals) {
      position[i] = i;
    } else if (alias[i] != i) {
      position[i] = alias[i];
    } else {
      position[i] = kept++;
    }
  }
  Eigen::MatrixXd folded = Eigen::MatrixXd::Zero(kept, kept);
  Eigen::VectorXd current = Eigen::VectorXd::Zero(kept);
  for (int i = 0; i < size; ++i) {
    current[position[i]] += f[i];
    for (int j = 0; j < size; ++j) folded(position[i], position[j]) += g[i * size + j];
  }
  const int inner = kept - terminals;
  Eigen::MatrixXd y = folded.topLeftCorner(terminals, terminals);
  if (inner > 0) {
    // At the solution the internal nodes carry no net current, so only the
    // conductance needs the elimination.
    const Eigen::MatrixXd gii = folded.bottomRightCorner(inner, inner);
    y -= folded.topRightCorner(terminals, inner) *
         gii.fullPivLu().solve(folded.bottomLeftCorner(inner, terminals));
  }
  TerminalView view;
  view.current.assign(current.data(), current.data() + terminals);
  view.conductance.assign(terminals, std::vector<double>(terminals));
  for (int i = 0; i < terminals; ++i) {
    for (int j = 0; j < terminals; ++j) view.conductance[i][j] = y(i, j);
  }
  return view;
}

}  // namespace stage::devices
