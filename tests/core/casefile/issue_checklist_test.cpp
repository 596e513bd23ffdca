// The issue checklist (core/casefile/issue_checklist): what a technical reviewer checks before a
// casework report is issued (common practice: case details, examiner and date stated; every item's
// findings described; every combined item's independence argued — ENFSI 2015, Guideline for
// Evaluative Reporting in Forensic Science, sections on transparency and the report's content,
// from memory for the section numbers).
#include <catch2/catch.hpp>

#include <algorithm>

#include "core/casefile/issue_checklist.hpp"
#include "core/casefile/item_templates.hpp"
#include "core/interchange/case_json.hpp"

using namespace counterpoise;
using casefile::ChecklistPoint;
using nlohmann::json;

namespace {

casefile::Case read(const std::string& details, const std::string& items, const std::string& mode = "casework") {
  const auto result = interchange::read_case(nlohmann::json::parse(R"({"format": "counterpoise.case", "version": 1,
      "case": )" + details + R"(, "mode": ")" + mode + R"(",
      "propositions": {"level": "source", "hp": "The glass came from the window", "hd": "The glass came from another source"},
      "items": )" + items + "}"), ".");
  REQUIRE(result.value);
  return *result.value;
}

const std::string kFullDetails = R"json({"reference": "HV-1", "laboratory": "Vale Forensic Laboratory (fictional)",
    "examiner": "Dr Ada Penhallow", "date": "2026-05-04", "purpose": "To help address where the glass came from."})json";

bool has(const std::vector<ChecklistPoint>& points, const std::string& item, const std::string& field) {
  return std::any_of(points.begin(), points.end(), [&](const auto& p) { return p.item == item && p.field == field; });
}

}  // namespace

TEST_CASE("a complete case has nothing open") {
  const auto value = read(kFullDetails, R"([{"id": "E1", "model": "assigned", "p_given_hp": 0.9, "p_given_hd": 0.1,
      "description": "Twelve fragments of glass on the jacket."}])");
  CHECK(casefile::issue_checklist(value, true).empty());
}

TEST_CASE("missing laboratory, examiner, date and question are each an open point") {
  const auto value = read(R"({"reference": "HV-1"})", R"([{"id": "E1", "model": "assigned", "p_given_hp": 0.9,
      "p_given_hd": 0.1, "description": "Glass."}])");
  const auto points = casefile::issue_checklist(value, true);
  CHECK(has(points, "case", "laboratory"));
  CHECK(has(points, "case", "examiner"));
  CHECK(has(points, "case", "date"));
  CHECK(has(points, "case", "purpose"));
  CHECK_FALSE(casefile::blocks_issuing(points));
}

TEST_CASE("an item without description, at its starting values, or combined without an independence reason") {
  const auto start = casefile::starting_fields("assigned");
  const auto value = read(kFullDetails, R"([{"id": "E1", "model": "assigned", "p_given_hp": )" + start["p_given_hp"].dump() +
                                            R"(, "p_given_hd": )" + start["p_given_hd"].dump() + R"(},
      {"id": "E2", "model": "assigned", "p_given_hp": 0.9, "p_given_hd": 0.1, "description": "Fibres.",
       "combination": {"included": true, "independence": "Different materials examined separately."}}])");
  const auto points = casefile::issue_checklist(value, true);
  CHECK(has(points, "E1", "model"));
  CHECK(has(points, "E1", "description"));
  CHECK(has(points, "E1", "combination.independence"));
  CHECK_FALSE(has(points, "E2", "combination.independence"));
  CHECK_FALSE(has(points, "E2", "model"));
}

TEST_CASE("a training case sent as casework blocks issuing, as a training report it does not") {
  const auto value = read(kFullDetails, R"([{"id": "E1", "model": "assigned", "p_given_hp": 0.9, "p_given_hd": 0.1,
      "description": "Glass."}])", "training");
  CHECK(casefile::blocks_issuing(casefile::issue_checklist(value, true)));
  CHECK(has(casefile::issue_checklist(value, true), "case", "mode"));
  CHECK_FALSE(casefile::blocks_issuing(casefile::issue_checklist(value, false)));
}

TEST_CASE("the sealing explanation says what cannot be changed afterwards") {
  const auto text = casefile::sealing_explanation();
  CHECK(text.find("seal") != std::string::npos);
  CHECK(text.find("SHA-256") != std::string::npos);
  CHECK(text.find("new revision") != std::string::npos);
}

TEST_CASE("a new DNA mixture item reads at its starting fields and is pointed out until filled in") {
  // The starting mixture is the issue's example shape (suspect + victim against victim + 1
  // unknown at one locus): it must read as a valid item and still be flagged for the checklist.
  json item = casefile::starting_fields("dna-mixture");
  item["id"] = "M1";
  item["model"] = "dna-mixture";
  item["description"] = "Mixture.";
  const auto value = read(kFullDetails, json::array({item}).dump());
  REQUIRE(value.items.size() == 1);
  CHECK(value.items[0].model->evaluate().lr.is_finite());
  CHECK(has(casefile::issue_checklist(value, true), "M1", "model"));
}
