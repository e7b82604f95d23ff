// `stage curves check` and `stage curves fit`: model regression against
// reference curves and parameter fitting (stage/curves.hpp).
#pragma once

#include <CLI/CLI.hpp>

// Adds the `curves` subcommand group to `app` and returns it. The chosen
// subcommand runs during app.parse() and leaves its exit status in
// `exit_status` (0 pass, 1 a curve out of tolerance or a fit that did not
// converge, 2 bad input, 3 numerical failure); it catches its own errors.
// After parsing, the caller returns `exit_status` when the group was parsed.
CLI::App* add_curves_commands(CLI::App& app, int& exit_status);
