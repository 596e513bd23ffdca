// Rule files: every error documented on WordingRuleSet::add_json_text and compile_pattern has a
// throw test naming the rule (or class) and the field; lab extension by id (common practice for
// layered configuration: a later file overrides an earlier one by key).
#include <catch2/catch.hpp>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <string>

#include <nlohmann/json.hpp>

#include "core/guard/wording_checker.hpp"
#include "core/guard/wording_rules.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise::guard;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using counterpoise::validation::UnsupportedFormat;
using nlohmann::json;

namespace {

json minimal_file() {
  return json::parse(R"({
    "format": "counterpoise-wording-rules", "version": 1,
    "families": [{"id": "fam", "name": "a family", "published_name": "its name", "source": "somebody 2000"}],
    "classes": {"chance-word": ["chance", "probability"], "claim": ["{be} the source"], "be": ["is", "was"]},
    "reporting_cues": ["wrong to say"],
    "rules": [{"id": "R1", "family": "fam", "severity": "error", "pattern": "{chance-word} that ...0-3 {claim}",
               "explanation": "why", "suggestion": "The findings are [N] times more probable if [Hp] than if [Hd]."}]
  })");
}

// Loads `file` and returns the InvalidValue it throws (fails when it does not throw).
InvalidValue invalid(const json& file) {
  WordingRuleSet set;
  try {
    set.add_json_text(file.dump(), "test.json");
  } catch (const InvalidValue& e) {
    return e;
  }
  FAIL("no InvalidValue for " << file.dump());
  throw;
}

json with_rule(const char* key, json value) {
  json f = minimal_file();
  f["rules"][0][key] = std::move(value);
  return f;
}

}  // namespace

TEST_CASE("rule file: the minimal file loads") {
  WordingRuleSet set;
  set.add_json_text(minimal_file().dump(), "test.json");
  REQUIRE(set.rules().size() == 1);
  CHECK(set.rules()[0].origin == "test.json");
  CHECK(set.family("fam").published_name == "its name");
}

TEST_CASE("rule file: file-level errors") {
  WordingRuleSet set;
  CHECK_THROWS_AS(set.add_json_text("{not json", "t.json"), InvalidValue);
  json f = minimal_file();
  f.erase("format");
  CHECK_THROWS_AS(set.add_json_text(f.dump(), "t.json"), UnsupportedFormat);
  f["format"] = "some-other-format";
  CHECK_THROWS_AS(set.add_json_text(f.dump(), "t.json"), UnsupportedFormat);
  f = minimal_file();
  f["version"] = 2;
  CHECK_THROWS_AS(set.add_json_text(f.dump(), "t.json"), UnsupportedFormat);
  f = minimal_file();
  f["rulez"] = json::array();
  CHECK(invalid(f).where().field == "rulez");
  CHECK_THROWS_AS(set.add_file("/nonexistent/wording-rules.json"), FileError);
}

TEST_CASE("rule file: each rule field error names the rule and the field") {
  struct Row {
    const char* key;
    json value;
    const char* field;
  };
  const Row rows[] = {
      {"family", "nope", "family"},
      {"family", "", "family"},
      {"severity", "fatal", "severity"},
      {"severity", 3, "severity"},
      {"modes", json::array(), "modes"},
      {"modes", json::array({"court"}), "modes"},
      {"pattern", "", "pattern"},
      {"pattern", "{unknown-class} that", "pattern"},
      {"explanation", "  ", "explanation"},
      {"suggestion", "use [X] instead", "suggestion"},
      {"suggestion", "unclosed [Hp", "suggestion"},
      {"enabled", "yes", "enabled"},
      {"requires", json::array({"{nope}"}), "requires[0]"},
      {"unless", json::array({"..."}), "unless[0]"},
      {"colour", "red", "colour"},
  };
  for (const auto& row : rows) {
    INFO(row.key << " = " << row.value.dump());
    const InvalidValue e = invalid(with_rule(row.key, row.value));
    CHECK(e.where().item == "rule R1");
    CHECK(e.where().field == row.field);
  }
  for (const char* key : {"family", "severity", "pattern", "explanation", "suggestion"}) {
    INFO("missing " << key);
    json f = minimal_file();
    f["rules"][0].erase(key);
    const InvalidValue e = invalid(f);
    CHECK(e.where().item == "rule R1");
    CHECK(e.where().field == key);
  }
  json f = minimal_file();
  f["rules"][0].erase("id");
  CHECK(invalid(f).where().item == "rules[0]");
  CHECK(invalid(f).where().field == "id");
  f = minimal_file();
  f["rules"].push_back(f["rules"][0]);
  CHECK(invalid(f).where().field == "id");  // the same id twice in one file
  CHECK(std::string(invalid(f).what()).find("used twice") != std::string::npos);
}

TEST_CASE("rule file: pattern syntax errors") {
  const char* bad[] = {
      "{chance-word",            // unclosed brace
      "chance-word}",            // stray closing brace
      "{} that",                 // empty class name
      "chance||probability",     // empty alternative
      "chance ... source",       // gap without bound
      "chance ...5-2 source",    // lower above upper
      "chance ...21 source",     // above the maximum
      "chance ...x source",      // not a number
      "chance ...3? source",     // an optional gap
      "...2 chance",             // leading gap
      "chance ...2",             // trailing gap
      "chance? source?",         // every element optional
      "came-from",               // a literal of two tokens
      "chance ...3! source",     // nothing after '!'
      "1,000 times",             // a number is not a literal (use {number})
      "chance the+...2",         // a phrase holding a gap
  };
  for (const char* pattern : bad) {
    INFO(pattern);
    const InvalidValue e = invalid(with_rule("pattern", pattern));
    CHECK(e.where().item == "rule R1");
    CHECK(e.where().field == "pattern");
  }
}

TEST_CASE("rule file: class and cue errors") {
  json f = minimal_file();
  f["classes"]["empty"] = json::array();
  CHECK(invalid(f).where().item == "class empty");
  f = minimal_file();
  f["classes"]["Bad Name"] = json::array({"x"});
  CHECK(invalid(f).where().item == "class Bad Name");
  f = minimal_file();
  f["classes"]["number"] = json::array({"x"});  // built-in
  CHECK(invalid(f).where().item == "class number");
  f = minimal_file();
  f["classes"]["a"] = json::array({"x {b}"});
  f["classes"]["b"] = json::array({"y {a}"});
  CHECK(std::string(invalid(f).what()).find("cycle") != std::string::npos);
  f = minimal_file();
  f["classes"]["a"] = json::array({"x {missing}"});
  CHECK(invalid(f).where().item == "class a");
  f = minimal_file();
  f["classes"]["a"] = json::object({{"extend", json::array({"x"})}});
  CHECK(invalid(f).where().field == "extend");
  f = minimal_file();
  f["reporting_cues"] = json::array({"wrong to", "{nope}"});
  CHECK(invalid(f).where().item == "reporting_cues");
  CHECK(invalid(f).where().field == "[1]");
  f = minimal_file();
  f["families"][0].erase("name");
  CHECK(invalid(f).where().item == "family fam");
}

TEST_CASE("rule file: a failed file leaves the set as it was") {
  WordingRuleSet set;
  set.add_json_text(minimal_file().dump(), "base.json");
  json lab = minimal_file();
  lab["rules"][0]["severity"] = "advice";
  lab["rules"].push_back(lab["rules"][0]);
  lab["rules"][1]["id"] = "R2";
  lab["rules"][1]["pattern"] = "{nope}";
  CHECK_THROWS_AS(set.add_json_text(lab.dump(), "lab.json"), InvalidValue);
  REQUIRE(set.rules().size() == 1);
  CHECK(set.rules()[0].severity == Severity::error);
}

TEST_CASE("rule file: a lab file overrides, disables, extends and adds") {
  WordingRuleSet set;
  set.add_json_text(minimal_file().dump(), "base.json");
  const json lab = json::parse(R"({
    "format": "counterpoise-wording-rules", "version": 1,
    "families": [{"id": "local", "name": "a lab's own family"}],
    "classes": {"chance-word": {"add": ["likelihood"]}},
    "rules": [
      {"id": "R1", "enabled": false},
      {"id": "L1", "family": "local", "severity": "warning", "pattern": "{chance-word} that ...0-3 {claim}",
       "explanation": "lab rule", "suggestion": "say it differently"}
    ]})");
  set.add_json_text(lab.dump(), "lab.json");
  REQUIRE(set.rules().size() == 2);
  CHECK_FALSE(set.rules()[0].enabled);
  CHECK(set.rules()[1].origin == "lab.json");
  CHECK(set.classes().at("chance-word").members.size() == 3);

  WordingChecker checker(set);
  const auto findings = checker.check("The likelihood that he is the source is small.");
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].rule_id == "L1");  // R1 is switched off, "likelihood" came from the extension

  json replace = minimal_file();
  replace["rules"][0]["severity"] = "advice";
  checker.add_rules_from_json_text(replace.dump(), "lab2.json");
  REQUIRE(checker.rules().rules().size() == 2);
  CHECK(checker.rules().rules()[0].severity == Severity::advice);
  CHECK(checker.rules().rules()[0].enabled);  // a full rule replaces the switched-off one
}

TEST_CASE("rule file: a lab file on disk via add_rules_from_file replaces the wording of a claim by id") {
  const auto path = std::filesystem::temp_directory_path() / ("counterpoise-guard-lab-rules-" + std::to_string(::getpid()) + ".json");
  json lab = minimal_file();
  lab.erase("families");
  lab.erase("classes");
  lab.erase("reporting_cues");
  lab.erase("rules");
  lab["claims"] = json::array({{{"id", "CL-SP"}, {"family", "source-probability"}, {"severity", "error"},
                                {"explanation", "lab wording"}, {"suggestion", "Say how probable the findings are if [Hp]."}}});
  std::ofstream(path) << lab.dump();
  WordingChecker checker = WordingChecker::load_default();
  const auto before = checker.rules().claims().size();
  checker.add_rules_from_file(path);
  std::filesystem::remove(path);
  CHECK(checker.rules().claims().size() == before);  // replaced, not added
  const auto findings = checker.check("The chance that he left the stain is 1 in 1,000.");
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].rule_id == "CL-SP");
  CHECK(findings[0].explanation == "lab wording");
}

TEST_CASE("rule file: a claim wording with an unknown family or placeholder is an error naming the claim") {
  WordingRuleSet set = WordingRuleSet();
  set.add_file(default_wording_rules_path());
  json bad = minimal_file();
  bad.erase("rules");
  bad["claims"] = json::array({{{"id", "CL-X"}, {"family", "no-such-family"}, {"severity", "error"},
                                {"explanation", "e"}, {"suggestion", "s"}}});
  try {
    set.add_json_text(bad.dump(), "lab.json");
    FAIL("no error");
  } catch (const counterpoise::validation::InvalidValue& e) {
    CHECK(e.where().item == "claim CL-X");
    CHECK(e.where().field == "family");
  }
  bad["claims"][0]["family"] = "source-probability";
  bad["claims"][0]["suggestion"] = "[Hx]";
  CHECK_THROWS_AS(set.add_json_text(bad.dump(), "lab.json"), counterpoise::validation::InvalidValue);
}
