// Cases with several alternatives to Hp: the propositions' list, per-alternative inputs of the
// models that take them, every documented error named by
// item and field, and the lossless round trip.
#include <catch2/catch.hpp>
#include <cmath>
#include <functional>

#include "core/interchange/case_json.hpp"

using namespace counterpoise::interchange;
using nlohmann::json;

namespace {

// Invented values (Harwick Vale demo scenario).
json three_alternatives() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-ALT", "title": "Glass with three alternatives" },
    "propositions": { "level": "source", "hp": "The glass came from the broken window at the Mill Street shop",
      "alternatives": [
        { "id": "Hd1", "text": "The glass came from another window of the same kind", "weight": 2 },
        { "id": "Hd2", "text": "The glass came from the glazing workshop where he works", "weight": 1 },
        { "id": "Hd3", "text": "The glass came from an unknown source", "weight": 1, "unspecified": true } ] },
    "items": [
      { "id": "E1", "model": "assigned", "p_given": { "Hp": 0.6, "Hd1": 0.5, "Hd2": { "counts": { "k": 3, "n": 40 } }, "Hd3": 0.01 } },
      { "id": "E2", "model": "reported-lr", "alternatives": { "Hd1": { "lr": 1.5 }, "Hd2": { "log10_lr": 1 }, "Hd3": { "lr": 300, "interval": [100, 900] } } }
    ] })");
}

std::string problems_text(const CaseReadResult& r) {
  std::string all;
  for (const auto& p : r.diagnostics.problems()) all += p.text() + "\n";
  return all;
}

std::string problems_of(const std::function<void(json&)>& change) {
  json doc = three_alternatives();
  change(doc);
  const auto result = read_case(doc, ".");
  CHECK_FALSE(result.value);
  return problems_text(result);
}

}  // namespace

TEST_CASE("a case with three alternatives reads: ids, texts, weights normalised, one model per alternative", "[alternatives]") {
  const auto result = read_case(three_alternatives(), ".");
  INFO(problems_text(result));
  REQUIRE(result.value);
  const auto& p = result.value->propositions;
  REQUIRE(p.has_alternatives());
  CHECK(p.alternative_ids() == std::vector<std::string>{"Hd1", "Hd2", "Hd3"});
  CHECK(p.hd == p.alternatives[0].text);  // what reads one Hd sees the first alternative
  CHECK(p.alternatives[2].is_unspecified());
  CHECK_FALSE(p.alternatives[0].is_unspecified());
  const auto weights = p.normalised_weights();
  REQUIRE(weights);
  CHECK((*weights)[0] == 0.5);
  CHECK((*weights)[1] == 0.25);
  const auto& e1 = result.value->items[0];
  REQUIRE(e1.alternative_models.size() == 3);
  CHECK(e1.model == e1.alternative_models[0]);
  // LR against Hd1 = 0.6 / 0.5; against Hd2 = 0.6 / ((3+1)/(40+2)) (Laplace's rule of succession,
  // the posterior mean under a uniform prior: common practice); against Hd3 = 0.6 / 0.01.
  CHECK(e1.model_against(0).evaluate().lr.log10() == Approx(std::log10(0.6 / 0.5)).epsilon(1e-14));
  CHECK(e1.model_against(1).evaluate().lr.log10() == Approx(std::log10(0.6 / (4.0 / 42.0))).epsilon(1e-14));
  CHECK(e1.model_against(2).evaluate().lr.log10() == Approx(std::log10(60.0)).epsilon(1e-14));
  const auto& e2 = result.value->items[1];
  CHECK(e2.model_against(0).evaluate().lr.log10() == Approx(std::log10(1.5)).epsilon(1e-14));
  CHECK(e2.model_against(1).evaluate().lr.log10() == 1.0);
  CHECK(e2.model_against(2).is_uncertain());
  CHECK_FALSE(e2.model_against(1).is_uncertain());
}

TEST_CASE("a case with alternatives round-trips losslessly", "[alternatives]") {
  const auto result = read_case(three_alternatives(), ".");
  REQUIRE(result.value);
  CHECK(canonical_text(write_case(*result.value)) == canonical_text(three_alternatives()));
  json doc = three_alternatives();
  doc["propositions"]["alternatives"][0]["unspecified"] = false;  // written as given, not dropped
  const auto again = read_case(doc, ".");
  REQUIRE(again.value);
  CHECK(canonical_text(write_case(*again.value)) == canonical_text(doc));
}

TEST_CASE("a two-proposition case reads as before: one alternative named Hd", "[alternatives]") {
  json doc = three_alternatives();
  doc["propositions"].erase("alternatives");
  doc["propositions"]["hd"] = "The glass came from another source";
  doc["items"] = json::parse(R"([{ "id": "E1", "model": "assigned", "p_given_hp": 0.6, "p_given_hd": 0.1 }])");
  const auto result = read_case(doc, ".");
  INFO(problems_text(result));
  REQUIRE(result.value);
  CHECK_FALSE(result.value->propositions.has_alternatives());
  CHECK(result.value->propositions.alternative_ids() == std::vector<std::string>{"Hd"});
  CHECK_FALSE(result.value->propositions.normalised_weights());
  CHECK(result.value->items[0].alternative_models.empty());
  CHECK(result.value->items[0].model_against(0).evaluate().lr.log10() == Approx(std::log10(6.0)).epsilon(1e-14));
  CHECK(canonical_text(write_case(*result.value)) == canonical_text(doc));
}

TEST_CASE("weights are optional, without them there are no normalised weights", "[alternatives]") {
  json doc = three_alternatives();
  for (auto& a : doc["propositions"]["alternatives"]) a.erase("weight");
  const auto result = read_case(doc, ".");
  REQUIRE(result.value);
  CHECK_FALSE(result.value->propositions.normalised_weights());
}

TEST_CASE("errors in the list of alternatives name the proposition and the field", "[alternatives][errors]") {
  using Catch::Matchers::Contains;
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][1]["id"] = "Hd1"; }),
             Contains("field alternatives[1].id: duplicate alternative id \"Hd1\""));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][1].erase("text"); }),
             Contains("item propositions, field alternatives.Hd2.text: missing"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][1]["text"] = "  "; }),
             Contains("field alternatives.Hd2.text: must not be empty"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][0].erase("id"); }),
             Contains("field alternatives[0].id: missing"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][2]["weight"] = 0; }),
             Contains("field alternatives.Hd3.weight: a weight is the fact-finder's relative prior weight"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][2]["weight"] = -1.5; }),
             Contains("must be positive, found -1.5"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][1].erase("weight"); }),
             Contains("field alternatives.Hd2.weight: missing: give a weight to every alternative or to none"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][0]["id"] = "Hp"; }),
             Contains("\"Hp\" names the proposition Hp"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][0]["colour"] = "red"; }),
             Contains("alternatives[0].colour"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["hd"] = "Another source"; }),
             Contains("field hd: give either \"hd\" (one alternative) or \"alternatives\" (a list), not both"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"] = json::array(); }),
             Contains("field alternatives: alternatives is a list of at least one"));
  CHECK_THAT(problems_of([](json& d) { d["propositions"]["alternatives"][0]["weight"] = 1e308;
                                       d["propositions"]["alternatives"][1]["weight"] = 1e308; }),
             Contains("too large to add up"));
}

TEST_CASE("errors in per-alternative inputs name the item, the field and the alternative", "[alternatives][errors]") {
  using Catch::Matchers::Contains;
  CHECK_THAT(problems_of([](json& d) { d["items"][0]["p_given"].erase("Hd2"); }),
             Contains("item E1, field p_given.Hd2: missing: alternative Hd2 needs its own value"));
  CHECK_THAT(problems_of([](json& d) { d["items"][0]["p_given"].erase("Hp"); }),
             Contains("item E1, field p_given.Hp: missing"));
  CHECK_THAT(problems_of([](json& d) { d["items"][0]["p_given"]["Hd9"] = 0.2; }),
             Contains("item E1, field p_given.Hd9: \"Hd9\" is not the id of a proposition of this case (Hp, Hd1, Hd2, Hd3)"));
  CHECK_THAT(problems_of([](json& d) { d["items"][0]["p_given"]["Hd1"] = 1.5; }),
             Contains("item E1, field p_given.Hd1"));
  CHECK_THAT(problems_of([](json& d) { d["items"][0]["p_given"]["Hp"] = 0; d["items"][0]["p_given"]["Hd3"] = 0; }),
             Contains("item E1, field p_given.Hd3: P(E|Hp) and P(E|Hd3) are both zero"));
  CHECK_THAT(problems_of([](json& d) { d["items"][0]["p_given_hp"] = 0.5; }),
             Contains("item E1, field p_given_hp: the case has several alternatives to Hp: give \"p_given\""));
  CHECK_THAT(problems_of([](json& d) { d["items"][0].erase("p_given"); }),
             Contains("item E1, field p_given: missing"));
  CHECK_THAT(problems_of([](json& d) { d["items"][1]["alternatives"].erase("Hd3"); }),
             Contains("item E2, field alternatives.Hd3: missing: alternative Hd3 needs its own value"));
  CHECK_THAT(problems_of([](json& d) { d["items"][1]["alternatives"]["Hd4"] = {{"lr", 2}}; }),
             Contains("item E2, field alternatives.Hd4: \"Hd4\" is not the id of a proposition"));
  CHECK_THAT(problems_of([](json& d) { d["items"][1]["alternatives"]["Hd2"] = {{"lr", -2}}; }),
             Contains("item E2, field alternatives.Hd2.lr: likelihood ratio -2 must not be negative"));
  CHECK_THAT(problems_of([](json& d) { d["items"][1]["alternatives"]["Hd3"]["interval"] = {400, 900}; }),
             Contains("item E2, field alternatives.Hd3.interval: the interval does not contain"));
  CHECK_THAT(problems_of([](json& d) { d["items"][1]["alternatives"]["Hd1"] = {{"relationship", "full-sibling"}}; }),
             Contains("item E2, field alternatives.Hd1.relationship: unknown field"));
  CHECK_THAT(problems_of([](json& d) { d["items"][1].erase("alternatives"); }),
             Contains("item E2, field alternatives: missing: the case has several alternatives to Hp"));
}

TEST_CASE("an item of a model with per-alternative entries needs one for every alternative", "[alternatives][errors]") {
  using Catch::Matchers::Contains;
  const std::string problems = problems_of([](json& d) {
    d["items"].push_back(json::parse(R"({ "id": "T1", "model": "transfer", "t0": 0.1, "tn": 0.05, "p0": 0.6,
      "p1": 0.3, "sn": 0.1, "gamma": 0.02, "alternatives": { "Hd1": {}, "Hd3": { "t0_hd": 0.5, "tn_hd": 0.1 } } })"));
  });
  CHECK_THAT(problems, Contains("item T1, field alternatives.Hd2: missing: alternative Hd2 needs its own value"));
}

TEST_CASE("per-alternative inputs in a two-proposition case are refused with the reason", "[alternatives][errors]") {
  using Catch::Matchers::Contains;
  json doc = three_alternatives();
  doc["propositions"].erase("alternatives");
  doc["propositions"]["hd"] = "The glass came from another source";
  const auto result = read_case(doc, ".");
  CHECK_FALSE(result.value);
  const std::string problems = problems_text(result);
  CHECK_THAT(problems, Contains("item E1, field p_given: per-alternative inputs need a list of alternatives"));
  CHECK_THAT(problems, Contains("item E2, field alternatives: per-alternative inputs need a list of alternatives"));
}
