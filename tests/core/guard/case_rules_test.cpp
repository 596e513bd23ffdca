// A case's own wording rules (core/guard/case_rules.hpp): the files named by the case's `guard`
// section are read with the case and checked after the shipped rules, every error names the
// `guard` field, and a report names the files it was checked with by their SHA-256.
#include <catch2/catch.hpp>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>

#include "core/guard/case_guard.hpp"
#include "core/guard/case_rules.hpp"
#include "core/interchange/case_json.hpp"
#include "core/platform/sha256.hpp"
#include "core/reading/text_file.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

const std::filesystem::path& folder() {
  static const std::filesystem::path dir = [] {
    auto d = std::filesystem::temp_directory_path() / ("counterpoise-case-rules-" + std::to_string(::getpid()));
    std::filesystem::create_directories(d);
    return d;
  }();
  return dir;
}

void write(const std::string& name, const std::string& text) { std::ofstream(folder() / name, std::ios::binary) << text; }

// A laboratory's house rule, in the rule-file format of docs/reasoning-guard.md (invented for
// this test: the phrase is the lab's choice, not a rule of the trade).
const char* kLabRules = R"({
  "format": "counterpoise-wording-rules", "version": 1,
  "families": [{"id": "lab-house-style", "name": "house style"}],
  "rules": [{"id": "LAB-01", "family": "lab-house-style", "severity": "warning", "pattern": "positive identification",
             "explanation": "The laboratory does not report identifications.",
             "suggestion": "The findings are [N] times more probable if [Hp] than if [Hd]."}]
})";

json case_with(const json& guard_section) {
  json document = json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-RULES-1", "title": "Harwick Vale test case" },
    "propositions": { "level": "source", "hp": "The mark was made by the recovered shoe",
                      "hd": "The mark was made by some other shoe" },
    "items": [ { "id": "S1", "model": "assigned", "p_given_hp": 0.7, "p_given_hd": 0.01,
                 "description": "The comparison gave a positive identification of the shoe." } ] })");
  document["guard"] = guard_section;
  return document;
}

interchange::CaseReadResult read(const json& document) { return interchange::read_case(document, folder()); }

std::string first_field(const interchange::CaseReadResult& result) {
  REQUIRE_FALSE(result.diagnostics.empty());
  const auto& p = result.diagnostics.problems().front();
  return p.where.item + "." + p.where.field;
}

bool has_rule(const std::vector<guard::CaseWarning>& warnings, const std::string& rule) {
  for (const auto& w : warnings)
    if (w.rule == rule) return true;
  return false;
}

}  // namespace

TEST_CASE("the case's rule file is read with the case and checked after the shipped rules", "[guard][case-rules]") {
  write("lab-rules.json", kLabRules);
  const auto result = read(case_with({{"rules", {"lab-rules.json"}}}));
  REQUIRE(result.value);
  REQUIRE(result.value->guard_rule_files.size() == 1);
  CHECK(result.value->guard_rule_files[0].use.name == "lab-rules.json");
  CHECK(result.value->guard_rule_files[0].use.field == "rules[0]");

  const auto checker = guard::checker_for_case(*result.value);
  CHECK(has_rule(guard::check_case(*result.value, checker), "wording:LAB-01"));
  // The shipped rules alone do not flag the phrase: the warning is the lab's rule at work.
  CHECK_FALSE(has_rule(guard::check_case(*result.value, guard::WordingChecker::load_default()), "wording:LAB-01"));
  CHECK(checker.rules().rules().size() == guard::WordingChecker::load_default().rules().rules().size() + 1);

  const std::string description = guard::rules_description(checker, result.value->guard_rule_files);
  CHECK(description.find("lab-rules.json (SHA-256 " + result.value->guard_rule_files[0].use.sha256 + ")") != std::string::npos);
  // A single name is accepted as well as a list, and the section round-trips as written.
  const auto single = read(case_with({{"rules", "lab-rules.json"}}));
  REQUIRE(single.value);
  CHECK(single.value->guard_rule_files.size() == 1);
  CHECK(interchange::write_case(*single.value)["guard"] == json({{"rules", "lab-rules.json"}}));
}

TEST_CASE("without a guard section the case uses the shipped rules", "[guard][case-rules]") {
  auto document = case_with(json::object());
  document.erase("guard");
  const auto result = read(document);
  REQUIRE(result.value);
  CHECK(result.value->guard_rule_files.empty());
  const std::string description = guard::rules_description(guard::checker_for_case(*result.value), {});
  CHECK(description.rfind("the reasoning guard's shipped rules (", 0) == 0);
  // The learned reading is named with the digest of the file it was read from.
  CHECK(description.find("learned reading") != std::string::npos);
  CHECK(description.find(counterpoise::platform::sha256_hex(counterpoise::reading::read_text_file(
            guard::default_wording_model_path(), {"model", ""}))) != std::string::npos);
}

TEST_CASE("every problem of the guard section names its field", "[guard][case-rules][errors]") {
  write("lab-rules.json", kLabRules);
  CHECK(first_field(read(case_with({{"rules", 3}}))) == "guard.rules");
  CHECK(first_field(read(case_with({{"rules", {""}}}))) == "guard.rules[0]");
  CHECK(first_field(read(case_with({{"rules", {"lab-rules.json", "lab-rules.json"}}}))) == "guard.rules[1]");
  CHECK(first_field(read(case_with({{"rules", {"missing.json"}}}))) == "guard.rules[0]");
  CHECK(first_field(read(case_with({{"overrides", {}}}))) == "guard.overrides");
  CHECK(first_field(read(case_with(json::array()))) == "guard.");

  // A file that reads but is not a valid rule file is refused when the checker is built.
  write("broken-rules.json", R"({"format": "counterpoise-wording-rules", "version": 1,
    "rules": [{"id": "LAB-02", "family": "no-such-family", "severity": "warning", "pattern": "match",
               "explanation": "x", "suggestion": "y"}]})");
  const auto result = read(case_with({{"rules", {"lab-rules.json", "broken-rules.json"}}}));
  REQUIRE(result.value);
  try {
    guard::checker_for_case(*result.value);
    FAIL("no error");
  } catch (const validation::InvalidValue& error) {
    CHECK(error.where().item == "guard");
    CHECK(error.where().field == "rules[1]");
    CHECK(std::string(error.what()).find("broken-rules.json") != std::string::npos);
  }
}
