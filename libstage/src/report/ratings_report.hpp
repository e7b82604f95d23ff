// The maximum ratings a result exceeded, as JSON (spec section 7, "Ratings")
// and as a table printed after the analysis's own.
#pragma once

#include <ostream>
#include <vector>

#include "report/format.hpp"
#include "stage/ratings.hpp"

namespace stage::report {

Json ratings_json(const std::vector<RatingViolation>& violations);
// Nothing when no rating was exceeded.
void print_ratings(std::ostream& out, const std::vector<RatingViolation>& violations);

}  // namespace stage::report
