// Sampling uncertainty: Dirichlet draws against GSL's Beta distribution, and the behaviour of
// the LR interval (median near the point value, wider for a smaller database, seeded).
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <random>
#include <vector>

#include <gsl/gsl_cdf.h>

#include "core/models/dna/allele_posterior.hpp"
#include "dna_test_support.hpp"

using namespace counterpoise::models::dna;
using nlohmann::json;

namespace {
double quantile(std::vector<double> values, double q) {
  std::sort(values.begin(), values.end());
  return values[static_cast<std::size_t>(q * static_cast<double>(values.size() - 1))];
}
}  // namespace

TEST_CASE("posterior parameters", "[dna][posterior]") {
  // Dirichlet(1/K) prior plus counts, aggregated (see allele_posterior.hpp).
  const auto post = allele_posterior(false, 30, 12, 200, 10);
  CHECK(post.alpha_a == Approx(30.1));
  CHECK(post.alpha_b == Approx(12.1));
  CHECK(post.alpha_rest == Approx(158.8));
  CHECK_THROWS_AS(allele_posterior(false, 150, 60, 200, 10), std::invalid_argument);
  CHECK_THROWS_AS(allele_posterior(false, 1, 1, 200, 1), std::invalid_argument);
}

TEST_CASE("Dirichlet marginals agree with GSL's Beta distribution", "[dna][posterior][gsl]") {
  // The marginal of one Dirichlet component is Beta(alpha_i, sum - alpha_i) (Kotz,
  // Balakrishnan & Johnson 2000, ch. 49 — from memory); reference CDF: GSL gsl_cdf_beta_P.
  const auto post = allele_posterior(GENERATE(true, false), 7, 3, 120, 12);
  const double total = post.alpha_a + post.alpha_b + post.alpha_rest;
  std::mt19937_64 rng(20261201);
  const int n = 200000;
  std::vector<double> ps(n), qs(n);
  for (int i = 0; i < n; ++i) draw_allele_frequencies(post, rng, ps[i], qs[i]);
  for (double x : {0.02, 0.04, 0.06, 0.08, 0.12}) {
    const double expected = gsl_cdf_beta_P(x, post.alpha_a, total - post.alpha_a);
    const double observed = static_cast<double>(std::count_if(ps.begin(), ps.end(), [x](double v) { return v <= x; })) / n;
    // 5 binomial standard errors: a false failure has probability below 1e-6 per point.
    CAPTURE(x, expected, observed);
    CHECK(std::fabs(observed - expected) <= 5.0 * std::sqrt(expected * (1 - expected) / n) + 1e-12);
  }
  double mean = 0, var = 0;
  for (double v : ps) mean += v;
  mean /= n;
  for (double v : ps) var += (v - mean) * (v - mean);
  var /= (n - 1);
  // Beta moments: a/(a+b) and ab/((a+b)^2 (a+b+1)) (common practice).
  const double a = post.alpha_a, b = total - post.alpha_a;
  CHECK(mean == Approx(a / (a + b)).epsilon(0.01));
  CHECK(var == Approx(a * b / ((a + b) * (a + b) * (a + b + 1))).epsilon(0.03));
  if (!post.homozygote) {
    const double expected = gsl_cdf_beta_P(0.02, post.alpha_b, total - post.alpha_b);
    const double observed = static_cast<double>(std::count_if(qs.begin(), qs.end(), [](double v) { return v <= 0.02; })) / n;
    CHECK(std::fabs(observed - expected) <= 5.0 * std::sqrt(expected * (1 - expected) / n) + 1e-12);
  }
}

namespace {
json counted_item(int scale) {
  // Invented counts; `scale` multiplies the database (same frequencies, more people).
  json counts = json::object();
  counts["D8S1179"] = {{"13", 60 * scale}, {"14", 42 * scale}, {"10", 98 * scale}};
  counts["TH01"] = {{"9.3", 70 * scale}, {"6", 130 * scale}};
  counts["FGA"] = {{"20", 30 * scale}, {"22", 44 * scale}, {"24", 126 * scale}};
  return json{{"theta", 0.01},
              {"profile", {{"D8S1179", {"13", "14"}}, {"TH01", {"9.3", "9.3"}}, {"FGA", {"20", "22"}}}},
              {"frequencies", {{"counts", counts}}}};
}
std::vector<double> draws(const json& item, std::uint64_t seed, int n = 20000) {
  const auto model = dna_test::read(item);
  std::mt19937_64 rng(seed);
  std::vector<double> out(n);
  model->draw_log10_lr(rng, out);
  return out;
}
}  // namespace

TEST_CASE("LR interval: median near the point value, wider for a smaller database", "[dna][posterior]") {
  const auto small = draws(counted_item(1), 7), large = draws(counted_item(10), 7);
  const double point = dna_test::read(counted_item(1))->evaluate().lr.log10();
  REQUIRE(dna_test::read(counted_item(1))->is_uncertain());
  // The posterior mean of each frequency differs from the count ratio by the prior weight 1/K
  // in 200 alleles, so the median lies within a few hundredths of a log10 unit (common practice).
  CHECK(quantile(small, 0.5) == Approx(point).margin(0.05));
  CHECK(quantile(large, 0.5) == Approx(point).margin(0.02));
  const double width_small = quantile(small, 0.95) - quantile(small, 0.05);
  const double width_large = quantile(large, 0.95) - quantile(large, 0.05);
  CHECK(width_small > 2.5 * width_large);  // ~ sqrt(10) narrower with 10 times the data
  CHECK(width_large > 0.0);
}

TEST_CASE("draws are reproducible from the seed", "[dna][posterior]") {
  CHECK(draws(counted_item(1), 42, 500) == draws(counted_item(1), 42, 500));
  CHECK(draws(counted_item(1), 42, 500) != draws(counted_item(1), 43, 500));
}

TEST_CASE("draws respect the minimum allele frequency", "[dna][posterior][floor]") {
  // Allele 5 is unseen among 200 TH01 alleles: the point value and every draw use at least
  // 5/2N = 0.025 (NRC II 1996 p. 148), so no draw exceeds the LR at the floor.
  json item{{"theta", 0.01},
            {"profile", {{"TH01", {"5", "5"}}}},
            {"frequencies", {{"counts", {{"TH01", {{"9.3", 70}, {"6", 130}}}}}}}};
  const auto model = dna_test::read(item);
  REQUIRE(model->evaluate().detail["loci"][0]["minimum_frequency_applied"] == true);
  const double t = 0.01, f = 0.025;
  const double log10_lr_at_floor = -std::log10((2 * t + (1 - t) * f) * (3 * t + (1 - t) * f) / ((1 + t) * (1 + 2 * t)));
  CHECK(model->evaluate().lr.log10() == Approx(log10_lr_at_floor).epsilon(1e-13));
  const auto values = draws(item, 3, 5000);
  const auto at_floor = std::count_if(values.begin(), values.end(),
                                      [&](double v) { return std::fabs(v - log10_lr_at_floor) < 1e-12; });
  for (double v : values) REQUIRE(v <= log10_lr_at_floor + 1e-12);
  // The posterior of an unseen allele, Beta(1/3, 200 + 2/3), puts most of its mass below 0.025.
  CHECK(at_floor > 4000);
}
