// The dna-single-source model with relatives of the person of interest as alternative donors:
// one match probability per alternative, each checked against the published single-locus
// formulas for relatives, computed here from the formula and not from the model's code.
#include <catch2/catch.hpp>
#include <cmath>
#include <string>
#include <vector>

#include "core/models/dna/dna_single_source_model.hpp"
#include "dna_test_support.hpp"

using namespace counterpoise::models::dna;
using Catch::Matchers::Contains;
using counterpoise::validation::InvalidValue;
using nlohmann::json;

namespace {

// Invented allele frequencies; theta = 0 so the formulas below apply as printed.
json item_with_alternatives() {
  return json::parse(R"({
    "id": "D1", "model": "dna-single-source", "theta": 0,
    "profile": {"D8S1179": ["13", "14"], "TH01": ["9.3", "9.3"]},
    "frequencies": {"table": {"D8S1179": {"13": 0.30, "14": 0.21}, "TH01": {"9.3": 0.35}}},
    "alternatives": {
      "U": {"relationship": "unrelated"}, "B": {"relationship": "full-sibling"},
      "F": {"relationship": "parent-child"}, "H": {"relationship": "half-sibling"},
      "C": {"relationship": "first-cousin"} }
  })");
}

const std::vector<std::string> kIds = {"U", "B", "F", "H", "C"};

// Single-locus match probabilities for a relative of the matching person, theta = 0:
// Evett & Weir 1998, "Interpreting DNA Evidence", ch. 4, and NRC II 1996, "The Evaluation of
// Forensic DNA Evidence", section 4.4 (table and equation numbers from memory):
//   unrelated       het 2pq                 hom p^2
//   full sibling    het (1 + p + q + 2pq)/4 hom (1 + p)^2 / 4
//   parent-child    het (p + q)/2           hom p
//   half sibling    het (p + q + 4pq)/4     hom p(1 + p)/2
//   first cousin    het (p + q + 12pq)/8    hom p(1 + 3p)/4
struct Formulas {
  double (*het)(double p, double q);
  double (*hom)(double p);
};
const Formulas kFormulas[] = {
    {[](double p, double q) { return 2 * p * q; }, [](double p) { return p * p; }},
    {[](double p, double q) { return (1 + p + q + 2 * p * q) / 4; }, [](double p) { return (1 + p) * (1 + p) / 4; }},
    {[](double p, double q) { return (p + q) / 2; }, [](double p) { return p; }},
    {[](double p, double q) { return (p + q + 4 * p * q) / 4; }, [](double p) { return p * (1 + p) / 2; }},
    {[](double p, double q) { return (p + q + 12 * p * q) / 8; }, [](double p) { return p * (1 + 3 * p) / 4; }},
};

}  // namespace

TEST_CASE("one model per relative: LR = 1 / the product of the published single-locus formulas", "[dna][alternatives]") {
  const auto models = read_dna_single_source_alternatives(dna_test::matched(item_with_alternatives()), kIds, dna_test::context());
  REQUIRE(models.size() == 5);
  for (std::size_t i = 0; i < models.size(); ++i) {
    CAPTURE(kIds[i]);
    const double match = kFormulas[i].het(0.30, 0.21) * kFormulas[i].hom(0.35);
    // 1e-13: the model sums log10 of k0 P0 + k1 P1 + k2 per locus; a few ulps of each log.
    CHECK(models[i]->evaluate().lr.log10() == Approx(-std::log10(match)).epsilon(1e-13));
  }
  // The brother's match probability is far larger than the unrelated person's: for these two
  // loci the LR against a brother is smaller by a factor of about 12 (0.18635 / 0.015435).
  CHECK(models[0]->evaluate().lr.log10() - models[1]->evaluate().lr.log10() == Approx(std::log10(0.186350625 / 0.015435)).epsilon(1e-12));
}

TEST_CASE("a shared relationship is the default each alternative may replace, other fields are shared", "[dna][alternatives]") {
  json item = item_with_alternatives();
  item["relationship"] = "full-sibling";
  item["alternatives"] = {{"U", {{"relationship", "unrelated"}}}, {"B", json::object()}};
  const auto models = read_dna_single_source_alternatives(dna_test::matched(item), std::vector<std::string>{"U", "B"}, dna_test::context());
  CHECK(models[0]->evaluate().detail["relationship"]["name"] == "unrelated");
  CHECK(models[1]->evaluate().detail["relationship"]["name"] == "full-sibling");
}

TEST_CASE("per-alternative DNA errors name the item, the alternative and the field", "[dna][alternatives][errors]") {
  const std::vector<std::string> ids{"U", "B"};
  json item = item_with_alternatives();
  item["alternatives"] = {{"U", {{"relationship", "unrelated"}}}, {"B", {{"relationship", "grand-uncle"}}}};
  CHECK_THROWS_WITH(read_dna_single_source_alternatives(dna_test::matched(item), ids, dna_test::context()),
                    Contains("alternatives.B.relationship") && Contains("unknown relationship 'grand-uncle'"));
  item["alternatives"] = {{"U", {{"relationship", "unrelated"}}}, {"B", {{"theta", 0.03}}}};
  CHECK_THROWS_AS(read_dna_single_source_alternatives(dna_test::matched(item), ids, dna_test::context()), InvalidValue);
  CHECK_THROWS_WITH(read_dna_single_source_alternatives(dna_test::matched(item), ids, dna_test::context()),
                    Contains("alternatives.B.theta"));
  item["alternatives"] = {{"U", {{"relationship", "unrelated"}}}};
  CHECK_THROWS_WITH(read_dna_single_source_alternatives(dna_test::matched(item), ids, dna_test::context()),
                    Contains("alternatives.B") && Contains("missing"));
  item["alternatives"] = {{"U", {{"relationship", "unrelated"}}}, {"B", "full-sibling"}};
  CHECK_THROWS_WITH(read_dna_single_source_alternatives(dna_test::matched(item), ids, dna_test::context()), Contains("alternatives.B"));
  item.erase("alternatives");
  CHECK_THROWS_WITH(read_dna_single_source_alternatives(dna_test::matched(item), ids, dna_test::context()),
                    Contains("field alternatives: missing"));
}
