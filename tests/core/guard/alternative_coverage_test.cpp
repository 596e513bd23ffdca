// Which alternatives a text weighs the findings against (core/guard/alternative_coverage.hpp), and
// the case guard's warning when a case has several and a text names one, or none, or "Hd".
// The principle checked: a likelihood ratio is a weight of the findings for one proposition against
// another, and with several alternatives it can differ by orders of magnitude between them, so a
// statement of weight must say which alternative it was made against (ENFSI 2015, Guideline for
// Evaluative Reporting in Forensic Science, propositions as pairs; from memory); the wordings
// below are invented for this test.
#include <catch2/catch.hpp>

#include <algorithm>
#include <string>
#include <vector>

#include "core/guard/alternative_coverage.hpp"
#include "core/guard/case_guard.hpp"
#include "core/interchange/case_json.hpp"
#include "guard_test_support.hpp"

using namespace counterpoise;
using guard::alternative_coverage;
using guard::alternative_coverage_problem;
using nlohmann::json;

namespace {

std::vector<casefile::Alternative> three_alternatives() {
  return {{"Hd1", "The stain came from an unknown person unrelated to Mr Oakes", std::nullopt, std::nullopt},
          {"Hd2", "The stain came from a brother of Mr Oakes", std::nullopt, std::nullopt},
          {"Hd3", "The stain came from a cousin of Mr Oakes", std::nullopt, std::nullopt}};
}

std::string problem_of(const std::string& text) {
  const auto alternatives = three_alternatives();
  return alternative_coverage_problem(alternative_coverage(text, alternatives), alternatives);
}

// An invented stain case with two alternatives (a stranger, a brother) and one assigned item
// S1 whose description and notes are given.
json marrow_lane_case(const std::string& description, const std::string& notes) {
  json doc = json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-ALT-1", "title": "Marrow Lane stain" },
    "propositions": { "level": "sub-source",
      "hp": "The stain came from Mr Oakes",
      "alternatives": [
        { "id": "Hd1", "text": "The stain came from an unknown person unrelated to Mr Oakes" },
        { "id": "Hd2", "text": "The stain came from a brother of Mr Oakes" } ] },
    "items": [ { "id": "S1", "model": "assigned", "p_given": { "Hp": 0.9, "Hd1": 0.0009, "Hd2": 0.05 } } ] })");
  doc["items"][0]["description"] = description;
  if (!notes.empty()) doc["items"][0]["notes"] = notes;
  return doc;
}

}  // namespace

TEST_CASE("alternative coverage: a weighing sentence naming one alternative of three names the other two") {
  const std::string problem = problem_of(
      "The findings are about 10,000 times more probable if the stain came from Mr Oakes than if Hd1 is true.");
  CHECK(problem.find("against Hd1") != std::string::npos);
  CHECK(problem.find("Hd2 (\"The stain came from a brother of Mr Oakes\")") != std::string::npos);
  CHECK(problem.find("Hd3") != std::string::npos);
}

TEST_CASE("alternative coverage: an alternative named by its whole text counts as named") {
  const auto alternatives = three_alternatives();
  const auto coverage = alternative_coverage(
      "The likelihood ratio is 20 if the stain came from a brother of Mr Oakes rather than from him.", alternatives);
  CHECK(coverage.weighs);
  CHECK(coverage.named == std::vector<std::size_t>{1});
}

TEST_CASE("alternative coverage: Hd or the defence proposition, with several alternatives, is ambiguous") {
  CHECK(problem_of("The findings strongly support Hp rather than Hd.").find("\"Hd\"") != std::string::npos);
  CHECK(problem_of("The results favour the prosecution proposition over the defence proposition.")
            .find("\"the defence proposition\"") != std::string::npos);
  CHECK(problem_of("The findings provide strong support for the proposition that the stain came from Mr Oakes.")
            .find("without naming an alternative") != std::string::npos);
}

TEST_CASE("alternative coverage: each alternative, the weighted set, or all three by name pass") {
  CHECK(problem_of("The findings support Hp against each alternative, most weakly against Hd2.").empty());
  CHECK(problem_of("Against the weighted set the likelihood ratio is about 900.").empty());
  CHECK(problem_of("The likelihood ratio against Hd1 is 1,000,000; against the alternative Hd2, the defence "
                   "proposition of a brother, it is 300; against Hd3 it is 20,000.")
            .empty());
  CHECK(problem_of("The likelihood ratio is 1,000,000 against Hd1. It is 300 against Hd2. "
                   "It is 20,000 against Hd3.")
            .empty());
}

TEST_CASE("alternative coverage: sentences that do not weigh the findings, and cases with one alternative, pass") {
  CHECK(problem_of("Hd1 was put forward by the defence on 3 March.").empty());
  CHECK(problem_of("Hd2 is the defence proposition; the profile was compared with both brothers' references.").empty());
  const std::vector<casefile::Alternative> one = {three_alternatives()[0]};
  CHECK(alternative_coverage_problem(
            alternative_coverage("The findings are 100 times more probable if Hp is true than if Hd is true.", one), one)
            .empty());
}

TEST_CASE("alternative coverage: the case guard warns on an item's text and not on the propositions") {
  json doc = marrow_lane_case("The findings are 1,000 times more probable if the stain came from Mr Oakes than if it "
                              "came from an unknown person (Hd1).",
                              "");
  auto read = interchange::read_case(doc, ".");
  REQUIRE(read.value);
  const auto warnings = guard::check_case(*read.value, default_checker());
  const auto single = std::count_if(warnings.begin(), warnings.end(), [](const guard::CaseWarning& w) {
    return w.rule == guard::case_rules::single_alternative_wording && w.item == "S1" && w.field == "description" &&
           w.message.find("Hd2") != std::string::npos;
  });
  CHECK(single == 1);
  CHECK(std::none_of(warnings.begin(), warnings.end(), [](const guard::CaseWarning& w) {
    return w.rule == guard::case_rules::single_alternative_wording && w.item == "propositions";
  }));
  doc["items"][0]["description"] = "The findings are 1,000 times more probable if the stain came from Mr Oakes than "
                                   "if Hd1 is true, and 18 times more probable than if Hd2 is true.";
  auto both = interchange::read_case(doc, ".");
  REQUIRE(both.value);
  const auto after = guard::check_case(*both.value, default_checker());
  CHECK(std::none_of(after.begin(), after.end(), [](const guard::CaseWarning& w) {
    return w.rule == guard::case_rules::single_alternative_wording;
  }));
}

// The checks without the wording checker (what the editor lists after its own wording findings):
// the same single-alternative warning, and none of the wording checker's.
TEST_CASE("case guard setup checks: the same checks on the case, without the wording findings") {
  const json doc = marrow_lane_case("The stain almost certainly came from Mr Oakes.",
                                    "The findings strongly support Hp rather than Hd.");
  auto read = interchange::read_case(doc, ".");
  REQUIRE(read.value);
  const auto all = guard::check_case(*read.value, default_checker());
  const auto setup = guard::check_case_setup(*read.value);
  const auto is_wording = [](const guard::CaseWarning& w) { return w.rule.rfind("wording:", 0) == 0; };
  CHECK(std::any_of(all.begin(), all.end(), is_wording));  // the description's source probability
  CHECK(std::none_of(setup.begin(), setup.end(), is_wording));
  std::vector<std::string> rules_all, rules_setup;
  for (const auto& w : all)
    if (!is_wording(w) && w.rule != guard::case_rules::value_as_proposition_probability) rules_all.push_back(w.item + "/" + w.rule);
  for (const auto& w : setup) rules_setup.push_back(w.item + "/" + w.rule);
  CHECK(rules_setup == rules_all);
  CHECK(std::count(rules_setup.begin(), rules_setup.end(), "S1/single-alternative-wording") == 1);
}
