// The command's exit statuses, shared by every subcommand, chosen here from
// the library's error kinds (spec section 8): 2 for what the user must fix
// (the input, a request, an output file that could not be written; nothing
// more ran), 3 for a circuit that could not be solved, 4 for a maximum
// rating exceeded under --strict, 5 for running out of memory, 1 for
// anything else (a bug: please report it).
#pragma once

#include <iostream>
#include <new>
#include <stdexcept>

#include "stage/errors.hpp"

inline constexpr int kExitBug = 1;
inline constexpr int kExitUserError = 2;
inline constexpr int kExitNotSolved = 3;
// `stage run --strict`: every analysis finished, and a device exceeded a
// maximum rating of its model.
inline constexpr int kExitRatingsExceeded = 4;
// The machine ran out of memory: no bug, but no result either.
inline constexpr int kExitOutOfMemory = 5;

// No default: a kind left out here is a -Wswitch warning (an error in CI).
constexpr int exit_status(stage::ErrorKind kind) {
  switch (kind) {
    case stage::ErrorKind::input:
    case stage::ErrorKind::invalid_request:
    case stage::ErrorKind::not_written:
      return kExitUserError;
    case stage::ErrorKind::topology:
    case stage::ErrorKind::singular:
    case stage::ErrorKind::no_convergence:
    case stage::ErrorKind::step_too_small:
    case stage::ErrorKind::search_exhausted:
    case stage::ErrorKind::outside_model:
    case stage::ErrorKind::energy_imbalance:
      return kExitNotSolved;
  }
  return kExitBug;
}

// An error with a place already reads `file:line:column: message`; the
// others are told as `error (kind): message`.
inline void print_error(std::ostream& out, const stage::Error& e) {
  if (e.location()) {
    out << e.what() << '\n';
  } else {
    out << "error (" << to_string(e.kind()) << "): " << e.what() << '\n';
  }
}

template <class Command>
int run_guarded(Command&& command) {
  try {
    return command();
  } catch (const stage::Error& e) {
    print_error(std::cerr, e);
    return exit_status(e.kind());
  } catch (const std::bad_alloc&) {
    std::cerr << "error (out of memory): the circuit or what its analyses ask for needs more "
                 "memory than this machine can give; fewer points, a shorter transient or a "
                 "smaller circuit needs less\n";
    return kExitOutOfMemory;
  } catch (const std::exception& e) {
    std::cerr << "internal error: " << e.what() << '\n';
    return kExitBug;
  }
}
