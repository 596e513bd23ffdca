// The case guard's warnings in counterpoise-cli: the "warnings" array of evaluate --json, the
// "Warnings" heading of the readable output, validate printing them without changing its exit
// code, and the demo cases' warnings as the command line reports them.
#include <catch2/catch.hpp>

#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <string>

#include <nlohmann/json.hpp>

#include "guard_test_support.hpp"

using nlohmann::json;

namespace {

CliRun run(const std::string& arguments) {
  return run_cli(arguments, std::filesystem::temp_directory_path() / ("counterpoise-case-guard-cli-output-" + std::to_string(::getpid()) + ".txt"));
}

// A case with two warnings: complementary probabilities in item A and prior odds in casework.
std::string warned_case_path() {
  const auto path = std::filesystem::temp_directory_path() / ("counterpoise-case-guard-cli-case-" + std::to_string(::getpid()) + ".json");
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
  const CliRun result = run("evaluate --json " + warned_case_path());
  REQUIRE(result.exit_code == 0);
  const auto warnings = json::parse(result.out).at("warnings");
  REQUIRE(warnings.size() == 2);
  CHECK(warnings[0].at("item") == "A");
  CHECK(warnings[0].at("rule") == "complementary-probabilities");
  CHECK(warnings[0].at("severity") == "warning");
  CHECK(!warnings[0].at("message").get<std::string>().empty());
  CHECK(warnings[1].at("item") == "priors");
  CHECK(warnings[1].at("rule") == "prior-in-casework");
}

TEST_CASE("case guard CLI: the readable output lists the warnings under a heading") {
  const CliRun result = run("evaluate " + warned_case_path());
  REQUIRE(result.exit_code == 0);
  const auto heading = result.out.find("\nWarnings (2):\n");
  REQUIRE(heading != std::string::npos);
  CHECK(result.out.find("[complementary-probabilities] A, p_given_hp:", heading) != std::string::npos);
  CHECK(result.out.find("[prior-in-casework] priors:", heading) != std::string::npos);
}

TEST_CASE("case guard CLI: validate prints the warnings and still exits 0") {
  const CliRun result = run("validate " + warned_case_path());
  CHECK(result.exit_code == 0);
  CHECK(result.out.find("valid (1 item)") != std::string::npos);
  CHECK(result.out.find("[prior-in-casework]") != std::string::npos);
}

TEST_CASE("case guard CLI: the demo cases give only their expected warnings") {
  for (const auto& [name, want] : expected_demo_warnings()) {
    const std::string path = "'" + (std::filesystem::path(COUNTERPOISE_DEMO_DIR) / name).string() + "'";
    const CliRun result = run("evaluate --json " + path);
    REQUIRE(result.exit_code == 0);
    std::vector<std::string> got;
    const json document = json::parse(result.out);
    for (const auto& w : document.at("warnings"))
      got.push_back(w.at("item").get<std::string>() + "/" + w.at("rule").get<std::string>());
    INFO(name);
    CHECK(got == want);
    const CliRun readable = run("evaluate " + path);
    const std::string heading = want.empty() ? "\nWarnings: none\n" : "\nWarnings (" + std::to_string(want.size()) + "):\n";
    CHECK(readable.out.find(heading) != std::string::npos);
  }
}

// A laboratory rule file named by the case applies to the command line's warnings; a rule file
// that is not valid makes validate fail with a message naming the guard section's field.
TEST_CASE("case guard CLI: the case's own rule file gives its warnings, a broken one is an error naming guard.rules") {
  const auto dir = std::filesystem::temp_directory_path() / ("counterpoise-case-guard-cli-rules-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  // An invented house rule of the laboratory, in the rule-file format of docs/reasoning-guard.md.
  std::ofstream(dir / "lab.json") << R"({"format": "counterpoise-wording-rules", "version": 1,
    "families": [{"id": "lab-house-style", "name": "house style"}],
    "rules": [{"id": "LAB-01", "family": "lab-house-style", "severity": "warning", "pattern": "positive identification",
               "explanation": "The laboratory does not report identifications.", "suggestion": "Say how much more probable."}]})";
  std::ofstream(dir / "broken.json") << R"({"format": "counterpoise-wording-rules", "version": 1, "rules": [{"id": "X"}]})";
  const auto write_case = [&](const std::string& rules) {
    std::ofstream(dir / "case.json") << R"({ "format": "counterpoise.case", "version": 1,
      "case": { "reference": "VFL-GUARD-CLI-2" },
      "propositions": { "level": "source", "hp": "The mark was made by the recovered shoe", "hd": "The mark was made by another shoe" },
      "items": [ { "id": "S1", "model": "assigned", "p_given_hp": 0.7, "p_given_hd": 0.01,
                   "description": "The comparison gave a positive identification of the shoe." } ],
      "guard": { "rules": [")" + rules + R"("] } })";
    return "'" + (dir / "case.json").string() + "'";
  };
  const CliRun lab = run("evaluate --json " + write_case("lab.json"));
  REQUIRE(lab.exit_code == 0);
  const json evaluated = json::parse(lab.out);
  bool found = false;
  for (const auto& w : evaluated.at("warnings"))
    if (w.at("rule") == "wording:LAB-01" && w.at("item") == "S1") found = true;
  CHECK(found);

  const CliRun broken = run_cli("validate " + write_case("broken.json"), dir / "validate-output.txt", /*with_errors=*/true);
  CHECK(broken.exit_code == 1);
  INFO(broken.out);
  CHECK(broken.out.find("item guard, field rules[0]") != std::string::npos);
  CHECK(broken.out.find("broken.json") != std::string::npos);
  std::filesystem::remove_all(dir);
}
