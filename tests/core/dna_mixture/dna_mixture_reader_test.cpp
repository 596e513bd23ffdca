// Reading dna-mixture items: a throw test for every documented error, the minimum allele
// frequency as in dna-single-source, notes, detail and the round trip.
#include <catch2/catch.hpp>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/models/model_registry.hpp"
#include "mixture_test_support.hpp"

using namespace counterpoise::models::dna_mixture;
using counterpoise::validation::InvalidValue;
using Catch::Matchers::Contains;
using nlohmann::json;

namespace {

json base_item() {
  return json::parse(R"({
    "id": "M1", "model": "dna-mixture", "theta": 0.01,
    "observed": {"D8S1179": ["12", "13", "15"], "TH01": ["6", "9.3"], "AMEL": ["X", "Y"]},
    "references": {"suspect": {"D8S1179": ["12", "15"], "TH01": ["9.3", "9.3"], "FGA": ["21", "22"]},
                   "victim": {"D8S1179": ["13", "13"], "TH01": ["6", "9.3"]}},
    "hp": {"contributors": ["suspect", "victim"], "unknowns": 0},
    "hd": {"contributors": ["victim"], "unknowns": 1},
    "dropout": 0.1, "dropin": 0.05,
    "frequencies": {"table": {"D8S1179": {"12": 0.15, "13": 0.30, "14": 0.21, "15": 0.16},
                              "TH01": {"6": 0.23, "7": 0.19, "9.3": 0.35}},
                    "database_size": 200}
  })");
}

bool has_note(const counterpoise::models::PointResult& r, const std::string& code) {
  for (const auto& note : r.notes)
    if (note.code == code) return true;
  return false;
}

void check_error(const json& item, const std::string& field, const std::string& text) {
  try {
    mixture_test::read(item);
    FAIL("no error for " << item.dump());
  } catch (const InvalidValue& error) {
    CHECK(error.where().item == "M1");
    CHECK(error.where().field == field);
    CHECK_THAT(error.bare_message(), Contains(text));
  }
}

}  // namespace

TEST_CASE("the registry reads dna-mixture items", "[dna_mixture][reader]") {
  const auto* entry = counterpoise::models::find_model("dna-mixture");
  REQUIRE(entry != nullptr);
  const auto model = entry->read(base_item(), mixture_test::context());
  CHECK(model->kind() == "dna-mixture");
  CHECK(model->evaluate().lr.is_finite());
}

TEST_CASE("detail, notes and round trip", "[dna_mixture][reader]") {
  const auto model = mixture_test::read(base_item());
  const auto result = model->evaluate();
  CHECK(has_note(result, "amelogenin-not-used"));
  CHECK(has_note(result, "reference-locus-not-used"));  // the suspect's FGA
  const auto& loci = result.detail["loci"];
  REQUIRE(loci.size() == 2);
  CHECK(loci[0]["locus"] == "D8S1179");
  // Classes: observed 12, 13, 15, then Q with 1 - (0.15 + 0.30 + 0.16).
  REQUIRE(loci[0]["classes"].size() == 4);
  CHECK(loci[0]["classes"][3]["allele"] == "Q");
  CHECK(loci[0]["classes"][3]["frequency"].get<double>() == Approx(1 - 0.61).epsilon(1e-14));
  CHECK(loci[0]["classes"][0]["conditioning_copies"] == 1);  // the suspect's 12
  CHECK(loci[0]["classes"][1]["conditioning_copies"] == 2);  // the victim's 13, 13
  CHECK(loci[0]["hd"]["genotype_sets"].get<int>() > 0);
  CHECK(!loci[0]["hd"]["leading_genotype_sets"].empty());
  CHECK(result.detail["hp"]["number_of_contributors"] == 2);
  CHECK(result.detail["dropout"]["homozygote"] == "d^2");
  CHECK(model->to_json() == [] {
    json fields = base_item();
    fields.erase("id");
    fields.erase("model");
    return fields;
  }());
  CHECK_THAT(model->assumptions(), Contains("if Hd is true, it comes from victim and 1 unknown person"));
}

TEST_CASE("an allele not in the table follows the single-source rule", "[dna_mixture][reader]") {
  // dna-single-source floors unlisted alleles at the minimum allele frequency (5/2N when the
  // database size is known) and rejects them when no floor applies; the mixture does the same.
  json item = base_item();
  item["observed"]["D8S1179"] = {"12", "13", "15", "17"};
  item["hp"]["unknowns"] = 0;
  const auto result = mixture_test::read(item)->evaluate();
  CHECK(has_note(result, "minimum-allele-frequency"));
  CHECK(result.detail["loci"][0]["classes"][3]["frequency"].get<double>() == Approx(5.0 / 400).epsilon(1e-15));
  CHECK(result.detail["loci"][0]["classes"][3]["minimum_frequency_applied"] == true);
  item["min_allele_frequency"] = "none";
  check_error(item, "observed.D8S1179", "allele 17 at locus D8S1179 is not in the frequency table");
}

TEST_CASE("every documented error names the item and field", "[dna_mixture][reader]") {
  SECTION("more observed alleles than the contributors carry, without drop-in") {
    json item = base_item();
    item["dropin"] = 0;
    item["observed"]["D8S1179"] = {"12", "13", "14", "15", "16"};
    item["frequencies"]["table"]["D8S1179"]["16"] = 0.1;
    check_error(item, "hp", "locus D8S1179 shows 5 alleles, more than the 4 that the 2 contributors under Hp can carry");
  }
  SECTION("a reference profile missing a locus") {
    json item = base_item();
    item["references"]["victim"].erase("TH01");
    check_error(item, "references.victim", "the reference profile of victim has no locus TH01");
  }
  SECTION("a stated number of contributors that differs from the named people and unknowns") {
    json item = base_item();
    item["hd"]["number_of_contributors"] = 3;
    check_error(item, "hd.number_of_contributors", "number_of_contributors is 3 but 1 named (victim) and 1 unknown");
  }
  SECTION("a contributor with no reference profile") {
    json item = base_item();
    item["hp"]["contributors"] = {"suspect", "witness"};
    check_error(item, "hp.contributors[1]", "contributor 'witness' has no reference profile");
  }
  SECTION("a contributor named twice") {
    json item = base_item();
    item["hp"]["contributors"] = {"suspect", "suspect"};
    check_error(item, "hp.contributors[0]", "named twice");
  }
  SECTION("no contributors, or more than four") {
    json item = base_item();
    item["hd"] = {{"contributors", json::array()}, {"unknowns", 0}};
    check_error(item, "hd", "Hd has no contributors");
    item["hd"] = {{"contributors", {"victim"}}, {"unknowns", 4}};
    check_error(item, "hd", "make 5; at most 4");
    item["hd"] = {{"contributors", json::array()}, {"unknowns", 5}};
    check_error(item, "hd.unknowns", "at most 4");
  }
  SECTION("an observed allele listed twice or not a string") {
    json item = base_item();
    item["observed"]["TH01"] = {"6", "6"};
    check_error(item, "observed.TH01[1]", "listed twice");
    item["observed"]["TH01"] = {"6", 9};
    check_error(item, "observed.TH01[1]", "written as a string");
  }
  SECTION("a locus given twice in two spellings") {
    json item = base_item();
    item["observed"]["th01"] = {"6"};
    check_error(item, "observed.th01", "locus TH01 is given twice");
  }
  SECTION("an observed locus missing from the frequency table") {
    json item = base_item();
    item["observed"]["FGA"] = {"21"};
    item["references"]["victim"]["FGA"] = {"21", "21"};
    check_error(item, "observed.FGA", "locus FGA is not in the frequency table");
  }
  SECTION("frequencies of the alleles in play above 1") {
    json item = base_item();
    item["frequencies"]["table"]["TH01"] = {{"6", 0.7}, {"9.3", 0.5}};
    check_error(item, "frequencies", "sum to 1.2, more than 1");
  }
  SECTION("findings impossible under both propositions") {
    json item = base_item();
    item["dropout"] = 0;
    item["dropin"] = 0;
    item["observed"]["TH01"] = {"6"};  // the victim's 9.3 missing, and the victim is in both
    check_error(item, "observed", "impossible under both propositions (at locus TH01)");
  }
  SECTION("probabilities out of range and misspelt fields") {
    json item = base_item();
    item["dropin"] = 1.5;
    check_error(item, "dropin", "outside [0, 1]");
    item = base_item();
    item["dropout_homozygote"] = -0.1;
    check_error(item, "dropout_homozygote", "outside [0, 1]");
    item = base_item();
    item["dropout"] = {{"beta", {0, 2}}};
    CHECK_THROWS_AS(mixture_test::read(item), InvalidValue);
    item = base_item();
    item["theta"] = 1.0;
    check_error(item, "theta", "outside [0, 1)");
    item = base_item();
    item["drop_out"] = 0.1;
    CHECK_THROWS_AS(mixture_test::read(item), InvalidValue);
    item = base_item();
    item["hp"]["unknown"] = 1;
    CHECK_THROWS_AS(mixture_test::read(item), InvalidValue);
    item = base_item();
    item.erase("dropin");
    check_error(item, "dropin", "");
  }
}

TEST_CASE("bad own drop-out rates and uncertain alleles name item, locus and field", "[dna_mixture][reader]") {
  SECTION("an own rate for someone who is no contributor") {
    json item = base_item();
    item["references"]["brother"] = item["references"]["victim"];
    item["dropout_by_contributor"] = {{"brother", 0.2}};
    check_error(item, "dropout_by_contributor.brother", "a contributor under neither proposition");
  }
  SECTION("an own rate given as a distribution, or out of range") {
    json item = base_item();
    item["dropout_by_contributor"] = {{"victim", {{"beta", {2, 10}}}}};
    check_error(item, "dropout_by_contributor.victim", "only the shared dropout may be a distribution");
    item["dropout_by_contributor"] = {{"victim", {{"dropout", {{"beta", {2, 10}}}}}}};
    check_error(item, "dropout_by_contributor.victim.dropout", "must be a number");
    item["dropout_by_contributor"] = {{"victim", 1.2}};
    check_error(item, "dropout_by_contributor.victim", "outside [0, 1]");
    item["dropout_by_contributor"] = {{"victim", {{"dropout", 0.1}, {"dropout_homozygote", -1}}}};
    check_error(item, "dropout_by_contributor.victim.dropout_homozygote", "outside [0, 1]");
    item["dropout_by_contributor"] = {{"victim", {{"dropout", 0.1}, {"homozygote", 0.01}}}};
    CHECK_THROWS_AS(mixture_test::read(item), InvalidValue);
  }
  SECTION("an allele both observed and uncertain") {
    json item = base_item();
    item["uncertain"] = {{"D8S1179", {"14", "13"}}};
    check_error(item, "uncertain.D8S1179[1]", "allele 13 is listed both as observed and as uncertain at locus D8S1179");
  }
  SECTION("uncertain alleles at a locus not observed") {
    json item = base_item();
    item["uncertain"] = {{"FGA", {"21"}}};
    check_error(item, "uncertain.FGA", "locus FGA has uncertain alleles but is not in the observed profile");
  }
  SECTION("an uncertain allele not in the table, listed twice, or not a string") {
    json item = base_item();
    item["uncertain"] = {{"TH01", {"8"}}};
    item["min_allele_frequency"] = "none";
    check_error(item, "uncertain.TH01", "8");
    item["uncertain"] = {{"TH01", {"7", "7"}}};
    check_error(item, "uncertain.TH01[1]", "listed twice");
    item["uncertain"] = {{"TH01", {7}}};
    check_error(item, "uncertain.TH01[0]", "written as a string");
  }
}

TEST_CASE("own rates and uncertain alleles in the detail and the assumptions", "[dna_mixture][reader]") {
  json item = base_item();
  item["dropout_by_contributor"] = {{"victim", 0.02}};
  item["uncertain"] = {{"TH01", {"7"}}};
  const auto model = mixture_test::read(item);
  const auto detail = model->evaluate().detail;
  CHECK(detail["dropout"]["by_contributor"]["victim"]["dropout"].get<double>() == 0.02);
  CHECK(detail["dropout"]["by_contributor"]["victim"]["homozygote"] == "d^2");
  CHECK(detail["loci"][1]["uncertain"] == json::array({"7"}));
  CHECK_THAT(model->assumptions(), Contains("except victim's, which drop out with probability 0.02"));
  CHECK_THAT(model->assumptions(), Contains("Alleles marked uncertain"));
  CHECK(model->to_json()["uncertain"] == item["uncertain"]);
  CHECK(model->to_json()["dropout_by_contributor"] == item["dropout_by_contributor"]);
}
