// The report of a case with several alternatives to Hp: the propositions say how many there are,
// one evaluation sentence per alternative in the conditional form naming it, the LR against the
// weighted set with the weights stated as the court's, and the illustration over the set; a
// two-proposition case has no such section.
#include <catch2/catch.hpp>
#include <cmath>

#include "core/evaluation/case_evaluation.hpp"
#include "core/numbers/number_text.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

namespace {

bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

ReportModel glass_alternatives(ReportMode mode) {
  const auto value = load_case(demo_dir() / "harwick-vale-glass-alternatives.json");
  return build_report_model(value, evaluation::evaluate_case(value), mode);
}

}  // namespace

TEST_CASE("alternatives: one conditional sentence per alternative, the set with the court's weights") {
  const auto value = load_case(demo_dir() / "harwick-vale-glass-alternatives.json");
  const auto result = evaluation::evaluate_case(value);
  const auto model = build_report_model(value, result, ReportMode::casework);
  REQUIRE(model.find("alternatives"));
  const std::string text = section_text(model, "alternatives");
  for (const auto& a : result.combined.by_alternative) {
    CAPTURE(a.id);
    CHECK(contains(text, "times more probable if Hp is true than if " + a.id + " is true"));
    CHECK(contains(text, a.verbal.label));
  }
  CHECK(contains(text, "The court's relative prior weights for the alternatives, as stated to the laboratory, are "
                       "Hd1 0.6, Hd2 0.3 and Hd3 0.1 (normalised to sum to 1)"));
  CHECK(contains(text, "than if one of the alternatives, in those proportions, is true"));
  CHECK(contains(text, "Without the alternatives about which nothing is known"));
  CHECK(contains(text, "No interval is given for the value against the set"));
  CHECK(contains(text, "Illustration only"));
  const std::string propositions = section_text(model, "propositions");
  CHECK(contains(propositions, "against Hp and 3 alternatives to it, which exclude each other (Hd1, Hd2 and Hd3)"));
}

TEST_CASE("alternatives: the table over the set holds each proposition's posterior for each prior") {
  const auto value = load_case(demo_dir() / "harwick-vale-glass-alternatives.json");
  const auto result = evaluation::evaluate_case(value);
  const auto model = build_report_model(value, result, ReportMode::training);
  const Section* s = model.find("alternatives");
  REQUIRE(s);
  const Table* table = nullptr;
  for (const auto& block : s->blocks)
    if (const auto* t = std::get_if<Table>(&block)) table = t;
  REQUIRE(table);
  CHECK(table->header.size() == 5);
  CHECK(table->header.back() == "Then P(Hd3|E)");
  REQUIRE(table->rows.size() == result.over_set.size());
  CHECK(table->rows[0][1] == numbers::posterior_for_readers(result.over_set[0].posteriors[0]));
}

TEST_CASE("alternatives: a two-proposition case has no section on alternatives and its propositions read as before") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  CHECK_FALSE(model.find("alternatives"));
  CHECK(contains(section_text(model, "propositions"), "evaluated against two propositions, considered as alternatives"));
  CHECK(glass_alternatives(ReportMode::training).find("alternatives"));
}
