#pragma once
// Runs counterpoise-cli as a user does, capturing what it prints and how it ends.
#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>

#include <catch2/catch.hpp>
#include <unistd.h>

namespace cli_run {

struct Run {
  int exit_code;  // -1 when the program did not exit normally (a crash)
  std::string out;
  std::string err;
};

// Runs the CLI with `args` (already shell-quoted), capturing stdout and stderr separately.
inline Run run_cli(const std::string& args) {
  const auto err_path = std::filesystem::temp_directory_path() / ("cp-cli-err-" + std::to_string(::getpid()));
  const std::string command = std::string("'") + COUNTERPOISE_CLI + "' " + args + " 2>'" + err_path.string() + "'";
  Run run{};
  FILE* pipe = ::popen(command.c_str(), "r");
  REQUIRE(pipe);
  std::array<char, 4096> buffer{};
  std::size_t n;
  while ((n = std::fread(buffer.data(), 1, buffer.size(), pipe)) > 0) run.out.append(buffer.data(), n);
  const int status = ::pclose(pipe);
  run.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  std::ifstream err(err_path);
  run.err.assign(std::istreambuf_iterator<char>(err), {});
  std::filesystem::remove(err_path);
  return run;
}

}  // namespace cli_run
