#pragma once
// Runs the bandstack executable built with the tests (BANDSTACK_EXE) through the shell and captures
// its exit code and its stdout and stderr together.
#include <array>
#include <cstdio>
#include <string>

#include <sys/wait.h>

namespace bandstack::testing {

struct Outcome {
  int exit_code;
  std::string output; // stdout and stderr together
};

inline Outcome invoke(const std::string& args) {
  const std::string command = std::string(BANDSTACK_EXE) + " " + args + " 2>&1";
  FILE* pipe = popen(command.c_str(), "r");
  std::string output;
  std::array<char, 4096> buffer{};
  while (std::fgets(buffer.data(), buffer.size(), pipe)) output += buffer.data();
  const int status = pclose(pipe);
  return {WEXITSTATUS(status), output};
}

} // namespace bandstack::testing
