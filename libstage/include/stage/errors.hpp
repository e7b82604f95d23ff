// How the library fails: one exception type, stage::Error, carrying a kind
// from one table, the names involved, an optional place in the input and the
// message without that place. What a kind means to a caller (the command's
// exit status, whether to retry) is the caller's choice: spec section 8 lists
// the kinds and the statuses the `stage` command gives them.
#pragma once

#include <array>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace stage {

// Where in the input a problem is. Line and column count from 1; line 0 is a
// problem with no place in the text (a command-line value, a whole file).
struct SourceLocation {
  std::string file;
  int line = 0;
  int column = 0;
};

// Every way the library fails. The order is the order of kErrorKinds below.
enum class ErrorKind {
  input,
  invalid_request,
  not_written,
  topology,
  singular,
  no_convergence,
  step_too_small,
  search_exhausted,
  outside_model,
  energy_imbalance,
};

struct ErrorKindInfo {
  ErrorKind kind;
  std::string_view name;     // stable, machine-readable (JSON "error_kind")
  std::string_view meaning;  // one line for people
};

// The one table of error kinds.
inline constexpr std::array kErrorKinds{
    ErrorKindInfo{ErrorKind::input, "input",
                  "the circuit description or a value given to the command is wrong"},
    ErrorKindInfo{ErrorKind::invalid_request, "invalid_request",
                  "a call asks for what cannot be done as asked: an unknown name, an element of "
                  "the wrong kind, an option out of range"},
    ErrorKindInfo{ErrorKind::not_written, "not_written", "an output file could not be written"},
    ErrorKindInfo{ErrorKind::topology, "topology",
                  "the circuit's graph has no unique DC solution: a floating node, a loop of "
                  "voltage sources, a cut-set of current sources"},
    ErrorKindInfo{ErrorKind::singular, "singular",
                  "the linear system is singular at the point it was solved"},
    ErrorKindInfo{ErrorKind::no_convergence, "no_convergence",
                  "Newton iteration found no solution, or the point it stopped at is not one"},
    ErrorKindInfo{ErrorKind::step_too_small, "step_too_small",
                  "the transient's time step fell below its minimum"},
    ErrorKindInfo{ErrorKind::search_exhausted, "search_exhausted",
                  "a search ran out of the runs it is allowed before it found its answer"},
    ErrorKindInfo{ErrorKind::outside_model, "outside_model",
                  "the solution lies where a device model's equations do not hold"},
    ErrorKindInfo{ErrorKind::energy_imbalance, "energy_imbalance",
                  "the powers of a solved waveform do not balance (supplies absorbing power)"},
};

constexpr bool error_table_in_order() {
  for (std::size_t i = 0; i < kErrorKinds.size(); ++i) {
    if (static_cast<std::size_t>(kErrorKinds[i].kind) != i) return false;
  }
  return true;
}
static_assert(error_table_in_order(), "kErrorKinds must list every ErrorKind in its order");

constexpr std::string_view to_string(ErrorKind kind) {
  return kErrorKinds[static_cast<std::size_t>(kind)].name;
}

// What every library failure is. what() is the full text: the place
// (`file:line:column: `, with the source line and a caret under the column
// when the line is known) and the message.
class Error : public std::runtime_error {
 public:
  Error(ErrorKind kind, std::string message, std::vector<std::string> involved = {});
  // An error at a place in the input; `line_text` is that line of the source.
  Error(ErrorKind kind, SourceLocation where, std::string message, std::string line_text = {});

  ErrorKind kind() const { return kind_; }
  const std::string& message() const { return message_; }                 // without the place
  const std::vector<std::string>& involved() const { return involved_; }  // nodes, elements
  const std::optional<SourceLocation>& location() const { return where_; }

 private:
  ErrorKind kind_;
  std::string message_;
  std::vector<std::string> involved_;
  std::optional<SourceLocation> where_;
};

// An error in the circuit description or the command's arguments (kind
// `input`): names the place, shows the line with a caret, says what was
// expected. The reader passes the line from the text it holds; the file is
// never read again to show it.
class InputError : public Error {
 public:
  InputError(SourceLocation where, std::string message, std::string line_text = {});
  const SourceLocation& where() const { return *location(); }
};

// A circuit that could not be solved (kinds topology, singular,
// no_convergence, step_too_small, search_exhausted, outside_model,
// energy_imbalance), naming the nodes or elements at fault. A deck run keeps
// it as the failed analysis's result and runs the others.
class NumericalError : public Error {
 public:
  NumericalError(ErrorKind kind, std::string message, std::vector<std::string> involved);
};

}  // namespace stage
