// Assigned probabilities: Laplace's rule for counts, Beta quantiles and CDFs against GSL,
// draws against the Beta moments, and a throw test for every documented reading error.
#include <catch2/catch.hpp>
#include <gsl/gsl_cdf.h>
#include <gsl/gsl_version.h>

#include <cmath>
#include <iomanip>
#include <limits>
#include <numeric>

#include "core/probability/probability_assignment.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise::probability;
using counterpoise::validation::InvalidValue;
using counterpoise::validation::Location;
using nlohmann::json;

namespace {
Assignment read(const char* text) { return read_assignment(json::parse(text), Location{"E1", "p_given_hd"}); }
}  // namespace

TEST_CASE("counts k of n have the mean (k + 1) / (n + 2): Laplace's rule of succession") {
  // Laplace (1814), Essai philosophique sur les probabilités: rule of succession (k+1)/(n+2).
  const auto [k, n] = GENERATE(table<int, int>({{3, 412}, {0, 10}, {10, 10}, {0, 1000000}, {57, 60}}));
  const auto a = read(("{\"counts\": {\"k\": " + std::to_string(k) + ", \"n\": " + std::to_string(n) + "}}").c_str());
  CAPTURE(k, n);
  CHECK(mean(a) == Approx((k + 1.0) / (n + 2.0)).epsilon(1e-14));
}

TEST_CASE("a configured Beta prior on counts shifts the mean to (k + a0) / (n + a0 + b0)") {
  // Conjugate Beta-binomial update (e.g. Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., section 2.4).
  const auto a = read(R"({"counts": {"k": 3, "n": 412, "prior": [0.5, 0.5]}})");
  CHECK(mean(a) == Approx(3.5 / 413.0).epsilon(1e-14));
}

TEST_CASE("Beta quantiles agree with GSL's gsl_cdf_beta_Pinv") {
  // Reference: GNU Scientific Library (Debian libgsl-dev), gsl_cdf_beta_Pinv. Tolerance 1e-9
  // relative: GSL's inverse is iterative with about that accuracy.
  const auto [a, b] = GENERATE(table<double, double>({{38, 4}, {4, 410}, {0.5, 0.5}, {2, 30}, {1, 1}}));
  const double q = GENERATE(0.001, 0.05, 0.5, 0.95, 0.999);
  const BetaValue beta{a, b};
  CAPTURE(std::setprecision(17), a, b, q, GSL_VERSION);
  CHECK(std::pow(10.0, log10_quantile(beta, q)) == Approx(gsl_cdf_beta_Pinv(q, a, b)).epsilon(1e-9));
}

TEST_CASE("the lattice form of log10 p carries the Beta CDF of GSL at the bin edges") {
  // Reference: gsl_cdf_beta_P (GSL). The cumulative lattice mass up to a bin's upper edge equals
  // the Beta CDF at 10^edge, to 1e-10 absolute (both sides compute regularised incomplete betas).
  const BetaValue beta{4.0, 410.0};
  const auto grid = log10_grid(beta, 0.01);
  REQUIRE(grid);
  double cumulative = 0.0;
  double worst = 0.0;
  for (std::size_t i = 0; i + 1 < grid->mass.size(); ++i) {
    cumulative += grid->mass[i];
    const double edge = grid->value_at(i) + 0.5 * grid->step;
    worst = std::max(worst, std::abs(cumulative - gsl_cdf_beta_P(std::pow(10.0, edge), 4.0, 410.0)));
  }
  CAPTURE(worst);
  CHECK(worst < 1e-10);
  CHECK(std::accumulate(grid->mass.begin(), grid->mass.end(), 0.0) == Approx(1.0).epsilon(1e-12));
}

TEST_CASE("log-space Beta draws reproduce the Beta mean and variance") {
  // Beta(a, b): mean a/(a+b), variance ab/((a+b)^2 (a+b+1)). 200 000 draws: the sample mean's
  // standard error is sd/447, so a tolerance of 5 standard errors cannot fail by chance in practice.
  const auto [a, b] = GENERATE(table<double, double>({{38, 4}, {0.3, 2.0}, {4, 410}}));
  std::mt19937_64 rng(2026);
  const BetaValue beta{a, b};
  const int n = 200000;
  double sum = 0.0, sum_sq = 0.0;
  for (int i = 0; i < n; ++i) {
    const double x = std::pow(10.0, draw_log10(beta, rng));
    sum += x;
    sum_sq += x * x;
  }
  const double m = sum / n, v = sum_sq / n - m * m;
  const double true_mean = a / (a + b), true_var = a * b / ((a + b) * (a + b) * (a + b + 1));
  CAPTURE(a, b, m, v);
  CHECK(std::abs(m - true_mean) < 5.0 * std::sqrt(true_var / n));
  CHECK(v == Approx(true_var).epsilon(0.03));
}

TEST_CASE("tiny shape parameters draw in log space without underflow to zero") {
  std::mt19937_64 rng(7);
  const BetaValue beta{0.002, 5.0};
  for (int i = 0; i < 1000; ++i) CHECK(std::isfinite(draw_log10(beta, rng)));
  CHECK_FALSE(log10_grid(beta, 0.1).has_value());  // reaches below the smallest double: draws only
}

TEST_CASE("an interval is uniform on the log scale unless linear is stated") {
  // Mean of X with log X uniform on [ln lo, ln hi]: (hi - lo) / ln(hi / lo) (standard result).
  const auto log_interval = read(R"({"interval": [0.01, 0.05]})");
  CHECK(mean(log_interval) == Approx(0.04 / std::log(5.0)).epsilon(1e-14));
  const auto linear = read(R"({"interval": [0.5, 0.9], "scale": "linear"})");
  CHECK(mean(linear) == Approx(0.7).epsilon(1e-15));
  CHECK(describe(linear) == "between 0.5 and 0.9 (uniform)");
}

TEST_CASE("reading and writing an assignment round-trips") {
  for (const char* text : {"0.95", R"({"interval":[0.01,0.05]})", R"({"interval":[0,0.2],"scale":"linear"})",
                           R"({"beta":[38,4]})", R"({"counts":{"k":3,"n":412}})", R"({"counts":{"k":3,"n":412,"prior":[0.5,0.5]}})"}) {
    CAPTURE(text);
    CHECK(to_json(read(text)) == json::parse(text));
  }
}

TEST_CASE("every documented reading error names the item and field") {
  const auto [text, fragment] = GENERATE(table<const char*, const char*>({
      {"1.2", "outside [0, 1]"},
      {"-0.1", "outside [0, 1]"},
      {"\"0.5\"", "a probability is a number"},
      {R"({"interval": [0.3, 0.1]})", "greater than high"},
      {R"({"interval": [0, 0.1]})", "cannot start at 0"},
      {R"({"interval": [0.1]})", "exactly two numbers"},
      {R"({"interval": [0.1, 0.2], "scale": "cubic"})", "scale must be"},
      {R"({"beta": [0, 2]})", "greater than 0"},
      {R"({"beta": [2, -1]})", "greater than 0"},
      {R"({"counts": {"k": -1, "n": 10}})", "must not be negative"},
      {R"({"counts": {"k": 11, "n": 10}})", "greater than n"},
      {R"({"counts": {"k": 1.5, "n": 10}})", "whole number"},
      {R"({"counts": {"k": 1, "n": 10, "prior": [0, 1]}})", "greater than 0"},
      {R"({"counts": {"k": 1, "m": 10}})", "unknown field"},
      {R"({"gamma": [1, 2]})", "needs one of"},
  }));
  CAPTURE(text);
  try {
    read(text);
    FAIL("no error for " << text);
  } catch (const InvalidValue& e) {
    CHECK_THAT(e.what(), Catch::Contains(fragment));
    CHECK_THAT(e.what(), Catch::Contains("item E1, field p_given_hd"));
  }
}

TEST_CASE("NaN and infinity held in a JSON value are rejected") {
  CHECK_THROWS_AS(read_assignment(json(std::nan("")), Location{"E1", "p_given_hp"}), InvalidValue);
  CHECK_THROWS_AS(read_assignment(json(std::numeric_limits<double>::infinity()), Location{"E1", "p_given_hp"}), InvalidValue);
}
