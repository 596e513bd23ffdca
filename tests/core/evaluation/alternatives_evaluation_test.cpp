// Evaluating a case with several alternatives to Hp: each item's and the combination's LR
// against each alternative, the compound LR against the weighted set, and the illustration over
// the set. Checked against the formulas computed here in long double from the probabilities:
// under each proposition independent items multiply, so
//   LR_i = prod_k P(E_k|Hp) / prod_k P(E_k|Hd_i),
//   compound = prod_k P(E_k|Hp) / sum_i w_i prod_k P(E_k|Hd_i)   (common practice).
#include <catch2/catch.hpp>
#include <cmath>

#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/interchange/evaluation_json.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

// Invented probabilities (Harwick Vale scenario).
json three_alternatives() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-ALT-EVAL" },
    "propositions": { "level": "source", "hp": "The glass came from the shop window",
      "alternatives": [
        { "id": "Hd1", "text": "The glass came from another window of the same kind", "weight": 6 },
        { "id": "Hd2", "text": "The glass came from his workplace", "weight": 3 },
        { "id": "Hd3", "text": "The glass came from an unknown source", "weight": 1, "unspecified": true } ] },
    "items": [
      { "id": "E1", "model": "assigned", "p_given": { "Hp": 0.6, "Hd1": 0.5, "Hd2": 0.05, "Hd3": 0.001 } },
      { "id": "E2", "model": "assigned", "p_given": { "Hp": 0.3, "Hd1": 0.02, "Hd2": 0.2, "Hd3": 0.004 } },
      { "id": "E3", "model": "assigned", "p_given": { "Hp": 0.9, "Hd1": 0.1, "Hd2": 0.1, "Hd3": 0.1 },
        "combination": { "included": false, "exclusion_reason": "not independent of E1" } }
    ],
    "priors": { "odds": [0.01, 1] } })");
}

casefile::Case read(const json& doc) {
  auto result = interchange::read_case(doc, ".");
  INFO((result.diagnostics.empty() ? "" : result.diagnostics.problems().front().text()));
  REQUIRE(result.value);
  return std::move(*result.value);
}

const long double kHp[] = {0.6L, 0.3L};
const long double kHd[3][2] = {{0.5L, 0.02L}, {0.05L, 0.2L}, {0.001L, 0.004L}};
const long double kWeights[] = {0.6L, 0.3L, 0.1L};

}  // namespace

TEST_CASE("each item and the combination are evaluated against each alternative", "[alternatives]") {
  const auto result = evaluation::evaluate_case(read(three_alternatives()));
  REQUIRE(result.items.size() == 3);
  for (int i = 0; i < 3; ++i) {
    CAPTURE(i);
    REQUIRE(result.items[0].by_alternative.size() == 3);
    CHECK(result.items[0].by_alternative[i].lr.log10() ==
          Approx(static_cast<double>(std::log10(kHp[0] / kHd[i][0]))).epsilon(1e-14));
    const long double combined = (kHp[0] * kHp[1]) / (kHd[i][0] * kHd[i][1]);  // E3 is left out
    CHECK(result.combined.by_alternative[i].lr.log10() == Approx(static_cast<double>(std::log10(combined))).epsilon(1e-14));
    CHECK_FALSE(result.combined.by_alternative[i].spread);
  }
  CHECK(result.combined.by_alternative[1].id == "Hd2");
  // The fields of a two-proposition evaluation hold Hp against the first alternative.
  CHECK(result.combined.lr.log10() == result.combined.by_alternative[0].lr.log10());
  CHECK(result.items[1].point.lr.log10() == result.items[1].by_alternative[0].lr.log10());
  // Words name the alternative.
  CHECK(result.combined.by_alternative[1].verbal.sentence.find("rather than Hd2") != std::string::npos);
}

TEST_CASE("the compound LR of the combination equals prod P(E|Hp) / sum w_i prod P(E|Hd_i) in long double", "[alternatives]") {
  const auto result = evaluation::evaluate_case(read(three_alternatives()));
  REQUIRE(result.combined.compound);
  long double denominator = 0.0L;
  for (int i = 0; i < 3; ++i) denominator += kWeights[i] * kHd[i][0] * kHd[i][1];
  const long double expected = (kHp[0] * kHp[1]) / denominator;
  // 1e-14 relative in log10: a few roundings of the double logs.
  CHECK(result.combined.compound->lr.log10() == Approx(static_cast<double>(std::log10(expected))).epsilon(1e-14));
  CHECK(result.combined.compound->weights == std::vector<double>{0.6, 0.3, 0.1});
  CHECK(result.combined.compound->interval_note.empty());  // no spread anywhere
  // Without the unspecified Hd3: weights 6/9 and 3/9 over Hd1 and Hd2.
  REQUIRE(result.combined.compound->without_unspecified);
  const long double specified = (kHp[0] * kHp[1]) / ((6.0L / 9) * kHd[0][0] * kHd[0][1] + (3.0L / 9) * kHd[1][0] * kHd[1][1]);
  CHECK(result.combined.compound->without_unspecified->log10() ==
        Approx(static_cast<double>(std::log10(specified))).epsilon(1e-14));
  // Per item, the same formula with one item.
  REQUIRE(result.items[0].compound);
  long double item_denominator = 0.0L;
  for (int i = 0; i < 3; ++i) item_denominator += kWeights[i] * kHd[i][0];
  CHECK(result.items[0].compound->lr.log10() == Approx(static_cast<double>(std::log10(kHp[0] / item_denominator))).epsilon(1e-14));
}

TEST_CASE("the illustration over the set gives each proposition's posterior for each prior", "[alternatives]") {
  const auto result = evaluation::evaluate_case(read(three_alternatives()));
  REQUIRE(result.over_set.size() == 2);
  // Prior odds 0.01 of Hp against the set: pi_p = 0.01/1.01, pi_i = w_i/1.01.
  const long double odds = 0.01L;
  long double terms[4] = {odds * kHp[0] * kHp[1], 0, 0, 0};
  long double total = terms[0];
  for (int i = 0; i < 3; ++i) total += terms[i + 1] = kWeights[i] * kHd[i][0] * kHd[i][1];
  for (int j = 0; j < 4; ++j)
    CHECK(result.over_set[0].posteriors[j].probability() == Approx(static_cast<double>(terms[j] / total)).epsilon(1e-13));
}

TEST_CASE("evaluate --json carries by_alternative and compound only for a case with alternatives", "[alternatives][json]") {
  const auto value = read(three_alternatives());
  const json j = interchange::evaluation_to_json(value, evaluation::evaluate_case(value), {});
  REQUIRE(j["items"][0]["by_alternative"].size() == 3);
  const json& first = j["items"][0]["by_alternative"][0];
  CHECK(first["id"] == "Hd1");
  CHECK(first["interval_log10"].is_null());
  CHECK(first.contains("log10_lr"));
  CHECK(first.contains("verbal"));
  REQUIRE(j["combined"].contains("compound"));
  CHECK(j["combined"]["compound"]["interval_log10"].is_null());
  CHECK(j["combined"]["compound"]["weights"]["Hd3"] == 0.1);
  CHECK(j["sensitivity_over_set"][0]["propositions"][3]["id"] == "Hd3");
  // The fields outside by_alternative name the alternative they are of.
  CHECK(j["items"][0]["alternative"] == "Hd1");
  CHECK(j["combined"]["alternative"] == "Hd1");
  CHECK(j["sensitivity_alternative"] == "Hd1");
  CHECK(j["combined"]["log10_lr"] == j["combined"]["by_alternative"][0]["log10_lr"]);

  json two = three_alternatives();
  two["propositions"].erase("alternatives");
  two["propositions"]["hd"] = "The glass came from another source";
  two["items"] = json::parse(R"([{ "id": "E1", "model": "assigned", "p_given_hp": 0.6, "p_given_hd": 0.1 }])");
  const auto plain = read(two);
  const json k = interchange::evaluation_to_json(plain, evaluation::evaluate_case(plain), {});
  CHECK_FALSE(k["items"][0].contains("by_alternative"));
  CHECK_FALSE(k["combined"].contains("by_alternative"));
  CHECK_FALSE(k["combined"].contains("compound"));
  CHECK_FALSE(k.contains("alternatives"));
  CHECK_FALSE(k.contains("sensitivity_over_set"));
  CHECK_FALSE(k["items"][0].contains("alternative"));
  CHECK_FALSE(k["combined"].contains("alternative"));
  CHECK_FALSE(k.contains("sensitivity_alternative"));
}

TEST_CASE("an uncertain alternative's interval is its own, the compound has one from joint draws", "[alternatives]") {
  json doc = three_alternatives();
  doc["items"][1]["p_given"]["Hd2"] = json::parse(R"({ "counts": { "k": 9, "n": 40 } })");
  const auto result = evaluation::evaluate_case(read(doc));
  CHECK_FALSE(result.combined.by_alternative[0].spread);
  REQUIRE(result.combined.by_alternative[1].spread);
  CHECK(result.combined.by_alternative[1].spread->low_log10 < result.combined.by_alternative[1].lr.log10());
  REQUIRE(result.combined.compound);
  REQUIRE(result.combined.compound->spread);
  CHECK(result.combined.compound->interval_note.empty());
  CHECK(result.combined.compound->spread->low_log10 < result.combined.compound->lr.log10());
  CHECK(result.combined.compound->spread->high_log10 > result.combined.compound->lr.log10());
}

TEST_CASE("without weights there is no compound LR and no illustration over the set", "[alternatives]") {
  json doc = three_alternatives();
  for (auto& a : doc["propositions"]["alternatives"]) a.erase("weight");
  const auto result = evaluation::evaluate_case(read(doc));
  CHECK(result.combined.by_alternative.size() == 3);
  CHECK_FALSE(result.combined.compound);
  CHECK(result.over_set.empty());
}
