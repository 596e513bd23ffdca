// The compound LR of Hp against weighted alternatives, P(E|Hp) / sum_i w_i P(E|Hd_i) (Bayes'
// theorem for exclusive propositions, common practice), checked against the same quantity
// computed independently in long double from the probabilities themselves.
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

#include "core/numbers/compound_lr.hpp"

using counterpoise::numbers::compound_lr;
using counterpoise::numbers::LikelihoodRatio;

namespace {

struct Row {
  long double p_hp;
  std::vector<long double> p_hd;
  std::vector<double> weights;  // normalised
};

// Direct computation in long double (64-bit mantissa): the formula as written, no logs.
long double reference_log10(const Row& row) {
  long double denominator = 0.0L;
  for (std::size_t i = 0; i < row.p_hd.size(); ++i) denominator += static_cast<long double>(row.weights[i]) * row.p_hd[i];
  return std::log10(row.p_hp / denominator);
}

}  // namespace

TEST_CASE("compound LR equals P(E|Hp) / sum w_i P(E|Hd_i) computed in long double", "[compound]") {
  // Invented probabilities: an unrelated donor, a brother and a cousin; a set where one small
  // weight on a close relative dominates; three alternatives of similar weight.
  const auto row = GENERATE(values<Row>({
      {1.0L, {1e-12L, 0.0035L, 1e-6L}, {0.90, 0.05, 0.05}},
      {1.0L, {1e-20L, 1e-4L}, {0.999, 0.001}},
      {0.6L, {0.5L, 4.0L / 42.0L, 0.01L}, {0.5, 0.25, 0.25}},
      {1e-3L, {2e-3L}, {1.0}},
  }));
  std::vector<LikelihoodRatio> pairwise;
  for (long double p : row.p_hd) pairwise.push_back(LikelihoodRatio::from_log10(static_cast<double>(std::log10(row.p_hp / p))));
  const double got = compound_lr(pairwise, row.weights).log10();
  // 1e-14 relative: log-sum-exp in double of at most three terms; the reference is exact to
  // long double rounding.
  CHECK(got == Approx(static_cast<double>(reference_log10(row))).epsilon(1e-14).margin(1e-15));
}

TEST_CASE("a single alternative of weight 1 gives its own LR back exactly", "[compound]") {
  const std::vector<LikelihoodRatio> one{LikelihoodRatio::from_log10(6.25)};
  CHECK(compound_lr(one, std::vector<double>{1.0}).log10() == 6.25);
}

TEST_CASE("compound LR beyond double range agrees with long double (extreme tails)", "[compound][extremes]") {
  // Pairwise LRs of 10^400 and 10^350 overflow a double; long double holds them (to 10^4932).
  const std::vector<LikelihoodRatio> pairwise{LikelihoodRatio::from_log10(400.0), LikelihoodRatio::from_log10(350.0)};
  const std::vector<double> weights{0.99, 0.01};
  const long double reference = -std::log10(0.99L * std::pow(10.0L, -400.0L) + 0.01L * std::pow(10.0L, -350.0L));
  CHECK(compound_lr(pairwise, weights).log10() == Approx(static_cast<double>(reference)).epsilon(1e-14));
  // The small weight on the alternative with the smaller LR dominates: about 10^352.
  CHECK(compound_lr(pairwise, weights).log10() == Approx(352.0).margin(1e-3));
}

TEST_CASE("zero and infinite pairwise LRs are explicit states", "[compound][edges]") {
  const std::vector<double> weights{0.5, 0.5};
  CHECK(compound_lr(std::vector{LikelihoodRatio::zero(), LikelihoodRatio::from_log10(3.0)}, weights).is_zero());
  CHECK(compound_lr(std::vector{LikelihoodRatio::infinite(), LikelihoodRatio::infinite()}, weights).is_infinite());
  // An infinite LR contributes nothing: 1 / (0.5 / 1000) = 2000.
  CHECK(compound_lr(std::vector{LikelihoodRatio::infinite(), LikelihoodRatio::from_log10(3.0)}, weights).log10() ==
        Approx(std::log10(2000.0)).epsilon(1e-15));
  // A zero weight leaves its alternative out, even one with LR zero.
  CHECK(compound_lr(std::vector{LikelihoodRatio::zero(), LikelihoodRatio::from_log10(3.0)}, std::vector{0.0, 1.0}).log10() ==
        3.0);
}

TEST_CASE("compound LR refuses inputs that describe no set of alternatives", "[compound][errors]") {
  const std::vector<LikelihoodRatio> two{LikelihoodRatio::neutral(), LikelihoodRatio::neutral()};
  CHECK_THROWS_AS(compound_lr(two, std::vector{1.0}), std::invalid_argument);
  CHECK_THROWS_AS(compound_lr(std::vector<LikelihoodRatio>{}, std::vector<double>{}), std::invalid_argument);
  CHECK_THROWS_AS(compound_lr(two, std::vector{-0.5, 1.5}), std::invalid_argument);
  CHECK_THROWS_AS(compound_lr(two, std::vector{0.0, 0.0}), std::invalid_argument);
  CHECK_THROWS_AS(compound_lr(two, std::vector{std::nan(""), 1.0}), std::invalid_argument);
}

TEST_CASE("compound_log10_lr computes the formula and keeps the explicit states", "[compound]") {
  const std::vector<double> weights{std::log10(0.9), std::log10(0.1)};  // log10 of the weights
  // 1 / (0.9/1000 + 0.1/10) = 1 / 0.0109, written out by hand.
  CHECK(counterpoise::numbers::compound_log10_lr(std::vector<double>{3.0, 1.0}, weights) == Approx(std::log10(1.0 / 0.0109)).epsilon(1e-14));
  const double inf = std::numeric_limits<double>::infinity();
  CHECK(counterpoise::numbers::compound_log10_lr(std::vector<double>{-inf, 1.0}, weights) == -inf);       // LR zero against Hd1
  CHECK(counterpoise::numbers::compound_log10_lr(std::vector<double>{inf, inf}, weights) == inf);         // infinite against both
  CHECK(counterpoise::numbers::compound_log10_lr(std::vector<double>{inf, 1.0}, weights) == Approx(2.0)); // only 0.1/10 remains
  CHECK(std::isnan(counterpoise::numbers::compound_log10_lr(std::vector<double>{std::nan(""), 1.0}, weights)));
}
