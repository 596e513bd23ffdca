// The case guard's warnings in counterpoise-cli: the "warnings" array of evaluate --json, the
// "Warnings" heading of the readable output, validate printing them without changing its exit
// code, and the demo cases' warnings as the command line reports them.
#include <catch2/catch.hpp>

#include <sys/wait.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "demo_warnings.hpp"

using nlohmann::json;

namespace {

struct Run {
  int exit_code;
  std::string out;
};

Run run_cli(const std::string& arguments) {
  const auto output = std::filesystem::temp_directory_path() / "counterpoise-case-guard-cli-output.txt";
  const std::string command = std::string("'") + COUNTERPOISE_CLI + "' " + arguments + " > '" + output.string() + "' 2>/dev/null";
  const int status = std::system(command.c_str());
  std::ifstream in(output);
  std::stringstream text;
  text << in.rdbuf();
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, text.str()};
}

// A case with two warnings: complementary probabilities in item A and prior odds in casework.
std::string warned_case_path() {
  const auto path = std::filesystem::temp_directory_path() / "counterpoise-case-guard-cli-case.json";
  std::ofstream(path) << R"({ "format": "counterpoise.case", "version": 1, "mode": "casework",
    "case": { "reference": "VFL-GUARD-CLI" },
    "propositions": { "level": "source", "hp": "The fibres came from the door mat",
                      "hd": "The fibres came from some other textile source" },
    "items": [ { "id": "A", "model": "assigned", "p_given_hp": 0.7, "p_given_hd": 0.3 } ],
    "priors": { "odds": [0.1] } })";
  return "'" + path.string() + "'";
}

}  // namespace

TEST_CASE("case guard CLI: evaluate --json fills the warnings array") {
  const Run run = run_cli("evaluate --json " + warned_case_path());
  REQUIRE(run.exit_code == 0);
  const auto warnings = json::parse(run.out).at("warnings");
  REQUIRE(warnings.size() == 2);
  CHECK(warnings[0].at("item") == "A");
  CHECK(warnings[0].at("rule") == "complementary-probabilities");
  CHECK(warnings[0].at("severity") == "warning");
  CHECK(!warnings[0].at("message").get<std::string>().empty());
  CHECK(warnings[1].at("item") == "priors");
  CHECK(warnings[1].at("rule") == "prior-in-casework");
}

TEST_CASE("case guard CLI: the readable output lists the warnings under a heading") {
  const Run run = run_cli("evaluate " + warned_case_path());
  REQUIRE(run.exit_code == 0);
  const auto heading = run.out.find("\nWarnings (2):\n");
  REQUIRE(heading != std::string::npos);
  CHECK(run.out.find("[complementary-probabilities] A, p_given_hp:", heading) != std::string::npos);
  CHECK(run.out.find("[prior-in-casework] priors:", heading) != std::string::npos);
}

TEST_CASE("case guard CLI: validate prints the warnings and still exits 0") {
  const Run run = run_cli("validate " + warned_case_path());
  CHECK(run.exit_code == 0);
  CHECK(run.out.find("valid (1 items)") != std::string::npos);
  CHECK(run.out.find("[prior-in-casework]") != std::string::npos);
}

TEST_CASE("case guard CLI: the demo cases give only their expected warnings") {
  for (const auto& [name, want] : expected_demo_warnings()) {
    const std::string path = "'" + (std::filesystem::path(COUNTERPOISE_DEMO_DIR) / name).string() + "'";
    const Run run = run_cli("evaluate --json " + path);
    REQUIRE(run.exit_code == 0);
    std::vector<std::string> got;
    const json document = json::parse(run.out);
    for (const auto& w : document.at("warnings"))
      got.push_back(w.at("item").get<std::string>() + "/" + w.at("rule").get<std::string>());
    INFO(name);
    CHECK(got == want);
    const Run readable = run_cli("evaluate " + path);
    const std::string heading = want.empty() ? "\nWarnings: none\n" : "\nWarnings (" + std::to_string(want.size()) + "):\n";
    CHECK(readable.out.find(heading) != std::string::npos);
  }
}
