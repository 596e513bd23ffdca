// The ENFSI (2015) verbal equivalents and our lower-inclusive band-edge convention.
#include <catch2/catch.hpp>
#include <cmath>
#include <fstream>
#include <sstream>

#include "core/verbal/verbal_scale.hpp"

using namespace counterpoise::verbal;
using counterpoise::numbers::LikelihoodRatio;

namespace {
std::string label_for(double lr) { return VerbalScale::enfsi_2015().express(LikelihoodRatio::from_value(lr)).label; }
}  // namespace

TEST_CASE("ENFSI (2015) band edges, each band including its lower edge") {
  // ENFSI Guideline for Evaluative Reporting in Forensic Science (2015), table of verbal
  // equivalents: 2-10 weak, 10-100 moderate, 100-1000 moderately strong, 1000-10000 strong,
  // 10000-1000000 very strong, >1000000 extremely strong. The edges at 10^2, 10^3, 10^4 and 10^6
  // are confirmed in secondary sources; the edges at 2 and 10 are from memory.
  const auto [lr, label] = GENERATE(table<double, const char*>({
      {1.9, "no appreciable support for either proposition"},
      {2.0, "weak support"},
      {9.99, "weak support"},
      {10.0, "moderate support"},
      {99.9, "moderate support"},
      {100.0, "moderately strong support"},
      {999.0, "moderately strong support"},
      {1000.0, "strong support"},
      {9999.0, "strong support"},
      {10000.0, "very strong support"},
      {999999.0, "very strong support"},
      {1000000.0, "extremely strong support"},
      {1e300, "extremely strong support"},
  }));
  CAPTURE(lr);
  CHECK(label_for(lr) == label);
}

TEST_CASE("for LR below 1 the same words apply to 1/LR in favour of Hd") {
  const auto scale = VerbalScale::enfsi_2015();
  for (double lr : {2.0, 50.0, 500.0, 5000.0, 50000.0, 5e7}) {
    const auto forward = scale.express(LikelihoodRatio::from_value(lr));
    const auto backward = scale.express(LikelihoodRatio::from_value(lr).inverse());
    CHECK(forward.label == backward.label);
    CHECK(forward.favours == Favours::hp);
    CHECK(backward.favours == Favours::hd);
    CHECK_THAT(backward.sentence, Catch::Contains("for Hd rather than Hp"));
  }
}

TEST_CASE("neutral, zero and infinite LRs have their own wording") {
  const auto scale = VerbalScale::enfsi_2015();
  CHECK(scale.express(LikelihoodRatio::neutral()).favours == Favours::neither);
  CHECK(scale.express(LikelihoodRatio::zero()).label == "exclusion");
  CHECK(scale.express(LikelihoodRatio::infinite()).label == "impossible under Hd");
}

TEST_CASE("the shipped scale file is the built-in scale") {
  std::ifstream in(std::string(COUNTERPOISE_DATA_DIR) + "/verbal_scales/enfsi-2015.json");
  REQUIRE(in);
  std::stringstream text;
  text << in.rdbuf();
  const auto from_file = VerbalScale::from_json(nlohmann::json::parse(text.str()), {"verbal_scale", ""});
  CHECK(from_file.to_json() == VerbalScale::enfsi_2015().to_json());
}

TEST_CASE("a lab's own scale loads, and bad scale files name the field") {
  using nlohmann::json;
  const json own = {{"format", "counterpoise.verbal-scale"}, {"version", 1}, {"name", "vale-3"},
                    {"bands", {{{"from", 10}, {"label", "some support"}}, {{"from", 1e4}, {"label", "strong support"}}}}};
  CHECK(VerbalScale::from_json(own, {"verbal_scale", ""}).express(LikelihoodRatio::from_value(50)).label == "some support");
  auto bad = own;
  bad["bands"][1]["from"] = 5;
  CHECK_THROWS_WITH(VerbalScale::from_json(bad, {"verbal_scale", ""}), Catch::Contains("bands[1].from"));
  bad = own;
  bad["bands"][0]["from"] = 1;
  CHECK_THROWS_WITH(VerbalScale::from_json(bad, {"verbal_scale", ""}), Catch::Contains("above LR 1"));
  bad = own;
  bad["version"] = 2;
  CHECK_THROWS_AS(VerbalScale::from_json(bad, {"verbal_scale", ""}), counterpoise::validation::UnsupportedFormat);
  bad = own;
  bad["format"] = "something-else";
  CHECK_THROWS_AS(VerbalScale::from_json(bad, {"verbal_scale", ""}), counterpoise::validation::UnsupportedFormat);
}

TEST_CASE("a computed LR equal to a band edge in decimal arithmetic falls on the edge's band") {
  // ENFSI (2015) verbal equivalents with lower-inclusive edges (docs/methods.md): 0.3 / 0.003 = 100
  // is "moderately strong", 0.7 / 0.07 = 10 "moderate", 0.4 / 0.2 = 2 "weak". In binary the
  // log10 differences are 1.9999999999999998, 0.9999999999999999 and 0.30102999566398114 (one unit
  // in the last place below the edge); the comparison allows a relative 1e-12 in LR
  // (numbers::kLrRelativeTolerance). The same holds for 1/LR in favour of Hd.
  const auto [p_hp, p_hd, label] = GENERATE(table<double, double, const char*>({
      {0.3, 0.003, "moderately strong support"},
      {0.7, 0.07, "moderate support"},
      {0.4, 0.2, "weak support"},
      {0.003, 0.3, "moderately strong support"},
      {0.07, 0.7, "moderate support"},
      {0.2, 0.4, "weak support"},
  }));
  CAPTURE(p_hp, p_hd);
  const auto lr = LikelihoodRatio::from_log10_probabilities(std::log10(p_hp), std::log10(p_hd));
  const auto words = VerbalScale::enfsi_2015().express(lr);
  CHECK(words.label == label);
  CHECK(words.favours == (p_hp > p_hd ? Favours::hp : Favours::hd));
}

TEST_CASE("the edge tolerance is relative 1e-12 in LR and no wider") {
  // An LR a relative 1e-10 below an edge is below it: the tolerance absorbs rounding only.
  const auto scale = VerbalScale::enfsi_2015();
  CHECK(scale.express(LikelihoodRatio::from_log10(2.0 - 2e-13)).label == "moderately strong support");
  CHECK(scale.express(LikelihoodRatio::from_log10(2.0 + std::log10(1.0 - 1e-10))).label == "moderate support");
  // An LR of 1 within the tolerance is neutral (0.3 / 0.3 computed through different roundings).
  CHECK(scale.express(LikelihoodRatio::from_log10(2e-13)).label == "no support");
  CHECK(scale.express(LikelihoodRatio::from_log10(1e-10)).favours == Favours::neither);
}
