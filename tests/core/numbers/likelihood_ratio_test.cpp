// The LR's explicit states: zero (an exclusion), infinite, finite — never NaN.
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

#include "core/numbers/likelihood_ratio.hpp"

using namespace counterpoise::numbers;

TEST_CASE("an LR from two probabilities is their ratio in log space") {
  const auto lr = LikelihoodRatio::from_log10_probabilities(std::log10(0.95), std::log10(0.0097));
  CHECK(lr.value() == Approx(0.95 / 0.0097).epsilon(1e-14));
}

TEST_CASE("a probability of zero under Hp is an exclusion, under Hd an infinite LR") {
  const double minus_inf = -std::numeric_limits<double>::infinity();
  CHECK(LikelihoodRatio::from_log10_probabilities(minus_inf, -2.0).is_zero());
  CHECK(LikelihoodRatio::from_log10_probabilities(-2.0, minus_inf).is_infinite());
  CHECK_THROWS_AS(LikelihoodRatio::from_log10_probabilities(minus_inf, minus_inf), std::invalid_argument);
  CHECK_THROWS_AS(LikelihoodRatio::from_log10_probabilities(std::nan(""), -1.0), std::invalid_argument);
}

TEST_CASE("swapping Hp and Hd inverts the LR, including the explicit states") {
  CHECK(LikelihoodRatio::from_log10(3.5).inverse().log10() == -3.5);
  CHECK(LikelihoodRatio::zero().inverse().is_infinite());
  CHECK(LikelihoodRatio::infinite().inverse().is_zero());
}

TEST_CASE("independent items multiply: log10 LRs add") {
  const auto a = LikelihoodRatio::from_log10(250.0), b = LikelihoodRatio::from_log10(100.0);
  CHECK((a * b).log10() == 350.0);  // beyond double range as a value, exact in log10
  CHECK((a * LikelihoodRatio::zero()).is_zero());
  CHECK((a * LikelihoodRatio::infinite()).is_infinite());
  CHECK_THROWS_AS(LikelihoodRatio::zero() * LikelihoodRatio::infinite(), std::invalid_argument);
}

TEST_CASE("from_value rejects negatives and NaN and keeps the limits explicit") {
  CHECK(LikelihoodRatio::from_value(0.0).is_zero());
  CHECK(LikelihoodRatio::from_value(std::numeric_limits<double>::infinity()).is_infinite());
  CHECK(LikelihoodRatio::from_value(1e-300).log10() == Approx(-300.0).epsilon(1e-15));
  CHECK_THROWS_AS(LikelihoodRatio::from_value(-1.0), std::invalid_argument);
  CHECK_THROWS_AS(LikelihoodRatio::from_value(std::nan("")), std::invalid_argument);
  CHECK_THROWS_AS(LikelihoodRatio::from_log10(std::numeric_limits<double>::infinity()), std::invalid_argument);
}
