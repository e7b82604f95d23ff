// "Did you mean" help for misspelt names: the valid names closest to what was
// written, by edit distance.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace stage::reader {

// Up to three candidates nearest to `written` (Levenshtein distance, ties in
// the order given), keeping only those within half the word's length.
std::vector<std::string> nearest_names(std::string_view written,
                                       const std::vector<std::string>& candidates);

// " (nearest: a, b)" or "" when nothing is close, for appending to a message.
std::string suggestion(std::string_view written, const std::vector<std::string>& candidates);

}  // namespace stage::reader
