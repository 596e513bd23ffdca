// The report of a case with several alternatives to Hp: the propositions say how many there are,
// one evaluation sentence per alternative in the conditional form naming it, the LR against the
// weighted set with the weights stated as the court's, and the illustration over the set; a
// two-proposition case has no such section.
#include <catch2/catch.hpp>
#include <cmath>
#include <string>
#include <vector>

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
  // The value against the set has its interval from joint draws, printed as every interval is.
  REQUIRE(result.combined.compound->spread);
  const auto& spread = *result.combined.compound->spread;
  CHECK(contains(text, numbers::lr_for_readers(result.combined.compound->lr) + " (its 90 % interval " +
                           numbers::magnitude_for_readers(spread.low_log10) + " to " +
                           numbers::magnitude_for_readers(spread.high_log10) + ")"));
  CHECK_FALSE(contains(text, "No interval is given for the value against the set"));
  CHECK(contains(text, "Illustration only"));
  // The evaluation is of Hp against the first alternative, and names it.
  CHECK(contains(section_text(model, "evaluation"), "times more probable if Hp is true than if Hd1 is true"));
  CHECK(contains(section_text(model, "evaluation"), "for Hp rather than Hd1"));
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

TEST_CASE("alternatives: a posterior written as 1 minus a small number in the table over the set carries the caveat") {
  // The DNA demo's relatives: P(Hp|E) reaches 1 − 5.06 × 10⁻¹⁴ over the set, a precision that
  // rests on the model alone (common practice: the same caveat as the prior-odds table's).
  const auto value = load_case(demo_dir() / "harwick-vale-dna.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const Section* s = model.find("alternatives");
  REQUIRE(s);
  bool near_one = false;
  for (const auto& block : s->blocks)
    if (const auto* t = std::get_if<Table>(&block))
      for (const auto& row : t->rows)
        for (const auto& cell : row) near_one = near_one || cell.rfind("1 \u2212", 0) == 0;
  REQUIRE(near_one);
  CHECK(contains(section_text(model, "alternatives"), "Such extreme precision rests entirely on the model"));
  // The paragraph above the table says once that it is an illustration: no paragraph repeats
  // its own bold label as its first word ("Illustration: Illustration only.").
  for (const auto& block : s->blocks)
    if (const auto* p = std::get_if<Paragraph>(&block)) {
      INFO(p->label << ": " << p->text);
      CHECK_FALSE((!p->label.empty() && p->text.rfind(p->label, 0) == 0));
    }
}

TEST_CASE("alternatives: a two-proposition case has no section on alternatives and its propositions read as before") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  CHECK_FALSE(model.find("alternatives"));
  CHECK(contains(section_text(model, "propositions"), "evaluated against two propositions, considered as alternatives"));
  CHECK(glass_alternatives(ReportMode::training).find("alternatives"));
}

// The demo's probabilities, written out from harwick-vale-glass-alternatives.json: the mean of
// Beta(a, b) is a / (a + b); counts k of n are assigned by the rule of succession (k + 1) / (n + 2)
// (Laplace; common practice).
namespace {
const double kHp[2] = {38.0 / 42.0, 0.3};
const double kHd[3][2] = {{5.0 / 62.0, 0.25}, {7.0 / 122.0, 0.2}, {4.0 / 414.0, 0.01}};
const double kWeights[3] = {0.6, 0.3, 0.1};  // 6 : 3 : 1 normalised
}  // namespace

TEST_CASE("alternatives: the propositions print every alternative's text") {
  const auto value = load_case(demo_dir() / "harwick-vale-glass-alternatives.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const std::string text = section_text(model, "propositions");
  for (const auto& a : value.propositions.alternatives) {
    CAPTURE(a.id);
    CHECK(contains(text, a.text));
  }
  CHECK(contains(text, "Hd3 is an alternative about which nothing is known beyond the range of the findings"));
}

TEST_CASE("alternatives: the recomputation gives every item's LR against every alternative, and the value against the set") {
  const auto value = load_case(demo_dir() / "harwick-vale-glass-alternatives.json");
  const auto result = evaluation::evaluate_case(value);
  const auto model = build_report_model(value, result, ReportMode::casework);
  const std::string text = section_text(model, "recomputation");
  const char* ids[3] = {"Hd1", "Hd2", "Hd3"};
  double hp_product = kHp[0] * kHp[1];
  double denominator = 0.0;
  std::string ratios;
  for (int i = 0; i < 3; ++i) {
    CAPTURE(ids[i]);
    // Each item against each alternative: LR = P(E|Hp) / P(E|Hd_i), ending "= LR.".
    for (int k = 0; k < 2; ++k) {
      const auto lr = numbers::LikelihoodRatio::from_log10(std::log10(kHp[k] / kHd[i][k]));
      CHECK(contains(text, "P(E|Hp) / P(E|" + std::string(ids[i]) + ")"));
      CHECK(contains(text, "= " + numbers::lr_for_readers(lr) + "."));
    }
    // The combination against each alternative multiplies the items' LRs.
    const auto combined = numbers::LikelihoodRatio::from_log10(std::log10(hp_product / (kHd[i][0] * kHd[i][1])));
    CHECK(contains(text, "The combined likelihood ratio of Hp against " + std::string(ids[i])));
    CHECK(contains(text, "LR = " + numbers::lr_for_readers(combined) + "."));
    // Each w/LR with the LR to the working precision (6 figures), as the appendix states it.
    ratios += (i ? " + " : "") + numbers::decimal_for_readers(kWeights[i], numbers::kWorkingFigures) + "/" +
              numbers::decimal_for_readers(combined.value(), numbers::kWorkingFigures);
    denominator += kWeights[i] * kHd[i][0] * kHd[i][1];
  }
  // Against the set: P(E|Hp) / sum_i w_i P(E|Hd_i) (Bayes' theorem for exclusive propositions;
  // common practice), from the probabilities themselves.
  const auto compound = numbers::LikelihoodRatio::from_log10(std::log10(hp_product / denominator));
  CHECK(contains(text, "LR = 1 / (" + ratios + ")"));
  CHECK(contains(text, "= " + numbers::lr_for_readers(compound) + "."));
  CHECK(contains(text, "The court's weights, normalised to sum to 1, are Hd1 0.6, Hd2 0.3 and Hd3 0.1."));
}

// The handbag demo's transfer item T1 assumes a transfer of its own under Hd2 (he picked the bag
// up) and none under Hd1: its inputs table names Hd2 beside t0_hd and tn_hd, and the paragraph
// on what the model assumes is given per alternative, since the two differ (Evett 1986, Journal
// of the Forensic Science Society 26:3, for the two-branch denominator the Hd2 part states).
TEST_CASE("alternatives: a transfer item's own transfer under one alternative is named in its table and assumptions") {
  const auto value = load_case(demo_dir() / "harwick-vale-handbag-alternatives.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const Section* findings = model.find("findings");
  REQUIRE(findings);
  int hd_rows = 0;
  std::vector<std::string> assumption_labels;
  for (const auto& block : findings->blocks) {
    if (const auto* table = std::get_if<Table>(&block)) {
      for (const auto& row : table->rows)
        if (!row.empty() && (row[0] == "t0_hd" || row[0] == "tn_hd")) {
          ++hd_rows;
          CHECK(contains(row[1], "if Hd2 is true"));
        }
    }
    if (const auto* p = std::get_if<Paragraph>(&block); p && p->source.item == "T1" &&
                                                         p->source.field == "model assumptions")
      assumption_labels.push_back(p->label);
  }
  CHECK(hd_rows == 2);
  REQUIRE(assumption_labels.size() == 2);
  CHECK(assumption_labels[0] == "What the model assumes, Hp against Hd1");
  CHECK(assumption_labels[1] == "What the model assumes, Hp against Hd2");
}

// When the model assumes the same against every alternative (the handbag demo's transfer item
// without a transfer of its own under Hd2), one paragraph says so, naming every alternative.
TEST_CASE("alternatives: the same assumptions against every alternative are given once, naming them all") {
  auto document = nlohmann::json::parse(read_file(demo_dir() / "harwick-vale-handbag-alternatives.json"));
  for (auto& item : document["items"])
    if (item["id"] == "T1") item["alternatives"] = {{"Hd1", nlohmann::json::object()}, {"Hd2", nlohmann::json::object()}};
  auto read = interchange::read_case(document, demo_dir());
  REQUIRE(read.value);
  const auto& value = *read.value;
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const Section* findings = model.find("findings");
  REQUIRE(findings);
  int paragraphs = 0;
  for (const auto& block : findings->blocks)
    if (const auto* p = std::get_if<Paragraph>(&block); p && p->source.item == "T1" && p->source.field == "model assumptions") {
      ++paragraphs;
      CHECK(p->label == "What the model assumes");
      CHECK(contains(p->text, "The same holds with Hd read as each alternative in turn (Hd1 and Hd2)."));
    }
  CHECK(paragraphs == 1);
}
