#pragma once
// Shared by the guard tests: the checker with the shipped rules, a counterpoise-cli runner, and
// the warnings each demo case is expected to give.
#include <sys/wait.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include "core/guard/wording_checker.hpp"

// The checker with the shipped rule file, read once.
inline const counterpoise::guard::WordingChecker& default_checker() {
  static const counterpoise::guard::WordingChecker instance = counterpoise::guard::WordingChecker::load_default();
  return instance;
}

struct CliRun {
  int exit_code;
  std::string out;
};

// Runs counterpoise-cli with `arguments` (already quoted for the shell), its standard output
// (and standard error too when `with_errors`) written to `output` and read back.
inline CliRun run_cli(const std::string& arguments, const std::filesystem::path& output, bool with_errors = false) {
  const std::string command = std::string("'") + COUNTERPOISE_CLI + "' " + arguments + " > '" + output.string() +
                              (with_errors ? "' 2>&1" : "' 2>/dev/null");
  const int status = std::system(command.c_str());
  std::ifstream in(output);
  std::stringstream text;
  text << in.rdbuf();
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, text.str()};
}

// The warnings each demo case is expected to give, as "item/rule": the network demo leaves its
// covered items out of the combination (no warning); the casework demos that list prior odds for
// the illustration get the prior warning, and only that. A new demo case needs its line here.
inline const std::vector<std::pair<std::string, std::vector<std::string>>>& expected_demo_warnings() {
  static const std::vector<std::pair<std::string, std::vector<std::string>>> table = {
      {"harwick-vale-breakin.json", {}},
      {"harwick-vale-dna.json", {}},
      {"harwick-vale-fibres.json", {}},
      {"harwick-vale-glass-alternatives.json", {}},
      {"harwick-vale-glass.json", {}},
      {"harwick-vale-handbag-alternatives.json", {}},
      {"harwick-vale-mixture.json", {}},
      {"harwick-vale-network.json", {}},
      {"harwick-vale-training-priors.json", {}},
  };
  return table;
}
