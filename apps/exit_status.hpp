// The command's exit statuses, shared by every subcommand: a library
// exception becomes its message on stderr and the status of spec section 8
// (2 bad input, nothing ran; 3 numerical failure; 1 anything else, a bug).
#pragma once

#include <iostream>
#include <stdexcept>

#include "stage/errors.hpp"

template <class Command>
int run_guarded(Command&& command) {
  try {
    return command();
  } catch (const stage::InputError& e) {
    std::cerr << e.what() << '\n';
    return stage::kExitInputError;
  } catch (const stage::NumericalError& e) {
    std::cerr << "error: " << e.what() << '\n';
    return stage::kExitNumericalError;
  } catch (const std::invalid_argument& e) {
    std::cerr << "error: " << e.what() << '\n';
    return stage::kExitInputError;
  } catch (const std::exception& e) {
    std::cerr << "internal error: " << e.what() << '\n';
    return 1;
  }
}
