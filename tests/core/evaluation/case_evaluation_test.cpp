// Evaluating a case: properties of the combination and of the uncertainty, checked against
// identities of the odds form of Bayes' theorem and against an independent Monte Carlo.
#include <catch2/catch.hpp>
#include <algorithm>
#include <cmath>
#include <iomanip>

#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/interchange/evaluation_json.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

json base_case() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-2" },
    "propositions": { "level": "source", "hp": "The fibres came from the mat", "hd": "The fibres came from elsewhere" },
    "items": [
      { "id": "A", "model": "assigned", "p_given_hp": { "beta": [38, 4] }, "p_given_hd": { "counts": { "k": 3, "n": 412 } } },
      { "id": "B", "model": "assigned", "p_given_hp": { "interval": [0.5, 0.9], "scale": "linear" }, "p_given_hd": { "counts": { "k": 9, "n": 1150 } } },
      { "id": "C", "model": "reported-lr", "lr": 300, "interval": [80, 900] }
    ],
    "uncertainty": { "seed": 11 } })");
}

casefile::Case read(const json& doc) {
  auto result = interchange::read_case(doc, ".");
  REQUIRE(result.value);
  return std::move(*result.value);
}

}  // namespace

TEST_CASE("the point LR of an assigned item is the ratio of the mean probabilities") {
  // Beta(38, 4) has mean 38/42; counts 3 of 412 give (3+1)/(412+2) by Laplace's rule.
  const auto result = evaluation::evaluate_case(read(base_case()));
  CHECK(result.items[0].point.lr.value() == Approx((38.0 / 42.0) / (4.0 / 414.0)).epsilon(1e-13));
}

TEST_CASE("the combined LR is the product of the included items' LRs (sum of log10)") {
  const auto result = evaluation::evaluate_case(read(base_case()));
  double sum = 0.0;
  for (const auto& item : result.items) sum += item.point.lr.log10();
  CHECK(result.combined.lr.log10() == Approx(sum).epsilon(1e-14));
}

TEST_CASE("swapping Hp and Hd inverts every LR and mirrors the interval") {
  json swapped = base_case();
  for (int i = 0; i < 2; ++i) std::swap(swapped["items"][i]["p_given_hp"], swapped["items"][i]["p_given_hd"]);
  swapped["items"][2] = json::parse(R"({ "id": "C", "model": "reported-lr", "lr": 0.0033333333333333335, "interval": [0.0011111111111111111, 0.0125] })");
  const auto forward = evaluation::evaluate_case(read(base_case()));
  const auto backward = evaluation::evaluate_case(read(swapped));
  for (int i = 0; i < 3; ++i) {
    CAPTURE(i);
    CHECK(backward.items[i].point.lr.log10() == Approx(-forward.items[i].point.lr.log10()).epsilon(1e-12));
    // Interval ends mirror to within the lattice resolution.
    CHECK(backward.items[i].spread->low_log10 == Approx(-forward.items[i].spread->high_log10).margin(0.01));
  }
  CHECK(backward.combined.lr.log10() == Approx(-forward.combined.lr.log10()).epsilon(1e-12));
}

TEST_CASE("the lattice interval agrees with an independent joint Monte Carlo") {
  // The Monte Carlo cross-check draws 400 000 joint samples; its 5 % and 95 % quantiles have a
  // standard error of about 0.004 in log10 here, and the lattice resolution is below 0.002,
  // so a margin of 0.02 cannot fail by chance in practice.
  json doc = base_case();
  doc["uncertainty"]["draws"] = 400000;
  evaluation::EvaluationOptions options;
  options.monte_carlo_cross_check = true;
  const auto result = evaluation::evaluate_case(read(doc), options);
  REQUIRE(result.combined.spread);
  REQUIRE(result.combined.monte_carlo_check);
  const auto& lattice = *result.combined.spread;
  const auto& mc = *result.combined.monte_carlo_check;
  CAPTURE(std::setprecision(17), lattice.low_log10, mc.low_log10, lattice.high_log10, mc.high_log10);
  CHECK(lattice.low_log10 == Approx(mc.low_log10).margin(0.02));
  CHECK(lattice.median_log10 == Approx(mc.median_log10).margin(0.02));
  CHECK(lattice.high_log10 == Approx(mc.high_log10).margin(0.02));
  CHECK(lattice.conservative_log10 == Approx(lattice.low_log10).margin(1e-12));  // favours Hp: 5th percentile
}

TEST_CASE("results reproduce exactly for the stored seed") {
  json doc = base_case();
  evaluation::EvaluationOptions options;
  options.monte_carlo_cross_check = true;
  const auto a = evaluation::evaluate_case(read(doc), options);
  const auto b = evaluation::evaluate_case(read(doc), options);
  CHECK(a.combined.monte_carlo_check->low_log10 == b.combined.monte_carlo_check->low_log10);
  doc["uncertainty"]["seed"] = 12;
  const auto c = evaluation::evaluate_case(read(doc), options);
  CHECK(a.combined.monte_carlo_check->low_log10 != c.combined.monte_carlo_check->low_log10);
}

TEST_CASE("an item left out of the combination is evaluated but not combined") {
  json doc = base_case();
  doc["items"][2]["combination"] = {{"included", false}, {"exclusion_reason", "examined by another laboratory"}};
  const auto result = evaluation::evaluate_case(read(doc));
  CHECK_FALSE(result.items[2].included);
  CHECK(result.items[2].exclusion_reason == "examined by another laboratory");
  CHECK(result.combined.lr.log10() ==
        Approx(result.items[0].point.lr.log10() + result.items[1].point.lr.log10()).epsilon(1e-14));
  CHECK(result.combined.included_ids == std::vector<std::string>{"A", "B"});
}

TEST_CASE("an exclusion makes the combined LR zero, an exclusion with an infinite LR is refused") {
  json doc = base_case();
  doc["items"][1] = json::parse(R"({ "id": "B", "model": "assigned", "p_given_hp": 0, "p_given_hd": 0.2 })");
  const auto result = evaluation::evaluate_case(read(doc));
  CHECK(result.items[1].point.lr.is_zero());
  CHECK(result.combined.lr.is_zero());
  CHECK(result.combined.verbal.label == "exclusion");
  CHECK(result.sensitivity.rows.front().posterior.log10_probability == -INFINITY);
  doc["items"][2] = json::parse(R"({ "id": "C", "model": "assigned", "p_given_hp": 0.3, "p_given_hd": 0 })");
  CHECK_THROWS_WITH(evaluation::evaluate_case(read(doc)), Catch::Contains("contradict"));
}

TEST_CASE("extreme LRs stay exact: 1e300 against prior odds 1e-12") {
  json doc = base_case();
  doc["items"] = json::parse(R"([{ "id": "X", "model": "reported-lr", "log10_lr": 300 },
                                 { "id": "Y", "model": "reported-lr", "lr": 1e-300 }])");
  doc["priors"] = {{"odds", {1e-12}}};
  const auto result = evaluation::evaluate_case(read(doc));
  CHECK(result.combined.lr.log10() == Approx(0.0).margin(1e-12));
  CHECK(result.items[0].verbal.label == "extremely strong support");
  CHECK(result.items[1].verbal.favours == verbal::Favours::hd);
}

TEST_CASE("item generators are independent per item and reproducible") {
  auto a = evaluation::item_generator(5, 0), b = evaluation::item_generator(5, 1), c = evaluation::item_generator(5, 0);
  const auto first = a();
  CHECK(first != b());
  CHECK(first == c());
}

TEST_CASE("a 40-item case reports the LR of the expected probabilities, its bound never claims more") {
  // The reported value is the ratio of the mean probabilities (Taroni, Bozza, Biedermann & Aitken
  // 2016, Law, Probability and Risk 15:1 — from memory): Beta(a, b) has mean a / (a + b); counts
  // 0 of n with the Jeffreys prior Beta(0.5, 0.5) give Beta(0.5, n + 0.5), mean 0.5 / (n + 1).
  // The interval is the spread of the ratio when the probabilities are drawn. For large n,
  // Beta(0.5, n + 0.5) is about Gamma(1/2) / n: the mean of log10 of a draw is psi(1/2) / ln 10 =
  // (-gamma - 2 ln 2) / ln 10 = -0.8527 + log10(1/n) (Abramowitz & Stegun 6.3.3), 0.5517 below
  // log10 of its mean, and its standard deviation sqrt(trigamma(1/2)) / ln 10 = 0.964 (A&S 6.4.4).
  // Over 40 items the sum is close to normal: its median is about 40 * 0.5517 = 22.1 above the
  // reported value and its 5th percentile about 22.1 - 1.645 * 0.964 * sqrt(40) = 12.0 above it,
  // so the whole 90 % interval lies above the reported value. The conservative bound is then the
  // reported value itself.
  json doc = base_case();
  doc["items"] = json::array();
  double expected_log10 = 0.0;
  for (int i = 0; i < 40; ++i) {
    const double a = 20.0 + i, b = 3.0 + (i % 5);
    const int n = 200 + 10 * i;
    doc["items"].push_back({{"id", "E" + std::to_string(i + 1)}, {"model", "assigned"}, {"p_given_hp", {{"beta", {a, b}}}},
                            {"p_given_hd", {{"counts", {{"k", 0}, {"n", n}, {"prior", {0.5, 0.5}}}}}}});
    expected_log10 += std::log10(a / (a + b)) - std::log10(0.5 / (n + 1.0));
  }
  const auto result = evaluation::evaluate_case(read(doc));
  const auto& spread = *result.combined.spread;
  CAPTURE(std::setprecision(17), result.combined.lr.log10(), spread.low_log10, spread.median_log10, spread.high_log10);
  CHECK(result.combined.lr.log10() == Approx(expected_log10).epsilon(1e-13));
  CHECK(spread.low_log10 > result.combined.lr.log10() + 2.0);
  CHECK(spread.median_log10 == Approx(result.combined.lr.log10() + 22.1).margin(1.0));
  CHECK(spread.conservative_log10 == result.combined.lr.log10());
  for (const auto& item : result.items) CHECK(item.spread->conservative_log10 <= item.point.lr.log10());
}

TEST_CASE("with one item included, the combined interval is the item's own, to the last digit") {
  // The combination of one item is that item (the odds form of Bayes' theorem with one factor):
  // a reader must not find two intervals for one quantity (issue 14).
  json one = base_case();
  for (int i : {1, 2}) one["items"][i]["combination"] = {{"included", false}, {"exclusion_reason", "kept for comparison"}};
  const auto result = evaluation::evaluate_case(read(one));
  REQUIRE(result.items[0].spread);
  REQUIRE(result.combined.spread);
  CHECK(result.combined.spread->low_log10 == result.items[0].spread->low_log10);
  CHECK(result.combined.spread->high_log10 == result.items[0].spread->high_log10);
  CHECK(result.combined.spread->median_log10 == result.items[0].spread->median_log10);
  CHECK(result.combined.spread->conservative_log10 == result.items[0].spread->conservative_log10);
}

TEST_CASE("evaluate --json gives each item its own model and LR, whatever order the evaluation lists them in", "[json]") {
  // LR = P(E|Hp) / P(E|Hd) (common practice): item A's Beta(38, 4) mean over the Laplace rule's
  // (3 + 1) / (412 + 2); item C states its LR, 300.
  const auto value = read(base_case());
  auto result = evaluation::evaluate_case(value);
  const double log10_a = std::log10((38.0 / 42.0) / (4.0 / 414.0));
  for (int reversed = 0; reversed < 2; ++reversed) {
    if (reversed) std::reverse(result.items.begin(), result.items.end());  // the look-up by id, not by position
    const json j = interchange::evaluation_to_json(value, result, {});
    REQUIRE(j["items"].size() == 3);
    for (const auto& item : j["items"]) {
      const std::string id = item["id"];
      CHECK(item["model"] == (id == "C" ? "reported-lr" : "assigned"));
      if (id == "A") CHECK(item["log10_lr"].get<double>() == Approx(log10_a).epsilon(1e-13));
      if (id == "C") CHECK(item["log10_lr"].get<double>() == Approx(std::log10(300.0)).epsilon(1e-13));
    }
    CHECK(j["items"][0]["id"] == (reversed ? "C" : "A"));
  }
}
