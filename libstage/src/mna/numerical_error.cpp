// NumericalError: a circuit that cannot be solved, with the culprits named.
#include "stage/errors.hpp"

namespace stage {

NumericalError::NumericalError(std::string message, std::vector<std::string> involved)
    : std::runtime_error(std::move(message)), involved_(std::move(involved)) {}

}  // namespace stage
