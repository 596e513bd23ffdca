// Every model in a case with several alternatives to Hp, evaluated through the case reader: a
// two-proposition case and the same case written with one alternative evaluate alike bit for
// bit (an independent check: the same findings written both ways), and a model that cannot serve
// an alternative says so, naming the item, the model and the alternative.
#include <catch2/catch.hpp>

#include <cmath>

#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"

using namespace counterpoise;
using Catch::Matchers::Contains;
using nlohmann::json;

namespace {

// Invented values (Harwick Vale scenario); each model's Hd-side input written in its
// two-proposition place. The uncertain inputs (a Beta t0, replicate groups, a Dirichlet row)
// give each item an interval, so the draws are compared too.
json two_propositions() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-ALT-MODELS" },
    "propositions": { "level": "activity", "hp": "He broke the shop window", "hd": "He was not there" },
    "items": [
      { "id": "T1", "model": "transfer", "t0": { "beta": [2, 18] }, "tn": 0.05, "p0": 0.6, "p1": 0.3, "sn": 0.1,
        "gamma": 0.02, "t0_hd": 0.8, "tn_hd": 0.01 },
      { "id": "G1", "model": "continuous-two-level", "control": [1.51844, 1.51846, 1.51850], "recovered": [1.51848],
        "within_replicates": [[1.51840, 1.51846, 1.51849], [1.52010, 1.52004]],
        "population": { "normal": { "mean": 1.5186, "sd": 0.004 } },
        "population_hd": { "normal": { "mean": 1.5205, "sd": 0.0015 } } },
      { "id": "M1", "model": "dna-mixture", "theta": 0.01, "dropout": { "beta": [2, 20] }, "dropin": 0.05,
        "observed": { "D8S1179": ["11", "12", "13"] },
        "references": { "victim": { "D8S1179": ["11", "12"] }, "suspect": { "D8S1179": ["13", "13"] } },
        "hp": { "contributors": ["victim", "suspect"], "unknowns": 0 },
        "hd": { "contributors": ["victim"], "unknowns": 1 },
        "min_allele_frequency": "none",
        "frequencies": { "table": { "D8S1179": { "11": 0.08, "12": 0.15, "13": 0.30, "14": 0.21 } } } },
      { "id": "N1", "model": "network",
        "nodes": [
          { "name": "S", "states": ["him", "other"], "cpt": [[0.5, 0.5]] },
          { "name": "F", "states": ["match", "none"], "parents": ["S"], "cpt": [{ "dirichlet": [9, 1] }, [0.05, 0.95]] } ],
        "proposition": { "node": "S", "hp": "him", "hd": "other" }, "observed": { "F": "match" } }
    ] })");
}

// The same case with one alternative, each item's Hd-side input in its entry.
json one_alternative() {
  json doc = two_propositions();
  doc["propositions"].erase("hd");
  doc["propositions"]["alternatives"] = {{{"id", "Hd1"}, {"text", "He was not there"}}};
  auto& items = doc["items"];
  items[0]["alternatives"] = {{"Hd1", {{"t0_hd", 0.8}, {"tn_hd", 0.01}}}};
  items[0].erase("t0_hd");
  items[0].erase("tn_hd");
  items[1]["alternatives"] = {{"Hd1", {{"population_hd", items[1]["population_hd"]}}}};
  items[1].erase("population_hd");
  items[2]["alternatives"] = {{"Hd1", {{"hd", items[2]["hd"]}}}};
  items[2].erase("hd");
  items[3]["alternatives"] = {{"Hd1", {{"hd", "other"}}}};
  items[3]["proposition"].erase("hd");
  return doc;
}

casefile::Case read(const json& doc) {
  auto result = interchange::read_case(doc, ".");
  INFO((result.diagnostics.empty() ? "" : result.diagnostics.problems().front().text()));
  REQUIRE(result.value);
  return std::move(*result.value);
}

void check_same(const std::optional<uncertainty::SpreadSummary>& a, const std::optional<uncertainty::SpreadSummary>& b) {
  REQUIRE(a.has_value() == b.has_value());
  if (!a) return;
  CHECK(a->low_log10 == b->low_log10);
  CHECK(a->high_log10 == b->high_log10);
  CHECK(a->median_log10 == b->median_log10);
}

}  // namespace

TEST_CASE("every model: one alternative evaluates as the two-proposition case, bit for bit", "[alternatives]") {
  const auto two = evaluation::evaluate_case(read(two_propositions()));
  const auto one = evaluation::evaluate_case(read(one_alternative()));
  REQUIRE(two.items.size() == 4);
  REQUIRE(one.items.size() == 4);
  for (std::size_t i = 0; i < 4; ++i) {
    CAPTURE(i);
    REQUIRE(one.items[i].by_alternative.size() == 1);
    CHECK(one.items[i].by_alternative[0].lr.log10() == two.items[i].point.lr.log10());
    check_same(one.items[i].by_alternative[0].spread, two.items[i].spread);
  }
  // The uncertain inputs did give intervals (transfer, continuous, network; the mixture averages
  // its drop-out into the LR).
  CHECK(two.items[0].spread);
  CHECK(two.items[1].spread);
  CHECK(two.items[3].spread);
  REQUIRE(one.combined.by_alternative.size() == 1);
  CHECK(one.combined.by_alternative[0].lr.log10() == two.combined.lr.log10());
  check_same(one.combined.by_alternative[0].spread, two.combined.spread);
}

TEST_CASE("a model that cannot serve an alternative names the item, the model and the alternative", "[alternatives][errors]") {
  json doc = one_alternative();
  doc["propositions"]["alternatives"].push_back({{"id", "Hd2"}, {"text", "He broke a bottle from his workplace"}});
  doc["items"] = json::array({doc["items"][1]});
  doc["items"][0]["form"] = "approximate";
  doc["items"][0]["alternatives"]["Hd1"] = json::object();
  doc["items"][0]["alternatives"]["Hd2"] = {{"population_hd", {{"normal", {{"mean", 1.5205}, {"sd", 0.0015}}}}}};
  const auto result = interchange::read_case(doc, ".");
  REQUIRE_FALSE(result.value);
  CHECK_THAT(result.diagnostics.problems().front().text(),
             Contains("item G1, field alternatives.Hd2.population_hd: the continuous-two-level model cannot use a "
                      "population of its own under Hd with the approximate form"));
}

TEST_CASE("an unspecified alternative with a small weight: its stated value, and the compound with and without it", "[alternatives]") {
  // One transfer item; Hd1 "he was not there" (weight 99), Hd2 unspecified (weight 1), for which
  // the scientist states a large transfer (tn_hd 0.05, as under Hp). Compound LR (common
  // practice): 1 / sum_i w_i / LR_i with the weights normalised; without Hd2 it is LR_1.
  json doc = one_alternative();
  doc["propositions"]["alternatives"] = {{{"id", "Hd1"}, {"text", "He was not there"}, {"weight", 99}},
                                         {{"id", "Hd2"}, {"text", "Someone else broke it while he stood by"},
                                          {"weight", 1}, {"unspecified", true}}};
  json item = doc["items"][0];
  item["t0"] = 0.1;
  item["alternatives"] = {{"Hd1", json::object()}, {"Hd2", {{"t0_hd", 0.1}, {"tn_hd", 0.05}}}};
  doc["items"] = json::array({item});
  const auto result = evaluation::evaluate_case(read(doc));
  const double background = 0.3 * 0.1 * 0.02, hp = 0.05 * 0.6 + 0.1 * background;
  const double lr1 = hp / background, lr2 = hp / (0.05 * 0.6 + 0.1 * background);
  REQUIRE(result.combined.compound);
  // 1e-12: log-sum-exp of two terms in log10; a few ulps.
  CHECK(result.combined.compound->lr.log10() == Approx(-std::log10(0.99 / lr1 + 0.01 / lr2)).epsilon(1e-12));
  REQUIRE(result.combined.compound->without_unspecified);
  CHECK(result.combined.compound->without_unspecified->log10() == Approx(std::log10(lr1)).epsilon(1e-12));
  // A weight of 1 in 100 takes the LR from about 50 to about 34 (LR_2 = 1): what the output shows
  // side by side.
  CHECK(std::pow(10.0, result.combined.compound->lr.log10()) == Approx(1.0 / (0.99 / 50.1 + 0.01)).epsilon(1e-9));

  // No value stated for the unspecified alternative: refused, naming the item and the alternative.
  doc["items"][0]["alternatives"].erase("Hd2");
  const auto refused = interchange::read_case(doc, ".");
  REQUIRE_FALSE(refused.value);
  CHECK_THAT(refused.diagnostics.problems().front().text(),
             Contains("item T1, field alternatives.Hd2: missing: alternative Hd2 needs its own value"));
}
