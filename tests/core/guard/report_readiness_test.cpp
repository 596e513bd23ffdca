// Whether the wording check will let a report be issued (core/guard/report_readiness.hpp): what a
// flagged statement does in each kind of text and mode, which of the case's texts a report
// prints, and the statements that will make `report` refuse — the decision `validate` shares.
// The rule follows docs/report.md ("Wording check and overrides"): the scientist does not state
// the probability of a proposition in a casework report (ENFSI 2015, Guideline for Evaluative
// Reporting in Forensic Science), so such a statement stops the report unless the examiner keeps
// it with a recorded reason.
#include <catch2/catch.hpp>

#include <string>
#include <tuple>
#include <utility>
#include <vector>

#include "core/guard/report_readiness.hpp"
#include "core/interchange/case_json.hpp"
#include "core/validation/input_error.hpp"
#include "guard_test_support.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

// A transposed conditional (the corpus family "transposed-conditional"): the probability of an
// activity stated as if it were the scientist's finding.
const char* kFlagged = "There is a 99.9% probability that Mr Brennan broke the window at 14 Mill Lane.";

json base_case() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1, "mode": "casework",
    "case": { "reference": "VFL-READY-1", "title": "Harwick Vale glass", "examiner": "Dr Ada Penhallow",
              "purpose": "To help address whether Mr Brennan broke the window" },
    "propositions": { "level": "activity", "hp": "Mr Brennan broke the window at 14 Mill Lane",
                      "hd": "Mr Brennan was not present when the window was broken",
                      "conditioning_information": "Mr Brennan was arrested two hours after the break-in",
                      "assumptions": ["The jacket was not worn by anyone else"] },
    "items": [
      { "id": "E1", "title": "Glass on the jacket", "model": "reported-lr", "lr": 300,
        "description": "Fifteen fragments of glass on the jacket", "notes": "Recovered by tape lifting",
        "combination": { "independence": "The glass and the fibres were transferred by different actions" } },
      { "id": "E2", "model": "reported-lr", "lr": 20, "source_data": "Fibre survey of 2024",
        "combination": { "independence": "See E1" } },
      { "id": "E3", "model": "reported-lr", "lr": 2,
        "combination": { "included": false, "exclusion_reason": "The paint findings duplicate E1" } }
    ] })");
}

casefile::Case read(const json& document) {
  auto result = interchange::read_case(document, ".");
  INFO(result.diagnostics.problems().size() << " problem(s) reading the test case");
  REQUIRE(result.value);
  return std::move(*result.value);
}

std::vector<guard::RefusingStatement> refusing(const json& document, guard::CheckMode mode = guard::CheckMode::casework) {
  return guard::statements_refusing_report(read(document), default_checker(), mode);
}

const guard::TextOrigin kUserNotes{true, "E1", "notes"};
const guard::TextOrigin kProgramText{false, "E1", ""};

}  // namespace

TEST_CASE("report readiness: a flag in the program's own text always refuses, even against an override for any text") {
  const std::vector<guard::WordingOverride> any{{"TC-01", "*", "kept"}};
  for (const auto mode : {guard::CheckMode::casework, guard::CheckMode::training})
    CHECK(guard::flag_outcome(kProgramText, "TC-01", mode, any) == guard::FlagOutcome::refuses);
}

TEST_CASE("report readiness: a flag in the user's text refuses in casework, is kept in training, and stands with an override") {
  using guard::CheckMode;
  using guard::FlagOutcome;
  CHECK(guard::flag_outcome(kUserNotes, "TC-01", CheckMode::casework, {}) == FlagOutcome::refuses);
  CHECK(guard::flag_outcome(kUserNotes, "TC-01", CheckMode::training, {}) == FlagOutcome::kept_for_training);
  for (const std::string item : {"E1", "*"}) {
    const std::vector<guard::WordingOverride> overrides{{"TC-01", item, "quoted from the request"}};
    CHECK(guard::flag_outcome(kUserNotes, "TC-01", CheckMode::casework, overrides) == FlagOutcome::overridden);
    CHECK(guard::matching_override("TC-01", "E1", overrides) == &overrides[0]);
  }
  // An override for another item or another rule does not apply.
  const std::vector<guard::WordingOverride> elsewhere{{"TC-01", "E2", "x"}, {"SP-01", "E1", "x"}};
  CHECK(guard::flag_outcome(kUserNotes, "TC-01", CheckMode::casework, elsewhere) == FlagOutcome::refuses);
  CHECK(guard::matching_override("TC-01", "E1", elsewhere) == nullptr);
}

TEST_CASE("report readiness: the user's text ends with a full stop as the report prints it") {
  CHECK(guard::as_report_sentence("The glass came from the window") == "The glass came from the window.");
  CHECK(guard::as_report_sentence("The glass came from the window. \n") == "The glass came from the window.");
  CHECK(guard::as_report_sentence("Was the window broken?") == "Was the window broken?");
  CHECK(guard::as_report_sentence("") == "");
}

TEST_CASE("report readiness: the case's texts a report prints, in reading order") {
  std::vector<std::string> places;
  for (const auto& t : guard::report_user_texts(read(base_case()))) {
    CHECK(t.origin.from_user);
    places.push_back(t.origin.item + "/" + t.origin.field);
  }
  // The title, reference and examiner are printed as written; the laboratory, date and
  // requester are not recorded here. E3 is left out of the combination, so its reason is printed
  // and its independence is not; E1 and E2 are multiplied, so theirs are.
  const std::vector<std::string> want = {
      "case/title", "case/reference", "case/examiner", "case/purpose", "propositions/hp", "propositions/hd",
      "propositions/conditioning_information", "propositions/assumptions[0]", "E1/title", "E1/description",
      "E1/notes", "E2/source_data", "E3/combination.exclusion_reason", "E1/combination.independence",
      "E2/combination.independence"};
  CHECK(places == want);
  const auto texts = guard::report_user_texts(read(base_case()));
  CHECK(texts[3].text == "To help address whether Mr Brennan broke the window.");
}

TEST_CASE("report readiness: one combined item prints no independence statement, an untitled case prints its reference as title") {
  auto document = base_case();
  document["items"].erase(1);
  document["case"].erase("title");
  const auto texts = guard::report_user_texts(read(document));
  CHECK(texts[0].origin.field == "title");
  CHECK(texts[0].text == "VFL-READY-1");
  for (const auto& t : texts) CHECK(t.origin.field != "combination.independence");
}

TEST_CASE("report readiness: a clean case has nothing that refuses the report") {
  CHECK(refusing(base_case()).empty());
}

TEST_CASE("report readiness: a flagged statement in a note, a title or a proposition's assumption is named with its item and field") {
  for (const auto& [pointer, item, field] :
       std::vector<std::tuple<std::string, std::string, std::string>>{{"/items/0/notes", "E1", "notes"},
                                                                       {"/items/0/title", "E1", "title"},
                                                                       {"/propositions/assumptions/0", "propositions", "assumptions[0]"}}) {
    auto document = base_case();
    document[json::json_pointer(pointer)] = kFlagged;
    const auto found = refusing(document);
    INFO(pointer);
    REQUIRE(found.size() == 1);
    CHECK(found[0].item == item);
    CHECK(found[0].field == field);
    CHECK(found[0].sentence == kFlagged);
    CHECK_FALSE(found[0].rule_id.empty());
    const std::string line = guard::describe_refusing_statement(guard::user_text_place(item, field), found[0]);
    CHECK(line.rfind("item " + item + ", field " + field + ": rule " + found[0].rule_id, 0) == 0);
    CHECK(line.find(kFlagged) != std::string::npos);
  }
}

TEST_CASE("report readiness: an override, training mode or a case left in training lets the statement stand") {
  auto document = base_case();
  document["items"][0]["notes"] = kFlagged;
  const std::string rule = refusing(document).at(0).rule_id;
  CHECK(refusing(document, guard::CheckMode::training).empty());

  auto overridden = document;
  overridden["report"] = {{"wording_overrides", {{{"rule", rule}, {"item", "E1"}, {"reason", "quoted from the request"}}}}};
  CHECK(refusing(overridden).empty());

  auto training = document;
  training["mode"] = "training";
  CHECK(guard::default_report_mode(read(training)) == guard::CheckMode::training);
  CHECK(guard::default_report_mode(read(document)) == guard::CheckMode::casework);
}

TEST_CASE("report readiness: invalid overrides are an error naming the report section's field") {
  const auto message_for = [](const json& report) {
    auto document = base_case();
    document["report"] = report;
    try {
      (void)refusing(document);
    } catch (const validation::InvalidValue& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  CHECK(message_for(json::array()).find("item report") != std::string::npos);
  CHECK(message_for({{"wording_overrides", 3}}).find("field wording_overrides") != std::string::npos);
  CHECK(message_for({{"wording_overrides", {{{"rule", "TC-01"}, {"item", "E1"}}}}}).find("wording_overrides[0]") !=
        std::string::npos);
  CHECK(message_for({{"wording_overrides", {{{"rule", "TC-01"}, {"item", "E9"}, {"reason", "x"}}}}}).find("E9") !=
        std::string::npos);
  CHECK(message_for({{"wording_overrides", {{{"rule", "TC-01"}, {"item", "E1"}, {"reason", " "}}}}}).find("must not be empty") !=
        std::string::npos);
}

TEST_CASE("report readiness: text that is not well-formed UTF-8 is an error, as in the checker") {
  auto case_value = read(base_case());
  case_value.items[0].notes = std::string("Glass \xC0\xAF on the jacket");
  CHECK_THROWS_AS(guard::statements_refusing_report(case_value, default_checker(), guard::CheckMode::casework),
                  validation::InvalidValue);
}
