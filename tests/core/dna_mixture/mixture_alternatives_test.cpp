// The dna-mixture model against several alternatives to Hp: each alternative names its own
// contributors (hd), everything else is shared. Checked against the classical mixture formulas
// (no drop-out, no drop-in), written out here.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>
#include <vector>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/validation/input_error.hpp"
#include "mixture_test_support.hpp"

using namespace counterpoise::models::dna_mixture;
using Catch::Matchers::Contains;
using nlohmann::json;

namespace {

const json kTable = {{"11", 0.08}, {"12", 0.15}, {"13", 0.30}, {"14", 0.21}, {"15", 0.16}, {"16", 0.10}};
const double pA = 0.08, pB = 0.15, pC = 0.30, pD = 0.21;  // alleles 11, 12, 13, 14

json named(std::vector<std::string> people, int unknowns) { return {{"contributors", people}, {"unknowns", unknowns}}; }

// Invented: a swab with alleles 11, 12, 13, 14; the victim is 11,12, the suspect 13,14, the
// suspect's brother (typed) 13,14 as well, a neighbour (typed) 11,13.
json item_with(const json& alternatives) {
  json item = mixture_test::one_locus_item({"11", "12", "13", "14"},
                                           {{"victim", {"11", "12"}}, {"suspect", {"13", "14"}},
                                            {"brother", {"13", "14"}}, {"neighbour", {"11", "13"}}},
                                           named({"victim", "suspect"}, 0), named({"victim"}, 1), kTable, 0.0, 0.0, 0.0);
  item.erase("hd");
  item["alternatives"] = alternatives;
  return item;
}

}  // namespace

TEST_CASE("dna-mixture: one alternative with the two-proposition hd gives its LR bit for bit", "[dna_mixture][alternatives]") {
  json two = mixture_test::one_locus_item({"11", "12", "13"}, {{"victim", {"11", "12"}}, {"suspect", {"13", "13"}}},
                                          named({"victim", "suspect"}, 0), named({"victim"}, 1), kTable, 0.01, 0.1, 0.05);
  two["dropout"] = {{"beta", {2, 20}}};
  json several = two;
  several["alternatives"] = {{"Hd1", {{"hd", two["hd"]}}}};
  several.erase("hd");
  const auto model = read_dna_mixture_model(two, mixture_test::context());
  const auto models = read_dna_mixture_alternatives(several, std::vector<std::string>{"Hd1"}, mixture_test::context());
  REQUIRE(models.size() == 1);
  CHECK(models[0]->evaluate().lr.log10() == model->evaluate().lr.log10());
  // A shared hd with an empty entry reads the same.
  several["hd"] = two["hd"];
  several["alternatives"]["Hd1"] = json::object();
  CHECK(read_dna_mixture_alternatives(several, std::vector<std::string>{"Hd1"}, mixture_test::context())[0]->evaluate().lr.log10() ==
        model->evaluate().lr.log10());
}

TEST_CASE("dna-mixture: each alternative's contributors reach its own denominator", "[dna_mixture][alternatives]") {
  const json item = item_with({{"Hd1", {{"hd", named({"victim"}, 1)}}},
                               {"Hd2", {{"hd", named({"victim", "brother"}, 0)}}},
                               {"Hd3", {{"hd", named({}, 2)}}},
                               {"Hd4", {{"hd", named({"neighbour"}, 1)}}}});
  const std::vector<std::string> ids{"Hd1", "Hd2", "Hd3", "Hd4"};
  const auto models = read_dna_mixture_alternatives(item, ids, mixture_test::context());
  // No drop-out, no drop-in, theta 0 (Weir et al. 1997, J. Forensic Sci. 42:213): P(E|Hp) = 1
  // (victim and suspect carry exactly 11-14).
  //   Hd1, victim + one unknown: the unknown must be 13,14: 2 pC pD.
  //   Hd2, victim + the typed brother: they carry exactly 11-14: 1, so LR = 1.
  //   Hd3, two unknowns: the four alleles split between them, 4! orderings of 4 distinct
  //        alleles over 2 genotypes of 2: 24 pA pB pC pD.
  //   Hd4, neighbour 11,13 + one unknown: the unknown must carry 12 and 14: 2 pB pD.
  const double expected[] = {1.0 / (2 * pC * pD), 1.0, 1.0 / (24 * pA * pB * pC * pD), 1.0 / (2 * pB * pD)};
  for (std::size_t i = 0; i < ids.size(); ++i) {
    CAPTURE(ids[i]);
    const auto point = models[i]->evaluate();
    // 1e-13: the model sums per-genotype terms and takes their log10; a few ulps.
    CHECK(point.lr.log10() == Approx(std::log10(expected[i])).margin(1e-13));
    CHECK(*point.log10_p_given_hp == 0.0);
  }
}

TEST_CASE("dna-mixture: an own drop-out rate of someone named under one alternative only", "[dna_mixture][alternatives]") {
  // The brother's own rate applies against Hd2, where he contributes; against Hd1 he is no
  // contributor and the rate is not used (nor refused). With no drop-out at all for the others,
  // Hd1 keeps its classical value.
  json item = item_with({{"Hd1", {{"hd", named({"victim"}, 1)}}}, {"Hd2", {{"hd", named({"victim", "brother"}, 0)}}}});
  item["dropout_by_contributor"] = {{"brother", 0.2}};
  const auto models = read_dna_mixture_alternatives(item, std::vector<std::string>{"Hd1", "Hd2"}, mixture_test::context());
  CHECK(models[0]->evaluate().lr.log10() == Approx(std::log10(1.0 / (2 * pC * pD))).margin(1e-13));
  // Hd2: victim (no drop-out) and the brother, whose alleles 13 and 14 are both seen: each
  // survives with 1 - 0.2 (the semi-continuous model, Gill et al. 2006; heterozygote, no
  // drop-in): P(E|Hd2) = 0.8^2.
  CHECK(models[1]->evaluate().lr.log10() == Approx(-std::log10(0.8 * 0.8)).margin(1e-13));
  // A rate for someone who contributes under no proposition at all is still refused.
  item["dropout_by_contributor"] = {{"stranger", 0.2}};
  CHECK_THROWS_WITH(read_dna_mixture_alternatives(item, std::vector<std::string>{"Hd1", "Hd2"}, mixture_test::context()),
                    Contains("dropout_by_contributor.stranger"));
}

TEST_CASE("dna-mixture: bad per-alternative contributors name the alternative and the field", "[dna_mixture][alternatives][errors]") {
  const std::vector<std::string> ids{"Hd1", "Hd2"};
  json item = item_with({{"Hd1", {{"hd", named({"victim"}, 1)}}}, {"Hd2", {{"hd", named({"cousin"}, 1)}}}});
  CHECK_THROWS_WITH(read_dna_mixture_alternatives(item, ids, mixture_test::context()),
                    Contains("item M1, field alternatives.Hd2.hd.contributors[0]") && Contains("no reference profile"));
  item["alternatives"]["Hd2"] = {{"hd", {{"contributors", {"victim"}}, {"unknowns", 1}, {"number_of_contributors", 3}}}};
  CHECK_THROWS_WITH(read_dna_mixture_alternatives(item, ids, mixture_test::context()),
                    Contains("field alternatives.Hd2.hd.number_of_contributors"));
  item["alternatives"]["Hd2"] = {{"hd", named({}, 1)}};  // one unknown cannot carry four alleles without drop-in
  CHECK_THROWS_WITH(read_dna_mixture_alternatives(item, ids, mixture_test::context()),
                    Contains("field alternatives.Hd2.hd: locus D8S1179 shows 4 alleles, more than the 2"));
  item["alternatives"]["Hd2"] = {{"theta", 0.01}};
  CHECK_THROWS_WITH(read_dna_mixture_alternatives(item, ids, mixture_test::context()),
                    Contains("field alternatives.Hd2.theta"));
  item["alternatives"]["Hd2"] = {{"hd", named({"victim"}, 5)}};
  CHECK_THROWS_WITH(read_dna_mixture_alternatives(item, ids, mixture_test::context()),
                    Contains("field alternatives.Hd2.hd.unknowns"));
}
