// The posterior illustration over Hp and several alternatives: Bayes' theorem for exclusive
// propositions, P(H_j|E) = pi_j P(E|H_j) / sum_m pi_m P(E|H_m) (common practice), checked against
// a direct computation in long double, exact complements at the extremes, and the case of a
// single alternative against the two-proposition odds form.
#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "core/sensitivity/posterior_over_set.hpp"

using namespace counterpoise;
using numbers::LikelihoodRatio;

TEST_CASE("posteriors over the set equal the direct formula in long double", "[over-set]") {
  // Invented: P(E|Hp) = 1, an unrelated donor 1e-9, a brother 0.004; prior weights 1e-3 for Hp,
  // 0.9 and 0.0999 for the alternatives (need not sum to 1).
  const long double p_hp = 1.0L, p1 = 1e-9L, p2 = 0.004L;
  const long double w0 = 1e-3L, w1 = 0.9L, w2 = 0.0999L;
  const std::vector<LikelihoodRatio> pairwise{LikelihoodRatio::from_log10(9.0),
                                              LikelihoodRatio::from_log10(static_cast<double>(-std::log10(p2)))};
  const std::vector<double> log10_weights{std::log10(1e-3), std::log10(0.9), std::log10(0.0999)};
  const auto posteriors = sensitivity::posteriors_over_set(log10_weights, pairwise);
  REQUIRE(posteriors);
  const long double total = w0 * p_hp + w1 * p1 + w2 * p2;
  const long double expected[] = {w0 * p_hp / total, w1 * p1 / total, w2 * p2 / total};
  long double sum = 0.0L;
  for (int j = 0; j < 3; ++j) {
    CAPTURE(j);
    // 1e-13: a few roundings of log10 and one log-sum-exp.
    CHECK((*posteriors)[j].probability() == Approx(static_cast<double>(expected[j])).epsilon(1e-13));
    CHECK((*posteriors)[j].complement() == Approx(static_cast<double>(1.0L - expected[j])).epsilon(1e-13));
    sum += (*posteriors)[j].probability();
  }
  CHECK(static_cast<double>(sum) == Approx(1.0).epsilon(1e-14));
}

TEST_CASE("one alternative gives the two-proposition posterior", "[over-set]") {
  const LikelihoodRatio lr = LikelihoodRatio::from_log10(4.5);
  const std::vector<double> log10_weights{-3.0, 0.0};
  const auto over_set = sensitivity::posteriors_over_set(log10_weights, std::vector{lr});
  const auto two = numbers::posterior_from(-3.0, lr);
  REQUIRE(over_set);
  CHECK((*over_set)[0].log10_odds == Approx(two.log10_odds).epsilon(1e-15));
  CHECK((*over_set)[0].log10_complement == Approx(two.log10_complement).epsilon(1e-14));
  CHECK((*over_set)[1].log10_probability == Approx(two.log10_complement).epsilon(1e-14));
}

TEST_CASE("complements stay exact at the extremes (regression for 1 - 1e-30)", "[over-set][extremes]") {
  // Hp's posterior odds 10^30: its complement 10^-30 must not round to 0.
  const std::vector<LikelihoodRatio> pairwise{LikelihoodRatio::from_log10(30.0), LikelihoodRatio::from_log10(40.0)};
  const std::vector<double> log10_weights{0.0, std::log10(0.5), std::log10(0.5)};
  const auto posteriors = sensitivity::posteriors_over_set(log10_weights, pairwise);
  REQUIRE(posteriors);
  // P(not Hp) = (0.5e-30 + 0.5e-40) / (1 + ...) ~ 0.5e-30.
  CHECK((*posteriors)[0].log10_complement == Approx(std::log10(0.5e-30 + 0.5e-40)).epsilon(1e-14));
  CHECK((*posteriors)[2].log10_probability == Approx(std::log10(0.5e-40)).epsilon(1e-14));
}

TEST_CASE("zero and infinite LRs in the set", "[over-set][edges]") {
  const std::vector<double> log10_weights{0.0, 0.0, 0.0};
  CHECK_FALSE(sensitivity::posteriors_over_set(log10_weights, std::vector{LikelihoodRatio::zero(), LikelihoodRatio::zero()}));
  const auto p = sensitivity::posteriors_over_set(log10_weights, std::vector{LikelihoodRatio::infinite(), LikelihoodRatio::neutral()});
  REQUIRE(p);
  CHECK((*p)[1].probability() == 0.0);
  CHECK((*p)[0].probability() == Approx(0.5).epsilon(1e-15));
  CHECK_THROWS_AS(sensitivity::posteriors_over_set(std::vector{0.0}, std::vector{LikelihoodRatio::neutral()}),
                  std::invalid_argument);
}

TEST_CASE("the posterior of Hp falls as a brother's weight grows from 0 to its stated value", "[over-set]") {
  // Invented: LR 1e9 against an unrelated donor, 250 against a brother; weights 0.95 / 0.05;
  // prior odds of Hp against the set 1e-3.
  const std::vector<LikelihoodRatio> pairwise{LikelihoodRatio::from_log10(9.0), LikelihoodRatio::from_log10(std::log10(250.0))};
  const std::vector<double> weights{0.95, 0.05};
  const auto steps = sensitivity::hp_as_weight_grows(-3.0, pairwise, weights, 1, 4);
  REQUIRE(steps.size() == 5);
  // At weight 0 the brother is left out: odds 1e-3 × 1e9 / 0.95.
  CHECK(steps.front().hp.log10_odds == Approx(6.0 - std::log10(0.95)).epsilon(1e-14));
  for (std::size_t s = 1; s < steps.size(); ++s) CHECK(steps[s].hp.probability() < steps[s - 1].hp.probability());
  // At the stated weight: odds = 1e-3 / (0.95e-9 + 0.05/250).
  CHECK(steps.back().hp.log10_odds == Approx(std::log10(1e-3 / (0.95e-9 + 0.05 / 250.0))).epsilon(1e-13));
}
