// Model-range checks of a solution; see model_range.hpp.
#include "analysis/model_range.hpp"

#include "stage/errors.hpp"

namespace stage::analysis {

std::vector<std::string> check_model_ranges(const mna::System& system, const mna::EvalRequest& at,
                                            std::string_view what_failed) {
  mna::ModelRangeFindings range;
  for (const auto& d : system.devices()) d->check_model_range(at, range);
  if (!range.invalid.empty()) {
    std::vector<std::string> involved;
    std::string message(what_failed);
    for (const auto& finding : range.invalid) {
      message += (involved.empty() ? ": " : "; ") + finding.message;
      involved.push_back(finding.device);
    }
    throw NumericalError(ErrorKind::outside_model, message, involved);
  }
  std::vector<std::string> warnings;
  for (auto& finding : range.extrapolated) warnings.push_back(std::move(finding.message));
  return warnings;
}

}  // namespace stage::analysis
