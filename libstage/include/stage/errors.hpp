// The two kinds of failure a caller must tell apart: bad input (the user must
// fix the text; exit status 2) and numerical failure (the circuit as written
// cannot be solved; exit status 3).
#pragma once

#include <stdexcept>
#include <string>
#include <vector>

namespace stage {

// Where in the input a problem is. Line and column count from 1.
struct SourceLocation {
  std::string file;
  int line = 0;
  int column = 0;
};

// An error in the circuit description: names the place, shows the line with
// a caret, says what was expected. what() holds the full formatted message.
class InputError : public std::runtime_error {
 public:
  InputError(SourceLocation where, std::string message, std::string line_text = {});
  const SourceLocation& where() const { return where_; }
  const std::string& message() const { return message_; }

 private:
  SourceLocation where_;
  std::string message_;
};

// A circuit that cannot be solved: singular matrix, no convergence, a step
// too small. `involved` names the nodes or elements at fault.
class NumericalError : public std::runtime_error {
 public:
  NumericalError(std::string message, std::vector<std::string> involved);
  const std::vector<std::string>& involved() const { return involved_; }

 private:
  std::vector<std::string> involved_;
};

inline constexpr int kExitInputError = 2;
inline constexpr int kExitNumericalError = 3;

}  // namespace stage
