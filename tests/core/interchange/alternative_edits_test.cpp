// Changes to the list of alternatives with what they do to the items' values: the switch between
// two propositions and several alternatives and back, renaming, removing with the values it
// removes listed first, and the reader's own messages for a list that does not read. Each edited
// case is read by the case reader, and the LRs it gives are checked against the ratio of the
// probabilities written out (common practice: LR = P(E|Hp) / P(E|Hd_i)).
#include <catch2/catch.hpp>
#include <cmath>

#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/alternative_edits.hpp"
#include "core/interchange/case_json.hpp"

using namespace counterpoise;
using namespace counterpoise::interchange;
using nlohmann::json;

namespace {

// Invented values (Harwick Vale demo scenario).
json two_propositions() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-EDIT", "title": "Glass from the Mill Street shop" },
    "propositions": { "level": "source", "hp": "The glass came from the broken window at the Mill Street shop",
      "hd": "The glass came from another window of the same kind" },
    "items": [
      { "id": "E1", "model": "assigned", "p_given_hp": 0.6, "p_given_hd": { "counts": { "k": 3, "n": 40 } } },
      { "id": "E2", "model": "reported-lr", "lr": 300, "interval": [100, 900], "method": "Vale refractive index comparison" },
      { "id": "E3", "model": "transfer", "t0": 0.1, "tn": 0.3, "p0": 0.9, "p1": 0.08, "sn": 0.4, "gamma": 0.05 }
    ] })");
}

json applied(json document, const AlternativesEdit& edit) {
  document["propositions"] = edit.propositions;
  for (const auto& [id, body] : edit.items)
    for (auto& item : document["items"])
      if (item["id"] == id) item = body;
  return document;
}

std::string problems_text(const CaseReadResult& r) {
  std::string all;
  for (const auto& p : r.diagnostics.problems()) all += p.text() + "\n";
  return all;
}

json without_item(json document, const std::string& id) {
  auto& items = document["items"];
  for (auto it = items.begin(); it != items.end(); ++it)
    if ((*it)["id"] == id) {
      items.erase(it);
      break;
    }
  return document;
}

}  // namespace

TEST_CASE("two propositions switch to several alternatives: Hd becomes Hd1 and every value moves with it", "[alternatives][edits]") {
  const json two = two_propositions();
  const auto edit = to_several_alternatives(two);
  CHECK(edit.propositions["alternatives"] ==
        json::parse(R"([{ "id": "Hd1", "text": "The glass came from another window of the same kind" }])"));
  CHECK_FALSE(edit.propositions.contains("hd"));
  const json several = applied(two, edit);
  CHECK(several["items"][0]["p_given"] == json::parse(R"({ "Hp": 0.6, "Hd1": { "counts": { "k": 3, "n": 40 } } })"));
  CHECK_FALSE(several["items"][0].contains("p_given_hp"));
  CHECK(several["items"][1]["alternatives"] == json::parse(R"({ "Hd1": { "lr": 300, "interval": [100, 900] } })"));
  CHECK(several["items"][1]["method"] == "Vale refractive index comparison");  // shared by every alternative
  // The transfer item has no value under Hd of its own: an empty entry (nothing transferred).
  CHECK(several["items"][2]["alternatives"] == json::parse(R"({ "Hd1": {} })"));
  CHECK(edit.items.size() == 3);

  // The case reads, and each LR is the one of the two-proposition case.
  const auto before = read_case(two, ".");
  const auto after = read_case(several, ".");
  INFO(problems_text(after));
  REQUIRE(before.value);
  REQUIRE(after.value);
  const auto b = evaluation::evaluate_case(*before.value);
  const auto a = evaluation::evaluate_case(*after.value);
  // E1: 0.6 / ((3+1)/(40+2)) with the rule of succession (Laplace) for the counts.
  CHECK(a.items[0].by_alternative.at(0).lr.log10() == Approx(std::log10(0.6 / (4.0 / 42.0))).epsilon(1e-12));
  CHECK(a.items[0].by_alternative.at(0).lr.log10() == Approx(b.items[0].point.lr.log10()).epsilon(1e-12));
  CHECK(a.items[1].by_alternative.at(0).lr.log10() == Approx(std::log10(300.0)).epsilon(1e-12));
  CHECK(a.items[2].by_alternative.at(0).lr.log10() == b.items[2].point.lr.log10());
}

TEST_CASE("each model's value under Hd moves to the alternative's entry and back", "[alternatives][edits]") {
  json two = two_propositions();
  auto& items = two["items"];
  items[2]["t0_hd"] = 0.7;
  items[2]["tn_hd"] = 0.1;
  items.push_back(json::parse(R"({ "id": "G1", "model": "continuous-two-level", "control": [1.5184], "recovered": [1.5185],
    "within_sd": 4e-5, "population": { "normal": { "mean": 1.5186, "sd": 0.004 } },
    "population_hd": { "normal": { "mean": 1.5205, "sd": 0.0015 } } })"));
  items.push_back(json::parse(R"({ "id": "M1", "model": "dna-mixture", "hp": { "unknowns": 1 },
    "hd": { "contributors": ["victim"], "unknowns": 1 } })"));
  items.push_back(json::parse(R"({ "id": "N1", "model": "network", "proposition": { "node": "S", "hp": "him", "hd": "other" } })"));
  const json several = applied(two, to_several_alternatives(two));
  const auto& moved = several["items"];
  CHECK(moved[2]["alternatives"] == json::parse(R"({ "Hd1": { "t0_hd": 0.7, "tn_hd": 0.1 } })"));
  CHECK_FALSE(moved[2].contains("t0_hd"));
  CHECK(moved[3]["alternatives"] ==
        json::parse(R"({ "Hd1": { "population_hd": { "normal": { "mean": 1.5205, "sd": 0.0015 } } } })"));
  CHECK(moved[4]["alternatives"] == json::parse(R"({ "Hd1": { "hd": { "contributors": ["victim"], "unknowns": 1 } } })"));
  CHECK_FALSE(moved[4].contains("hd"));
  CHECK(moved[5]["alternatives"] == json::parse(R"({ "Hd1": { "hd": "other" } })"));
  CHECK(moved[5]["proposition"] == json::parse(R"({ "node": "S", "hp": "him" })"));
  CHECK(applied(several, to_two_propositions(several)) == two);
}

TEST_CASE("several alternatives switch back to two propositions only with one left, and the round trip is exact", "[alternatives][edits]") {
  const json two = two_propositions();
  const json several = applied(two, to_several_alternatives(two));
  CHECK(applied(several, to_two_propositions(several)) == two);

  json three = several;
  three["propositions"]["alternatives"].push_back({{"id", "Hd2"}, {"text", "The glass came from his workplace"}});
  three["propositions"]["alternatives"].push_back({{"id", "Hd3"}, {"text", "The glass came from an unknown source"}});
  try {
    to_two_propositions(three);
    FAIL("switched back with three alternatives");
  } catch (const validation::InvalidValue& error) {
    CHECK(error.where().field == "alternatives");
    CHECK(std::string(error.what()).find("remove 2 of the 3 first") != std::string::npos);
  }
  CHECK_THROWS_AS(to_two_propositions(two), validation::InvalidValue);
  CHECK_THROWS_AS(to_several_alternatives(several), validation::InvalidValue);
}

TEST_CASE("the one alternative left keeps its own text and values when the case goes back to two propositions", "[alternatives][edits]") {
  json several = applied(two_propositions(), to_several_alternatives(two_propositions()));
  several["propositions"]["alternatives"][0] = {{"id", "Brother"}, {"text", "The glass came from his brother's house"}, {"weight", 3}};
  several["items"][0]["p_given"] = {{"Hp", 0.6}, {"Brother", 0.2}};
  several["items"][1]["alternatives"] = {{"Brother", {{"lr", 40}}}};
  several["items"][2]["alternatives"] = {{"Brother", json::object()}};
  const json two = applied(several, to_two_propositions(several));
  CHECK(two["propositions"]["hd"] == "The glass came from his brother's house");
  CHECK(two["items"][0]["p_given_hd"] == 0.2);
  CHECK(two["items"][1]["lr"] == 40);
  CHECK_FALSE(two["items"][1].contains("interval"));  // the entry held none
  const auto read = read_case(two, ".");
  INFO(problems_text(read));
  CHECK(read.value);
}

TEST_CASE("renaming an alternative renames it in every item, and a name the reader refuses is refused with its message", "[alternatives][edits]") {
  json several = applied(two_propositions(), to_several_alternatives(two_propositions()));
  several["propositions"]["alternatives"].push_back({{"id", "Hd2"}, {"text", "The glass came from his workplace"}});
  several["items"][0]["p_given"]["Hd2"] = 0.3;
  several["items"][1]["alternatives"]["Hd2"] = {{"lr", 2}};
  const json renamed = applied(several, rename_alternative(several, "Hd2", "Workplace"));
  CHECK(renamed["propositions"]["alternatives"][1]["id"] == "Workplace");
  CHECK(renamed["items"][0]["p_given"] == json::parse(R"({ "Hp": 0.6, "Hd1": { "counts": { "k": 3, "n": 40 } }, "Workplace": 0.3 })"));
  CHECK(renamed["items"][1]["alternatives"]["Workplace"] == json{{"lr", 2}});

  const auto refused = [&](const std::string& to) {
    try {
      rename_alternative(several, "Hd2", to);
    } catch (const validation::InvalidValue& error) {
      return std::string(error.what());
    }
    return std::string("not refused");
  };
  // The reader's messages (case_json.cpp, read_alternative).
  CHECK(refused("Hd1") == "item propositions, field alternatives[1].id: duplicate alternative id \"Hd1\"");
  CHECK(refused("Hp").find("names the proposition Hp") != std::string::npos);
  CHECK(refused("").find("alternatives[1].id: must not be empty") != std::string::npos);
  CHECK_THROWS_AS(rename_alternative(several, "Hd9", "X"), validation::InvalidValue);
}

TEST_CASE("removing an alternative lists the values items hold for it, then removes them and nothing else", "[alternatives][edits]") {
  json several = applied(two_propositions(), to_several_alternatives(two_propositions()));
  several["propositions"]["alternatives"].push_back({{"id", "Hd2"}, {"text", "The glass came from his workplace"}});
  several["items"][0]["p_given"]["Hd2"] = 0.3;
  several["items"][1]["alternatives"]["Hd2"] = {{"lr", 2}};
  const auto named = values_naming(several, "Hd2");
  REQUIRE(named.size() == 2);
  CHECK(named[0].item == "E1");
  CHECK(named[0].field == "p_given.Hd2");
  CHECK(named[0].value == 0.3);
  CHECK(named[1].item == "E2");
  CHECK(named[1].field == "alternatives.Hd2");

  const json removed = applied(several, remove_alternative(several, "Hd2"));
  CHECK(removed == applied(two_propositions(), to_several_alternatives(two_propositions())));
  CHECK(values_naming(removed, "Hd2").empty());
  CHECK_THROWS_AS(remove_alternative(removed, "Hd1"), validation::InvalidValue);  // the only one
  CHECK_THROWS_AS(remove_alternative(several, "Hd7"), validation::InvalidValue);
}

TEST_CASE("a problem of the list is said naming the alternative by place and id and the field", "[alternatives][edits]") {
  const json list = json::parse(R"([{ "id": "Hd1", "text": "A", "weight": 2 }, { "id": "Hd2", "text": "B" },
                                    { "id": "Hd1", "text": "C", "weight": -1 }])");
  const auto problems = alternatives_problems(list);
  std::vector<std::string> words;
  for (const auto& p : problems) words.push_back(alternative_problem_words(p, list));
  // Each problem the reader names (case_json.cpp): a duplicate id, a weight missing for one
  // alternative when the others have one.
  REQUIRE(words.size() == 2);
  CHECK(words[0] == "Alternative 3 (Hd1), id: duplicate alternative id \"Hd1\"");
  CHECK(words[1] == "Alternative 2 (Hd2), weight: missing: give a weight to every alternative or to none");
  const json negative = json::parse(R"([{ "id": "Hd1", "text": "A", "weight": -1 }])");
  const auto weight = alternatives_problems(negative);
  REQUIRE(weight.size() == 1);
  CHECK(alternative_problem_words(weight[0], negative).rfind("Alternative 1 (Hd1), weight: a weight is", 0) == 0);
  const json empty_text = json::parse(R"([{ "id": "Hd1", "text": " " }])");
  CHECK(alternative_problem_words(alternatives_problems(empty_text).at(0), empty_text) ==
        "Alternative 1 (Hd1), proposition: must not be empty");
  CHECK(alternatives_problems(json::parse(R"([{ "id": "Hd1", "text": "A" }])")).empty());
}

TEST_CASE("a fresh alternative id is Hd and a number no alternative has", "[alternatives][edits]") {
  CHECK(fresh_alternative_id(json::array()) == "Hd1");
  CHECK(fresh_alternative_id(json::parse(R"([{ "id": "Hd1" }, { "id": "Hd3" }])")) == "Hd4");
  CHECK(fresh_alternative_id(json::parse(R"([{ "id": "Hd3" }, { "id": "Hd2" }])")) == "Hd4");
  CHECK(fresh_alternative_id(json::parse(R"([{ "id": "Brother" }])")) == "Hd2");
}
