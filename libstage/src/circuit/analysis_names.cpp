// The language's spelling of analysis kinds and signals, for messages and
// reports.
#include "stage/analyses.hpp"

namespace stage {

std::string_view analysis_kind(const AnalysisOptions& options) {
  static constexpr std::string_view kNames[] = {"bias",     "sweep",    "frequency",   "transient",
                                                "spectrum", "headroom", "characterize"};
  static_assert(std::size(kNames) == std::variant_size_v<AnalysisOptions>);
  return kNames[options.index()];
}

std::string SignalRef::label() const {
  switch (kind) {
    case Kind::node_pair:
      return "(" + a + ", " + b + ")";
    case Kind::element_current:
      return a + ".current";
    case Kind::node_voltage:
      break;
  }
  return a;
}

}  // namespace stage
