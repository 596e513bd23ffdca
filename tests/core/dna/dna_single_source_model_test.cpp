// The dna-single-source model: reading, point LR, exclusions, floors, round trip and errors.
#include <catch2/catch.hpp>

#include <algorithm>
#include <array>
#include <map>
#include <cmath>
#include <fstream>

#include "core/models/dna/dna_single_source_model.hpp"
#include "dna_test_support.hpp"

using namespace counterpoise::models::dna;
using counterpoise::validation::InvalidValue;
using Catch::Matchers::Contains;
using nlohmann::json;

namespace {

json base_item() {
  return json::parse(R"({
    "id": "D1", "model": "dna-single-source", "theta": 0.01, "relationship": "unrelated",
    "profile": {"D8S1179": ["13", "14"], "TH01": ["9.3", "9.3"]},
    "frequencies": {"table": {"D8S1179": {"13": 0.30, "14": 0.21}, "TH01": {"9.3": 0.35}}}
  })");
}

bool has_note(const counterpoise::models::PointResult& r, const std::string& code) {
  for (const auto& note : r.notes)
    if (note.code == code) return true;
  return false;
}

double het(double p, double q, double t) { return 2 * (t + (1 - t) * p) * (t + (1 - t) * q) / ((1 + t) * (1 + 2 * t)); }
double hom(double p, double t) { return (2 * t + (1 - t) * p) * (3 * t + (1 - t) * p) / ((1 + t) * (1 + 2 * t)); }

}  // namespace

TEST_CASE("point LR is 1 / the product of locus match probabilities", "[dna][model]") {
  const auto model = dna_test::read(base_item());
  const auto result = model->evaluate();
  // NRC II eq. 4.10a/b per locus; loci multiply (NRC II section 4.2, product rule across loci).
  const double expected_log10_lr = -std::log10(het(0.30, 0.21, 0.01) * hom(0.35, 0.01));
  CHECK(result.lr.log10() == Approx(expected_log10_lr).epsilon(1e-13));
  CHECK(*result.log10_p_given_hp == 0.0);
  CHECK(*result.log10_p_given_hd == Approx(-expected_log10_lr).epsilon(1e-13));
  const auto& loci = result.detail["loci"];
  REQUIRE(loci.size() == 2);
  CHECK(loci[0]["zygosity"] == "heterozygote");
  CHECK(loci[1]["zygosity"] == "homozygote");
  CHECK(loci[0]["match_probability"].get<double>() == Approx(het(0.30, 0.21, 0.01)).epsilon(1e-13));
  CHECK(result.detail["theta"] == 0.01);
  CHECK(result.detail["relationship"]["name"] == "unrelated");
  CHECK_FALSE(model->is_uncertain());  // frequencies only
  CHECK(has_note(result, "no-sampling-interval"));
  CHECK_THAT(model->assumptions(), Contains("if Hd is true, the source is a person unrelated"));
}

TEST_CASE("relationship shapes", "[dna][model]") {
  auto item = base_item();
  item["theta"] = 0.0;
  item["relationship"] = "full-sibling";
  const double expected = ((1 + 0.30 + 0.21 + 2 * 0.30 * 0.21) / 4) * ((1 + 0.35) * (1 + 0.35) / 4);
  CHECK(dna_test::read(item)->evaluate().lr.log10() == Approx(-std::log10(expected)).epsilon(1e-13));
  item["relationship"] = json::parse(R"({"ibd": [0.25, 0.5, 0.25]})");
  CHECK(dna_test::read(item)->evaluate().lr.log10() == Approx(-std::log10(expected)).epsilon(1e-13));
  CHECK_THAT(dna_test::read(item)->assumptions(), Contains("identical by descent"));
  item.erase("relationship");  // default: unrelated
  CHECK(dna_test::read(item)->evaluate().detail["relationship"]["name"] == "unrelated");
}

TEST_CASE("the standard relationships a form offers each read, with IBD coefficients summing to one", "[dna][model]") {
  // k0, k1, k2 of the standard relationships (Weir, Anderson & Hepler 2006, Nat. Rev. Genet.
  // 7:771, Table 1 — from memory; the values are common practice).
  const std::map<std::string, std::array<double, 3>> expected = {
      {"unrelated", {1.0, 0.0, 0.0}},      {"parent-child", {0.0, 1.0, 0.0}}, {"full-sibling", {0.25, 0.5, 0.25}},
      {"half-sibling", {0.5, 0.5, 0.0}}, {"first-cousin", {0.75, 0.25, 0.0}}};
  const auto names = standard_relationship_names();
  REQUIRE(names.size() == expected.size());
  CHECK(names.front() == "unrelated");
  for (const auto& name : names) {
    INFO(name);
    REQUIRE(expected.count(name) == 1);
    const auto ibd = ibd_of_relationship(name);
    REQUIRE(ibd);
    CHECK(std::array<double, 3>{ibd->k0, ibd->k1, ibd->k2} == expected.at(name));
    auto item = base_item();
    item["relationship"] = name;
    CHECK(dna_test::read(item)->evaluate().detail["relationship"]["name"] == name);
  }
}

TEST_CASE("exclusion and loci not interpretable", "[dna][model]") {
  auto item = base_item();
  item["reference_profile"] = json::parse(R"({"D8S1179": ["14", "13"], "TH01": ["9.3", "10"]})");
  SECTION("a differing locus excludes: LR = 0") {
    const auto model = dna_test::read(item);
    const auto result = model->evaluate();
    CHECK(result.lr.is_zero());
    CHECK(has_note(result, "exclusion"));
    CHECK(result.detail["exclusion"] == true);
    CHECK(result.detail["excluded_loci"][0]["locus"] == "TH01");
    CHECK_FALSE(model->is_uncertain());
  }
  SECTION("marked not interpretable: the locus is left out") {
    item["uninterpretable_loci"] = {"TH01"};
    const auto result = dna_test::read(item)->evaluate();
    CHECK(result.lr.log10() == Approx(-std::log10(het(0.30, 0.21, 0.01))).epsilon(1e-13));
    CHECK(result.detail["excluded_loci"][0]["reason"] == "not-interpretable");
    CHECK(has_note(result, "not-interpretable"));
  }
  SECTION("allele order does not matter; a homozygote may be written once") {
    item["reference_profile"] = json::parse(R"({"D8S1179": ["14", "13"], "TH01": ["9.3"]})");
    CHECK(dna_test::read(item)->evaluate().lr.is_finite());
  }
  SECTION("a locus missing from the reference is not compared") {
    item["reference_profile"] = json::parse(R"({"D8S1179": ["13", "14"]})");
    const auto result = dna_test::read(item)->evaluate();
    CHECK(has_note(result, "locus-not-compared"));
    CHECK(result.lr.log10() == Approx(-std::log10(het(0.30, 0.21, 0.01))).epsilon(1e-13));
  }
}

TEST_CASE("Amelogenin is not used in the match probability", "[dna][model]") {
  auto item = base_item();
  item["profile"]["AMEL"] = {"X", "Y"};
  item["reference_profile"] = item["profile"];
  item["reference_profile"]["AMEL"] = {"X"};
  const auto result = dna_test::read(item)->evaluate();
  CHECK(result.lr.is_finite());
  CHECK(has_note(result, "amelogenin-not-used"));
  CHECK(result.lr.log10() == Approx(dna_test::read(base_item())->evaluate().lr.log10()).epsilon(1e-15));
}

TEST_CASE("minimum allele frequency", "[dna][model][floor]") {
  SECTION("5/2N: Butler's example N = 302 gives 0.00828") {
    // Butler 2005, "Forensic DNA Typing" 2nd ed., ch. 21 (rare alleles): for N = 302 the
    // minimum allele threshold 5/2N is 0.00828 (NRC II 1996 p. 148).
    auto item = base_item();
    item["frequencies"] = json::parse(R"({"table": {"D8S1179": {"13": 0.30, "14": 0.21}, "TH01": {"9.3": 0.35, "6": 0.001}}, "database_size": 302})");
    item["profile"]["TH01"] = {"6", "17"};  // 17 is not in the table
    const auto model = dna_test::read(item);
    const auto result = model->evaluate();
    const auto& th01 = result.detail["loci"][1];
    CHECK(th01["minimum_frequency"].get<double>() == Approx(0.00828).margin(0.000005));
    CHECK(th01["minimum_frequency_applied"] == true);
    CHECK(th01["frequencies_used"]["6"].get<double>() == Approx(5.0 / 604).epsilon(1e-15));
    CHECK(th01["table_frequencies"]["17"].is_null());
    CHECK(has_note(result, "minimum-allele-frequency"));
  }
  SECTION("a configured floor") {
    auto item = base_item();
    item["min_allele_frequency"] = 0.4;
    const auto result = dna_test::read(item)->evaluate();
    CHECK(result.lr.log10() == Approx(-std::log10(het(0.4, 0.4, 0.01) * hom(0.4, 0.01))).epsilon(1e-13));
  }
  SECTION("an unseen allele without any floor is an error naming it") {
    auto item = base_item();
    item["profile"]["TH01"] = {"9.3", "11"};
    CHECK_THROWS_WITH(dna_test::read(item),
                      Contains("field profile.TH01") && Contains("allele 11") && Contains("not in the frequency table"));
  }
  SECTION("5/2N demanded without a database size") {
    auto item = base_item();
    item["min_allele_frequency"] = "5/2N";
    CHECK_THROWS_WITH(dna_test::read(item), Contains("needs the database size at locus"));
  }
  SECTION("none disables the automatic floor") {
    auto item = base_item();
    item["frequencies"]["database_size"] = 10;  // 5/2N = 0.25 would floor nothing here
    item["min_allele_frequency"] = "none";
    CHECK(dna_test::read(item)->evaluate().detail["loci"][0].count("minimum_frequency") == 0);
  }
}

TEST_CASE("round trip keeps the file reference, not the table", "[dna][model]") {
  dna_test::TempFolder folder;
  folder.write("freq.csv", "locus,allele,count\nD8S1179,13,60\nD8S1179,14,42\nD8S1179,10,98\nTH01,9.3,70\nTH01,6,130\n");
  auto item = dna_test::matched(base_item());
  item["frequencies"] = {{"file", "freq.csv"}};
  item["uninterpretable_loci"] = json::array();
  const auto model = dna_test::read(item, folder.path());
  json expected = item;
  for (auto key : {"id", "model"}) expected.erase(key);
  CHECK(model->to_json() == expected);
  CHECK(model->is_uncertain());  // counts
  // Reading what was written gives the same LR.
  json again = model->to_json();
  CHECK(dna_test::read(again, folder.path())->evaluate().lr == model->evaluate().lr);
}

TEST_CASE("every reading error names the item and field", "[dna][model][errors]") {
  auto check_error = [](json item, const std::string& text) {
    CAPTURE(item.dump(), text);
    CHECK_THROWS_WITH(dna_test::read(item), Contains(text));
    CHECK_THROWS_AS(dna_test::read(item), InvalidValue);
  };
  auto item = base_item();
  SECTION("missing theta") { item.erase("theta"); check_error(item, "field theta: missing field"); }
  SECTION("theta out of range") { item["theta"] = 1.0; check_error(item, "outside [0, 1)"); }
  SECTION("negative theta") { item["theta"] = -0.01; check_error(item, "outside [0, 1)"); }
  SECTION("unknown relationship") { item["relationship"] = "cousin"; check_error(item, "unknown relationship"); }
  SECTION("IBD not summing to 1") {
    item["relationship"] = json::parse(R"({"ibd": [0.5, 0.5, 0.5]})");
    check_error(item, "must be 1");
  }
  SECTION("IBD coefficient outside [0, 1]") {
    item["relationship"] = json::parse(R"({"ibd": [1.5, -0.5, 0]})");
    check_error(item, "relationship.ibd[0]");
  }
  SECTION("IBD of the wrong size") {
    item["relationship"] = json::parse(R"({"ibd": [0.5, 0.5]})");
    CHECK_THROWS_WITH(dna_test::read(item), Contains("three coefficients"));
  }
  SECTION("relationship of the wrong type") { item["relationship"] = 3; check_error(item, "relationship name"); }
  SECTION("missing profile") { item.erase("profile"); check_error(item, "field profile: missing field"); }
  SECTION("empty profile") { item["profile"] = json::object(); check_error(item, "lists no loci"); }
  SECTION("three alleles") { item["profile"]["TH01"] = {"6", "7", "8"}; check_error(item, "mixture"); }
  SECTION("no allele") { item["profile"]["TH01"] = json::array(); check_error(item, "one or two alleles"); }
  SECTION("allele as a number") { item["profile"]["TH01"] = json::parse("[9.3]"); check_error(item, "profile.TH01[0]"); }
  SECTION("empty allele") { item["profile"]["TH01"] = {""}; check_error(item, "empty allele"); }
  SECTION("locus twice in two spellings") { item["profile"]["th01"] = {"6"}; check_error(item, "given twice"); }
  SECTION("profile locus missing from the table") {
    item["profile"]["FGA"] = {"20", "22"};
    check_error(item, "locus FGA is not in the frequency table");
  }
  SECTION("uninterpretable locus not in the profile") {
    item["uninterpretable_loci"] = {"FGA"};
    check_error(item, "not in the profile");
  }
  SECTION("uninterpretable locus twice") {
    item["uninterpretable_loci"] = {"TH01", "TH01"};
    check_error(item, "listed twice");
  }
  SECTION("bad min_allele_frequency") { item["min_allele_frequency"] = 0.0; check_error(item, "outside (0, 1]"); }
  SECTION("bad min_allele_frequency text") { item["min_allele_frequency"] = "5/N"; check_error(item, "expected a frequency"); }
  SECTION("unknown field") { item["thetta"] = 0.01; check_error(item, "unknown field"); }
  SECTION("missing frequencies") { item.erase("frequencies"); check_error(item, "field frequencies: missing field"); }
  SECTION("reference profile not an object") { item["reference_profile"] = json::array(); check_error(item, "expected an object"); }
}

TEST_CASE("sampling interval only with counts", "[dna][model][posterior]") {
  auto item = base_item();
  SECTION("frequencies x 2N whole: counts recovered, item uncertain") {
    item["frequencies"] = json::parse(R"({"table": {"D8S1179": {"13": 0.30, "14": 0.21, "10": 0.49}, "TH01": {"9.3": 0.35, "6": 0.65}}, "database_size": 100})");
    CHECK(dna_test::read(item)->is_uncertain());
  }
  SECTION("frequencies x 2N not whole: no interval, said in a note") {
    item["frequencies"] = json::parse(R"({"table": {"D8S1179": {"13": 0.3012, "14": 0.21, "10": 0.4888}, "TH01": {"9.3": 0.35, "6": 0.65}}, "database_size": 100})");
    const auto model = dna_test::read(item);
    CHECK_FALSE(model->is_uncertain());
    CHECK(has_note(model->evaluate(), "no-sampling-interval"));
    // Without a spread, draws are the point value.
    std::mt19937_64 rng(1);
    std::vector<double> out(3);
    model->draw_log10_lr(rng, out);
    CHECK(out[0] == model->evaluate().lr.log10());
  }
}

TEST_CASE("non-standard locus names are used with a note", "[dna][model]") {
  auto item = base_item();
  item["profile"]["D6S474"] = {"14", "15"};
  item["frequencies"]["table"]["D6S474"] = {{"14", 0.2}, {"15", 0.3}};
  const auto result = dna_test::read(item)->evaluate();
  CHECK(has_note(result, "nonstandard-locus"));
  CHECK(result.detail["loci"].size() == 3);
}

TEST_CASE("the Harwick Vale demo item reads and evaluates", "[dna][model][demo]") {
  const std::filesystem::path demo = COUNTERPOISE_DEMO_DIR;
  std::ifstream in(demo / "harwick-vale-dna.json");
  const json doc = json::parse(in);
  // The demo weighs Hp against an unrelated donor (Hd1) and a brother of Mr Pryce (Hd2).
  const std::vector<std::string> ids{"Hd1", "Hd2"};
  const auto both = read_dna_single_source_alternatives(doc["items"][0], ids, dna_test::context(demo));
  const auto model = std::dynamic_pointer_cast<const DnaSingleSourceModel>(both[0]);
  REQUIRE(model);
  CHECK(both[1]->evaluate().detail["relationship"]["name"] == "full-sibling");
  CHECK(both[1]->evaluate().lr.log10() < model->evaluate().lr.log10());
  const auto result = model->evaluate();
  CHECK(model->is_uncertain());
  CHECK(result.lr.favours_hp());
  // The invented table's D18S51 allele 21 has count 1 of 500 alleles: 5/2N = 0.01 is used.
  CHECK(has_note(result, "minimum-allele-frequency"));
  CHECK(has_note(result, "amelogenin-not-used"));
  CHECK(model->to_json()["frequencies"]["file"] == "dna/vale-str-frequencies.csv");
}

TEST_CASE("an exclusion needs no frequencies at the differing locus", "[dna][model]") {
  auto item = base_item();
  item["profile"]["FGA"] = {"20", "22"};  // not in the table
  item["reference_profile"] = item["profile"];
  item["reference_profile"]["FGA"] = {"21", "22"};
  const auto result = dna_test::read(item)->evaluate();
  CHECK(result.lr.is_zero());
  CHECK(result.detail["log10_match_probability"].is_null());
}

TEST_CASE("draws of a very rare profile do not underflow", "[dna][model][posterior][extremes]") {
  // Regression for underflow in the draws: 120 (invented, non-standard) loci, each a homozygote
  // for an allele seen once among 2000, give a match probability near 10^-630, far below the
  // smallest double; the products inside a draw must be moved into log10 in time.
  json profile = json::object(), counts = json::object();
  for (int i = 0; i < 120; ++i) {
    const std::string locus = "X" + std::to_string(i);
    profile[locus] = {"7"};
    counts[locus] = {{"7", 1}, {"8", 1999}};
  }
  json item{{"theta", 0.0}, {"profile", profile}, {"frequencies", {{"counts", counts}}}};
  const auto model = dna_test::read(item);
  const double point = model->evaluate().lr.log10();
  CHECK(point == Approx(-120 * std::log10(0.0025 * 0.0025)).epsilon(1e-12));  // floor 5/2N = 0.0025
  std::mt19937_64 rng(11);
  std::vector<double> out(2000);
  model->draw_log10_lr(rng, out);
  for (double v : out) {
    REQUIRE(std::isfinite(v));
    REQUIRE(v <= point + 1e-9);  // the floor bounds every draw (NRC II 1996 p. 148 rule)
  }
  std::sort(out.begin(), out.end());
  CHECK(out[out.size() / 2] > 600.0);
}

TEST_CASE("remaining reading errors", "[dna][model][errors]") {
  auto item = base_item();
  SECTION("database size not whole") {
    item["frequencies"]["database_size"] = 10.5;
    CHECK_THROWS_WITH(dna_test::read(item), Contains("frequencies.database_size") && Contains("whole number"));
  }
  SECTION("database size by locus, given twice in two spellings") {
    item["frequencies"]["database_size"] = {{"TH01", 10}, {"th01", 10}};
    CHECK_THROWS_WITH(dna_test::read(item), Contains("given twice"));
  }
  SECTION("recovered counts of the profile's alleles above 2N") {
    // Frequencies 0.6 + 0.6 at one locus (a sum warning) become counts 12 + 12 of 20 alleles.
    item["frequencies"] = json::parse(R"({"table": {"D8S1179": {"13": 0.6, "14": 0.6}, "TH01": {"9.3": 0.5, "6": 0.5}}, "database_size": 10})");
    CHECK_THROWS_WITH(dna_test::read(item), Contains("field profile.D8S1179") && Contains("exceed the 20 alleles"));
  }
}

TEST_CASE("an item without a reference profile compares nothing and has no LR", "[dna][model][errors]") {
  // The LR compares the questioned profile with the person of interest's (common practice): a
  // match probability without a reference would assume the match it is meant to weigh.
  const auto read_as_written = [](const json& item) {
    return counterpoise::models::dna::read_dna_single_source_model(item, dna_test::context());
  };
  auto item = base_item();
  REQUIRE_FALSE(item.contains("reference_profile"));
  CHECK_THROWS_AS(read_as_written(item), InvalidValue);
  CHECK_THROWS_WITH(read_as_written(item), Contains("item D1, field reference_profile: no reference profile is given") &&
                                               Contains("there is no LR"));
  item["reference_profile"] = json::object();
  CHECK_THROWS_WITH(read_as_written(item), Contains("field reference_profile: no reference profile is given"));
  // A reference typed at none of the questioned loci compares nothing either; the message names them.
  item["reference_profile"] = json::parse(R"({"FGA": ["20", "22"]})");
  CHECK_THROWS_WITH(read_as_written(item), Contains("field reference_profile: the reference profile has no genotype at "
                                                    "D8S1179, TH01"));
  // One locus compared is enough: the other is left out with its note, as before.
  item["reference_profile"] = json::parse(R"({"TH01": ["9.3"]})");
  const auto result = read_as_written(item)->evaluate();
  CHECK(has_note(result, "locus-not-compared"));
  CHECK(result.lr.log10() == Approx(-std::log10(hom(0.35, 0.01))).epsilon(1e-13));
}
