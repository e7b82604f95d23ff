// Running the built `stage` command from a test: its exit status and what it
// printed, and circuit files written to the temporary folder for it to read.
#pragma once

#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

namespace stage::testing {

struct Outcome {
  int status = -1;
  std::string out;  // stdout and stderr together, or stdout alone
};

enum class Stderr { merged, dropped };

// A shell command line, run as written.
inline Outcome run_shell(const std::string& command) {
  Outcome o;
  FILE* pipe = popen(command.c_str(), "r");
  std::array<char, 4096> buffer{};
  while (std::fgets(buffer.data(), buffer.size(), pipe) != nullptr) o.out += buffer.data();
  const int raw = pclose(pipe);
  o.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  return o;
}

inline Outcome run(const std::string& arguments, Stderr err = Stderr::merged) {
  return run_shell(std::string(STAGE_BINARY_DIR) + "/apps/stage " + arguments +
                   (err == Stderr::merged ? " 2>&1" : " 2>/dev/null"));
}

inline std::filesystem::path write_temp(const std::string& name, const std::string& text) {
  const std::filesystem::path path =
      std::filesystem::temp_directory_path() / ("stage_command_test_" + name);
  std::ofstream(path) << text;
  return path;
}

}  // namespace stage::testing
