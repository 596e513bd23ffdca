// The numeric guard on a case (core/guard/case_guard.hpp): one test per check, each with a case
// that must warn and a close case that must not, and the demo cases' expected warnings.
#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "core/guard/case_guard.hpp"
#include "core/interchange/case_json.hpp"
#include "core/validation/input_error.hpp"
#include "guard_test_support.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

json base_case() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-GUARD-1", "title": "Harwick Vale test case" },
    "propositions": { "level": "source",
                      "hp": "The fibres on the jumper came from the door mat of the bakery",
                      "hd": "The fibres on the jumper came from some other textile source" },
    "items": [
      { "id": "A", "model": "assigned", "description": "Twelve red acrylic fibres on the jumper.",
        "p_given_hp": 0.8, "p_given_hd": { "counts": { "k": 3, "n": 412 } } },
      { "id": "B", "model": "assigned", "description": "Glass fragments on the jacket.",
        "p_given_hp": { "beta": [38, 4] }, "p_given_hd": 0.02 }
    ] })");
}

casefile::Case read(const json& document, const std::filesystem::path& base = ".") {
  auto result = interchange::read_case(document, base);
  INFO(result.diagnostics.problems().size() << " problem(s) reading the test case");
  REQUIRE(result.value);
  return std::move(*result.value);
}

casefile::Case read_demo(const std::string& name) {
  const std::filesystem::path path = std::filesystem::path(COUNTERPOISE_DEMO_DIR) / name;
  std::ifstream in(path);
  REQUIRE(in);
  return read(json::parse(in), path.parent_path());
}

json read_demo_json(const std::string& name) {
  std::ifstream in(std::filesystem::path(COUNTERPOISE_DEMO_DIR) / name);
  REQUIRE(in);
  return json::parse(in);
}

std::vector<guard::CaseWarning> warnings_of(const casefile::Case& value) { return guard::check_case(value, default_checker()); }

std::vector<guard::CaseWarning> with_rule(const std::vector<guard::CaseWarning>& all, std::string_view rule) {
  std::vector<guard::CaseWarning> out;
  std::copy_if(all.begin(), all.end(), std::back_inserter(out), [&](const auto& w) { return w.rule == rule; });
  return out;
}

std::vector<guard::CaseWarning> wording(const std::vector<guard::CaseWarning>& all) {
  std::vector<guard::CaseWarning> out;
  std::copy_if(all.begin(), all.end(), std::back_inserter(out), [](const auto& w) { return w.rule.rfind("wording:", 0) == 0; });
  return out;
}

std::string listing(const std::vector<guard::CaseWarning>& all) {
  std::string text;
  for (const auto& w : all) text += w.item + " [" + w.rule + "] " + w.message + "\n";
  return text;
}

}  // namespace

TEST_CASE("case guard: a well-formed case has no warnings") {
  const auto all = warnings_of(read(base_case()));
  INFO(listing(all));
  CHECK(all.empty());
}

TEST_CASE("case guard: assigned probabilities that sum to 1") {
  // P(E|Hp) and P(E|Hd) are probabilities of the same findings under two propositions; they need
  // not sum to 1 (common practice; ENFSI 2015 guideline, probabilities of the findings).
  namespace rules = guard::case_rules;
  json doc = base_case();
  doc["items"][0]["p_given_hp"] = 0.8;
  doc["items"][0]["p_given_hd"] = 0.2;
  auto found = with_rule(warnings_of(read(doc)), rules::complementary_probabilities);
  REQUIRE(found.size() == 1);
  CHECK(found[0].item == "A");
  CHECK(found[0].severity == guard::Severity::warning);

  // The means count: counts 1 of 2 have mean (1+1)/(2+2) = 1/2 by Laplace's rule, so 0.5 and
  // 1 of 2 sum to 1.
  doc["items"][0]["p_given_hp"] = 0.5;
  doc["items"][0]["p_given_hd"] = json{{"counts", {{"k", 1}, {"n", 2}}}};
  CHECK(with_rule(warnings_of(read(doc)), rules::complementary_probabilities).size() == 1);

  doc["items"][0]["p_given_hd"] = 0.3;
  CHECK(with_rule(warnings_of(read(doc)), rules::complementary_probabilities).empty());
  // An exclusion (impossible under Hp, certain under Hd) sums to 1 without any complement.
  doc["items"][0]["p_given_hp"] = 0.0;
  doc["items"][0]["p_given_hd"] = 1.0;
  CHECK(with_rule(warnings_of(read(doc)), rules::complementary_probabilities).empty());
}

TEST_CASE("case guard: a value described in the item's text as the probability of a proposition") {
  // Transposed conditional: P(E|H) stated as P(H|E) (Thompson & Schumann 1987, Law and Human
  // Behavior 11:167; the source probability error, Koehler 1993, Jurimetrics 34:21).
  namespace rules = guard::case_rules;
  json doc = base_case();
  doc["items"][1]["p_given_hp"] = 0.95;
  doc["items"][1]["description"] = "Glass on the jacket. The probability that he is the source is 0.95.";
  auto all = warnings_of(read(doc));
  INFO(listing(all));
  REQUIRE(wording(all).size() == 1);
  CHECK(wording(all)[0].item == "B");
  CHECK(wording(all)[0].field == "description");
  auto numeric = with_rule(all, rules::value_as_proposition_probability);
  REQUIRE(numeric.size() == 1);
  CHECK(numeric[0].item == "B");
  CHECK(numeric[0].message.find("P(E|Hp)") != std::string::npos);

  SECTION("a percentage and a frequency are compared as probabilities") {
    doc["items"][1]["notes"] = "There is a 95% probability that he is the source.";
    doc["items"][1]["description"] = "There is a 1 in 50 chance that someone else left the glass.";  // P(E|Hd) = 0.02
    all = warnings_of(read(doc));
    INFO(listing(all));
    CHECK(wording(all).size() == 2);
    numeric = with_rule(all, rules::value_as_proposition_probability);
    REQUIRE(numeric.size() == 2);
    CHECK(numeric[0].field == "description");
    CHECK(numeric[0].message.find("P(E|Hd)") != std::string::npos);
    CHECK(numeric[1].field == "notes");
  }
  SECTION("a number that is not one of the item's values gives the wording finding only") {
    doc["items"][1]["description"] = "The probability that he is the source is 0.9.";
    all = warnings_of(read(doc));
    CHECK(wording(all).size() == 1);
    CHECK(with_rule(all, rules::value_as_proposition_probability).empty());
  }
  SECTION("a refuted statement is not the author's: no warning") {
    doc["items"][1]["description"] = "It would be wrong to say that the probability that he is the source is 0.95.";
    all = warnings_of(read(doc));
    INFO(listing(all));
    CHECK(all.empty());
  }
  SECTION("a posterior stated in the notes is flagged in casework, not in training") {
    doc["items"][1]["description"] = "Glass on the jacket.";
    doc["items"][1]["notes"] = "The posterior probability that he is the source is 0.99.";
    CHECK(!wording(warnings_of(read(doc))).empty());
    doc["mode"] = "training";
    CHECK(wording(warnings_of(read(doc))).empty());
  }
}

TEST_CASE("case guard: the wording of the case's own texts is checked") {
  json doc = base_case();
  doc["case"]["purpose"] = "He is almost certainly the donor.";
  doc["propositions"]["conditioning_information"] = "The chance that someone else left the fibres is 1 in 1,000.";
  doc["propositions"]["assumptions"] = json::array({"\"He is almost certainly the donor\" was said by a witness."});
  doc["items"][0]["combination"] = {{"included", true}, {"independence", "He is almost certainly the donor."}};
  const auto all = wording(warnings_of(read(doc)));
  INFO(listing(all));
  REQUIRE(all.size() == 3);  // the quoted assumption is advice only
  CHECK(all[0].item == "case");
  CHECK(all[0].field == "purpose");
  CHECK(all[1].item == "propositions");
  CHECK(all[1].field == "conditioning_information");
  CHECK(all[2].item == "A");
  CHECK(all[2].field == "independence");
}

TEST_CASE("case guard: propositions that are not mutually exclusive by wording") {
  // Propositions must be mutually exclusive (ENFSI 2015 Guideline for Evaluative Reporting).
  namespace rules = guard::case_rules;
  json doc = base_case();
  auto& p = doc["propositions"];
  auto rules_found = [&] {
    std::vector<std::string> ids;
    for (const auto& w : warnings_of(read(doc)))
      if (w.item == "propositions") ids.push_back(w.rule);
    return ids;
  };
  using V = std::vector<std::string>;

  p["hp"] = "Mr Ashby broke the window";
  p["hd"] = "Mr  ashby broke the window.";
  CHECK(rules_found() == V{std::string(rules::propositions_identical)});

  p["hd"] = "Mr Ashby broke the window or someone else did";
  CHECK(rules_found() == V{std::string(rules::propositions_overlap)});
  p["hd"] = "Mr Ashby or another person broke the window";  // Hp's words in order, with "or"
  CHECK(rules_found() == V{std::string(rules::propositions_overlap)});
  p["hd"] = "Mr Ashby broke the window and left by the door";  // Hd implies Hp
  CHECK(rules_found() == V{std::string(rules::propositions_overlap)});

  p["hd"] = "Mr Ashby may have been at the bakery";
  CHECK(rules_found() == V{std::string(rules::proposition_possibility)});
  p["hd"] = "Mr Ashby could have been at the bakery";
  CHECK(rules_found() == V{std::string(rules::proposition_possibility)});

  // Plain negations are fine.
  for (const char* hd : {"Mr Ashby did not break the window", "It is not the case that Mr Ashby broke the window",
                         "Mr Ashby could not have reached the window", "An unknown person, not Mr Ashby or his brother, broke the window",
                         "Mr Ashby has never been to the bakery"}) {
    p["hd"] = hd;
    INFO(hd);
    CHECK(rules_found().empty());
  }
}

TEST_CASE("case guard: items addressing a lower level of the hierarchy than the propositions") {
  // Cook, Evett, Jackson, Jones & Lambert 1998, Science & Justice 38:231-239: a sub-source LR
  // does not answer an activity question.
  namespace rules = guard::case_rules;
  json doc = read_demo_json("harwick-vale-dna.json");
  CHECK(with_rule(warnings_of(read(doc, COUNTERPOISE_DEMO_DIR)), rules::lower_level_item).empty());
  doc["propositions"]["level"] = "activity";
  auto found = with_rule(warnings_of(read(doc, COUNTERPOISE_DEMO_DIR)), rules::lower_level_item);
  REQUIRE(found.size() == 1);
  CHECK(found[0].item == "D1");
  CHECK(found[0].message.find("sub-source") != std::string::npos);
  CHECK(found[0].message.find("activity") != std::string::npos);

  // The model's own level counts, whatever the item declares.
  doc["items"][0]["level"] = "activity";
  CHECK(with_rule(warnings_of(read(doc, COUNTERPOISE_DEMO_DIR)), rules::lower_level_item).size() == 1);

  // Transfer items are activity level: under offence propositions they are lower, under source
  // propositions they are not.
  json fibres = read_demo_json("harwick-vale-fibres.json");
  fibres["propositions"]["level"] = "offence";
  CHECK(with_rule(warnings_of(read(fibres, COUNTERPOISE_DEMO_DIR)), rules::lower_level_item).size() == 1);
  fibres["propositions"]["level"] = "source";
  CHECK(with_rule(warnings_of(read(fibres, COUNTERPOISE_DEMO_DIR)), rules::lower_level_item).empty());

  // Other models as declared; no declared level, no warning.
  json assigned = base_case();
  assigned["propositions"]["level"] = "activity";
  CHECK(with_rule(warnings_of(read(assigned)), rules::lower_level_item).empty());
  assigned["items"][1]["level"] = "source";
  found = with_rule(warnings_of(read(assigned)), rules::lower_level_item);
  REQUIRE(found.size() == 1);
  CHECK(found[0].item == "B");
  CHECK(guard::item_level(read(assigned).items[1]) == casefile::PropositionLevel::source);
}

TEST_CASE("case guard: two included items that appear to evaluate the same findings") {
  // Multiplying the LRs of the same findings counts them twice (common practice).
  namespace rules = guard::case_rules;
  json doc = base_case();
  SECTION("same description, up to case and punctuation") {
    doc["items"][1]["description"] = "twelve red acrylic fibres on the jumper";
    const auto found = with_rule(warnings_of(read(doc)), rules::same_findings);
    REQUIRE(found.size() == 1);
    CHECK(found[0].item == "B");
    CHECK(found[0].message.find("items A and B") != std::string::npos);
    CHECK(found[0].message.find("description") != std::string::npos);
  }
  SECTION("same source data") {
    doc["items"][0]["source_data"] = "Fibre survey VFL-FS-2023 (invented).";
    doc["items"][1]["source_data"] = "Fibre survey VFL-FS-2023 (invented)";
    CHECK(with_rule(warnings_of(read(doc)), rules::same_findings).size() == 1);
  }
  SECTION("identical model inputs") {
    doc["items"][1]["p_given_hp"] = 0.8;
    doc["items"][1]["p_given_hd"] = json{{"counts", {{"k", 3}, {"n", 412}}}};
    const auto found = with_rule(warnings_of(read(doc)), rules::same_findings);
    REQUIRE(found.size() == 1);
    CHECK(found[0].message.find("identical model inputs") != std::string::npos);
  }
  SECTION("an item left out of the combination is not counted") {
    doc["items"][1]["description"] = "Twelve red acrylic fibres on the jumper.";
    doc["items"][1]["combination"] = {{"included", false}, {"exclusion_reason", "Shown for comparison."}};
    CHECK(with_rule(warnings_of(read(doc)), rules::same_findings).empty());
  }
}

TEST_CASE("case guard: many items with the same findings give one grouped warning") {
  // Multiplying the LRs of the same findings counts them as many times as they are combined
  // (common practice). 3000 identical items, then one distinct item, then two more identical ones
  // at positions 3002 and 3003 (1-based): one warning naming every item of the group, with its
  // runs written as ranges, instead of one warning per pair (4.5 million).
  json doc = base_case();
  doc["items"] = json::array();
  const json same = {{"model", "assigned"}, {"p_given_hp", 0.8}, {"p_given_hd", {{"counts", {{"k", 3}, {"n", 412}}}}}};
  for (int i = 1; i <= 3003; ++i) {
    json item = same;
    item["id"] = "E" + std::to_string(i);
    if (i == 3001) item["p_given_hd"] = 0.5;
    doc["items"].push_back(item);
  }
  const auto found = with_rule(warnings_of(read(doc)), guard::case_rules::same_findings);
  REQUIRE(found.size() == 1);
  CHECK(found[0].item == "E3003");
  CHECK(found[0].message.rfind("items E1\u2013E3000, E3002 and E3003 (3002 items) have identical model inputs", 0) == 0);
  CHECK(found[0].message.find("3002 times") != std::string::npos);
}

TEST_CASE("case guard: an item a network covers is also included in the combination") {
  namespace rules = guard::case_rules;
  json doc = read_demo_json("harwick-vale-network.json");
  CHECK(with_rule(warnings_of(read(doc, COUNTERPOISE_DEMO_DIR)), rules::covered_by_network).empty());
  for (auto& item : doc["items"])
    if (item["id"] == "E1") item["combination"] = {{"included", true}, {"independence", "Stated for the test."}};
  auto found = with_rule(warnings_of(read(doc, COUNTERPOISE_DEMO_DIR)), rules::covered_by_network);
  REQUIRE(found.size() == 1);
  CHECK(found[0].item == "E1");
  CHECK(found[0].message.find("N1") != std::string::npos);
  // With the network itself left out, E1 stands on its own.
  for (auto& item : doc["items"])
    if (item["id"] == "N1") item["combination"] = {{"included", false}, {"exclusion_reason", "Stated for the test."}};
  CHECK(with_rule(warnings_of(read(doc, COUNTERPOISE_DEMO_DIR)), rules::covered_by_network).empty());
}

TEST_CASE("case guard: prior odds set in a casework case") {
  // The prior odds belong to the fact-finder (ENFSI 2015 guideline; common practice).
  namespace rules = guard::case_rules;
  json doc = base_case();
  doc["priors"] = {{"odds", {0.01, 1}}};
  auto found = with_rule(warnings_of(read(doc)), rules::prior_in_casework);  // no mode: casework
  REQUIRE(found.size() == 1);
  CHECK(found[0].item == "priors");
  doc["mode"] = "casework";
  doc["priors"] = {{"range", {{"from", 1e-6}, {"to", 1e3}, {"points", 10}}}};
  CHECK(with_rule(warnings_of(read(doc)), rules::prior_in_casework).size() == 1);
  doc["priors"] = {{"one_of_n", {1000}}};
  CHECK(with_rule(warnings_of(read(doc)), rules::prior_in_casework).size() == 1);
  // Posterior thresholds of interest set no prior.
  doc["priors"] = {{"thresholds", {0.5, 0.99}}};
  CHECK(with_rule(warnings_of(read(doc)), rules::prior_in_casework).empty());
  doc["priors"] = {{"odds", {0.01, 1}}};
  doc["mode"] = "training";
  CHECK(with_rule(warnings_of(read(doc)), rules::prior_in_casework).empty());
}

TEST_CASE("case guard: text that is not well-formed UTF-8 throws") {
  auto value = read(base_case());
  value.items[0].notes = std::string("bad \xFF byte");
  CHECK_THROWS_AS(guard::check_case(value, default_checker()), validation::InvalidValue);
}

TEST_CASE("case guard: normalised wording ignores case, spacing and punctuation") {
  CHECK(guard::normalised_words("Twelve  red, acrylic fibres.") == guard::normalised_words("twelve red acrylic FIBRES"));
  CHECK(guard::normalised_words("12 fibres") != guard::normalised_words("13 fibres"));
}

TEST_CASE("case guard: the demo cases give only their expected warnings") {
  std::size_t demos = 0;
  for (const auto& entry : std::filesystem::directory_iterator(COUNTERPOISE_DEMO_DIR))
    demos += entry.path().extension() == ".json";
  CHECK(demos == expected_demo_warnings().size());  // a new demo case needs its line there
  for (const auto& [name, want] : expected_demo_warnings()) {
    const auto all = warnings_of(read_demo(name));
    std::vector<std::string> got;
    for (const auto& w : all) got.push_back(w.item + "/" + w.rule);
    INFO(name << "\n" << listing(all));
    CHECK(got == want);
  }
}
