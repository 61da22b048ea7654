#pragma once
// Runs the bandstack executable built with the tests (BANDSTACK_EXE) through the shell and captures
// its exit code and its stdout and stderr together.
#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include <gtest/gtest.h>
#include <sys/wait.h>
#include <unistd.h>

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

// A fresh scratch folder per test, removed afterwards, with a helper to write a text file into it.
class ScratchFolderTest : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = std::filesystem::temp_directory_path() /
           ("bandstack_cli_" + std::to_string(::getpid()) + "_" + ::testing::UnitTest::GetInstance()->current_test_info()->name());
    std::filesystem::remove_all(dir_);
    std::filesystem::create_directories(dir_);
  }
  void TearDown() override { std::filesystem::remove_all(dir_); }
  std::filesystem::path write(const std::string& name, const std::string& text) {
    std::ofstream(dir_ / name) << text;
    return dir_ / name;
  }
  std::filesystem::path dir_;
};

} // namespace bandstack::testing
