#pragma once
// Runs counterpoise-cli as a user would, from the store tests.

#include <array>
#include <cstdio>
#include <string>
#include <vector>

#include <catch2/catch.hpp>
#include <sys/wait.h>

namespace store_test {

struct Run {
  int code;
  std::string output;  // stdout and stderr together
};

// Quotes an argument for /bin/sh.
inline std::string quoted(const std::string& text) {
  std::string out = "'";
  for (char c : text) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

// Runs the command line with no examiner configured (no COUNTERPOISE_EXAMINER, a settings
// folder that does not exist) plus the given VAR=value assignments.
inline Run cli(const std::vector<std::string>& args,
               const std::vector<std::string>& environment = {}) {
  std::string command =
      "env -u COUNTERPOISE_EXAMINER COUNTERPOISE_CONFIG_DIR=/nonexistent/counterpoise-test";
  for (const auto& assignment : environment) command += " " + quoted(assignment);
  command += " " + quoted(COUNTERPOISE_CLI);
  for (const auto& a : args) command += " " + quoted(a);
  command += " 2>&1";
  Run run{-1, {}};
  FILE* pipe = ::popen(command.c_str(), "r");
  REQUIRE(pipe != nullptr);
  std::array<char, 4096> buffer{};
  while (std::size_t n = std::fread(buffer.data(), 1, buffer.size(), pipe))
    run.output.append(buffer.data(), n);
  const int status = ::pclose(pipe);
  run.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return run;
}

}  // namespace store_test
