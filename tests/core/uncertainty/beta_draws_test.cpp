// Bulk Beta and Gamma draws against closed forms: for X ~ Beta(a, b), E[ln X] = psi(a) - psi(a + b)
// and Var[ln X] = psi'(a) - psi'(a + b) (e.g. Johnson, Kotz & Balakrishnan 1995, Continuous
// Univariate Distributions vol. 2, ch. 25 — from memory for the chapter); for G ~ Gamma(k, 1),
// E[ln G] = psi(k) and Var[ln G] = psi'(k). Digamma and trigamma from GSL (gsl_sf_psi,
// gsl_sf_psi_1), the Beta CDF from GSL (gsl_cdf_beta_P) and from Boost.Math
// (boost::math::beta_distribution), the Beta quantiles and density from Boost.Math.
#include <boost/math/distributions/beta.hpp>
#include <catch2/catch.hpp>
#include <gsl/gsl_cdf.h>
#include <gsl/gsl_sf_psi.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <vector>

#include "core/uncertainty/beta_draws.hpp"

using namespace counterpoise::uncertainty;

namespace {
constexpr double kLn10 = 2.302585092994045684;
constexpr std::size_t kDraws = 200000;

struct Moments {
  double mean, variance;
};

Moments moments(const std::vector<double>& values) {
  double sum = 0.0, squares = 0.0;
  for (double v : values) sum += v;
  const double mean = sum / static_cast<double>(values.size());
  for (double v : values) squares += (v - mean) * (v - mean);
  return {mean, squares / static_cast<double>(values.size() - 1)};
}
// kDraws log10 Beta(a, b) draws from a bulk engine seeded from `seed`, sorted.
std::vector<double> sorted_bulk_draws(double a, double b, std::uint64_t seed) {
  std::mt19937_64 seed_source(seed);
  auto rng = bulk_engine_from(seed_source);
  std::vector<double> draws(kDraws);
  BetaSampler(a, b).fill_log10(rng, draws);
  std::sort(draws.begin(), draws.end());
  return draws;
}
}  // namespace

TEST_CASE("log10 Beta draws have the mean and variance of ln X / ln 10") {
  // Shapes on both sides of 1 (log-space and linear-space paths) and a counts-like Beta.
  const auto [a, b] = GENERATE(table<double, double>({{20.0, 3.0}, {4.0, 301.0}, {0.3, 0.2}, {0.05, 2.0}, {1.0, 1.0}, {100705.0, 5246.0}}));
  CAPTURE(a, b);
  const bool bulk = GENERATE(false, true);  // the models' generator, and the bulk engine
  CAPTURE(bulk);
  std::mt19937_64 rng(2026);
  auto engine = bulk_engine_from(rng);
  std::vector<double> draws(kDraws);
  if (bulk) BetaSampler(a, b).fill_log10(engine, draws);
  else BetaSampler(a, b).fill_log10(rng, draws);
  const auto m = moments(draws);
  const double mean = (gsl_sf_psi(a) - gsl_sf_psi(a + b)) / kLn10;
  const double variance = (gsl_sf_psi_1(a) - gsl_sf_psi_1(a + b)) / (kLn10 * kLn10);
  // Five standard errors: of the mean sqrt(var / n); of the variance about var * sqrt(2 / n)
  // (the normal-theory value; the log of a Beta with a shape below 1 has a heavier tail, so
  // that check allows ten).
  CHECK(std::abs(m.mean - mean) < 5.0 * std::sqrt(variance / kDraws));
  CHECK(std::abs(m.variance - variance) < 10.0 * variance * std::sqrt(2.0 / kDraws));
  CHECK(std::all_of(draws.begin(), draws.end(), [](double d) { return std::isfinite(d) && d <= 0.0; }));
}

TEST_CASE("Beta draws follow the Beta CDF at its deciles") {
  // The empirical CDF at x differs from F(x) by at most a few sqrt(F (1 - F) / n); 5 standard
  // errors cannot fail by chance in practice.
  const double a = 2.5, b = 40.0;
  std::mt19937_64 rng(7);
  std::vector<double> draws(kDraws);
  BetaSampler(a, b).fill_log10(rng, draws);
  std::sort(draws.begin(), draws.end());
  for (double q : {0.1, 0.3, 0.5, 0.7, 0.9}) {
    const double x = std::pow(10.0, draws[static_cast<std::size_t>(q * kDraws)]);
    CAPTURE(q, x);
    CHECK(std::abs(gsl_cdf_beta_P(x, a, b) - q) < 5.0 * std::sqrt(q * (1 - q) / kDraws));
  }
}

TEST_CASE("Beta draws from the bulk engine pass a Kolmogorov-Smirnov test against Boost.Math's Beta CDF") {
  // D = max |F_n(x) - F(x)| over the sorted draws; the asymptotic critical value at the 1 % level
  // is 1.63 / sqrt(n) (Massey 1951, "The Kolmogorov-Smirnov test for goodness of fit", JASA
  // 46:68-78, Table 1, n > 35). Shapes of the two sides of a counts item and one below 1 (the
  // log-space path).
  const auto [a, b] = GENERATE(table<double, double>({{20.0, 3.0}, {5.0, 497.0}, {0.4, 7.0}}));
  CAPTURE(a, b);
  const auto draws = sorted_bulk_draws(a, b, 13);
  const boost::math::beta_distribution<double> beta(a, b);
  double largest_gap = 0.0;
  for (std::size_t i = 0; i < kDraws; ++i) {
    const double f = boost::math::cdf(beta, std::pow(10.0, draws[i]));
    largest_gap = std::max({largest_gap, static_cast<double>(i + 1) / kDraws - f, f - static_cast<double>(i) / kDraws});
  }
  CAPTURE(largest_gap);
  CHECK(largest_gap < 1.63 / std::sqrt(static_cast<double>(kDraws)));
}

TEST_CASE("Bulk Beta draws have the quantiles of Boost.Math's Beta distribution") {
  // The sample q-quantile of n draws is asymptotically normal around the true quantile x_q with
  // standard deviation sqrt(q (1 - q) / n) / f(x_q), f the density (Serfling 1980, Approximation
  // Theorems of Mathematical Statistics, 2.3.3 — from memory for the section); five of those,
  // taken at the sorted draw of rank floor(q n). Shapes of the benchmark's items (both sides of
  // a counts item), a draw close to 1 and a flat one; x_q and f from boost::math::beta_distribution.
  const auto [a, b] = GENERATE(table<double, double>({{20.0, 3.0}, {3.0, 299.0}, {100705.0, 5246.0}, {1.0, 1.0}, {2.0, 2.0}}));
  CAPTURE(a, b);
  const auto draws = sorted_bulk_draws(a, b, 17);
  const boost::math::beta_distribution<double> beta(a, b);
  for (double q : {0.01, 0.05, 0.25, 0.5, 0.75, 0.95, 0.99}) {
    const double expected = boost::math::quantile(beta, q);
    const double sample = std::pow(10.0, draws[static_cast<std::size_t>(q * kDraws)]);
    const double standard_error = std::sqrt(q * (1.0 - q) / kDraws) / boost::math::pdf(beta, expected);
    CAPTURE(q, expected, sample, standard_error);
    CHECK(std::abs(sample - expected) < 5.0 * standard_error);
  }
}

TEST_CASE("The bulk engine is a function of the generator it is seeded from") {
  std::mt19937_64 first(99), second(99), other(100);
  auto a = bulk_engine_from(first), b = bulk_engine_from(second), c = bulk_engine_from(other);
  std::vector<double> from_a(1000), from_b(1000), from_c(1000);
  const BetaSampler beta(3.0, 40.0);
  beta.fill_log10(a, from_a);
  beta.fill_log10(b, from_b);
  beta.fill_log10(c, from_c);
  CHECK(from_a == from_b);
  CHECK(from_a != from_c);
}

TEST_CASE("Beta draws in bulk are the draws one at a time, to the last bit") {
  // fill_log10 makes a chunk's draws first and takes their logarithms after, several per vector
  // call; the values must be those of draw_log10 from the same engine state (the tests above
  // check them against Boost.Math), whatever a draw's place in its chunk.
  // Shapes whose draws take both forms (y / x below 3/4, and above), a length that is not a
  // whole number of chunks, and a log-space pair.
  const auto [a, b] = GENERATE(table<double, double>({{20.0, 3.0}, {5.0, 497.0}, {2.0, 2.0}, {0.4, 7.0}}));
  CAPTURE(a, b);
  std::mt19937_64 first(31), second(31);
  auto bulk = bulk_engine_from(first), single = bulk_engine_from(second);
  const BetaSampler beta(a, b);
  std::vector<double> in_bulk(1000), one_at_a_time(1000);
  beta.fill_log10(bulk, in_bulk);
  for (double& value : one_at_a_time) value = beta.draw_log10(single);
  CHECK(in_bulk == one_at_a_time);
  CHECK(bulk() == single());  // the engines were called the same number of times
}

TEST_CASE("log10 Gamma draws for shapes below and above 1") {
  for (double k : {0.01, 0.5, 1.0, 7.5}) {
    CAPTURE(k);
    std::mt19937_64 rng(11);
    const GammaSampler gamma(k);
    std::vector<double> draws(kDraws);
    for (double& d : draws) d = gamma.draw_log10(rng);
    const auto m = moments(draws);
    const double variance = gsl_sf_psi_1(k) / (kLn10 * kLn10);
    CHECK(std::abs(m.mean - gsl_sf_psi(k) / kLn10) < 5.0 * std::sqrt(variance / kDraws));
  }
  CHECK_THROWS_AS(GammaSampler(0.0), std::invalid_argument);
  CHECK_THROWS_AS(BetaSampler(1.0, -2.0), std::invalid_argument);
  CHECK_THROWS_AS(GammaSampler(std::numeric_limits<double>::infinity()), std::invalid_argument);
}
