// The summary of draws by selection (summarize_unordered_draws) reads the quantiles of the draws
// sorted, as definition 7 of Hyndman & Fan (1996, "Sample quantiles in statistical packages",
// The American Statistician 50:361) defines them; GSL computes that definition independently
// (GNU Scientific Library Reference Manual, "Statistics": gsl_stats_quantile_from_sorted_data,
// quantile = (1 - delta) x_i + delta x_(i+1), i = floor((n - 1) f), delta = (n - 1) f - i; the
// draws sorted by gsl_sort, "Sorting") from draws of GSL's own generator (gsl_rng_mt19937,
// gsl_ran_gaussian and gsl_ran_beta).
#include <catch2/catch.hpp>
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_sort.h>
#include <gsl/gsl_statistics_double.h>

#include <cmath>
#include <limits>
#include <vector>

#include "core/uncertainty/unordered_draws_summary.hpp"

using namespace counterpoise::uncertainty;

namespace {

// `count` draws of log10 of a Beta(2, 30) (skewed) or of a normal, from GSL's generator.
std::vector<double> gsl_draws(std::size_t count, bool skewed, unsigned long seed) {
  gsl_rng* rng = gsl_rng_alloc(gsl_rng_mt19937);
  gsl_rng_set(rng, seed);
  std::vector<double> draws(count);
  for (double& d : draws) d = skewed ? std::log10(gsl_ran_beta(rng, 2.0, 30.0)) : 1.5 + 0.3 * gsl_ran_gaussian(rng, 1.0);
  gsl_rng_free(rng);
  return draws;
}

double gsl_quantile(std::vector<double> values, double q) {
  gsl_sort(values.data(), 1, values.size());
  return gsl_stats_quantile_from_sorted_data(values.data(), 1, values.size(), q);
}

}  // namespace

TEST_CASE("summary by selection: the quantiles of the sorted draws, as GSL computes them", "[uncertainty][summary]") {
  const std::size_t count = GENERATE(1u, 2u, 7u, 1000u, 100001u);
  const bool skewed = GENERATE(false, true);
  const SpreadLevels levels = GENERATE(SpreadLevels{0.90, 0.95}, SpreadLevels{0.80, 0.99}, SpreadLevels{0.99, 0.999});
  const auto draws = gsl_draws(count, skewed, 20261204 + count);
  CAPTURE(count, skewed, levels.credible, levels.conservative);

  auto unordered = draws;
  const auto s = summarize_unordered_draws(unordered, levels, 10.0);  // reported above every draw: the bound is a quantile
  const double tail = 0.5 * (1.0 - levels.credible);
  // GSL's formula and ours differ in the last bits (a + d(b - a) against (1 - d)a + d b).
  CHECK(s.median_log10 == Approx(gsl_quantile(draws, 0.5)).epsilon(1e-14));
  CHECK(s.low_log10 == Approx(gsl_quantile(draws, tail)).epsilon(1e-14));
  CHECK(s.high_log10 == Approx(gsl_quantile(draws, 1.0 - tail)).epsilon(1e-14));
  CHECK(s.conservative_log10 == Approx(gsl_quantile(draws, 1.0 - levels.conservative)).epsilon(1e-14));
  CHECK(s.method == "Monte Carlo (" + std::to_string(count) + " draws)");

  // And exactly the values of the summary that sorts.
  auto sorted = draws;
  const auto by_sorting = summarize_draws(sorted, levels, 10.0);
  CHECK(s.median_log10 == by_sorting.median_log10);
  CHECK(s.low_log10 == by_sorting.low_log10);
  CHECK(s.high_log10 == by_sorting.high_log10);
  CHECK(s.conservative_log10 == by_sorting.conservative_log10);
}

TEST_CASE("summary by selection: zero and infinite draws are read as the sorted summary reads them",
          "[uncertainty][summary]") {
  // 6 % of the draws -inf (an LR of zero) and 3 % +inf: the 5 % quantile is -inf, the 95 % finite.
  auto draws = gsl_draws(10000, false, 7);
  for (std::size_t k = 0; k < 600; ++k) draws[k * 16] = -std::numeric_limits<double>::infinity();
  for (std::size_t k = 0; k < 300; ++k) draws[k * 16 + 1] = std::numeric_limits<double>::infinity();
  auto unordered = draws, sorted = draws;
  const SpreadLevels levels{0.9, 0.95};
  const auto s = summarize_unordered_draws(unordered, levels, 1.5);
  const auto by_sorting = summarize_draws(sorted, levels, 1.5);
  CHECK(s.low_log10 == -std::numeric_limits<double>::infinity());
  CHECK(std::isfinite(s.high_log10));
  CHECK(s.low_log10 == by_sorting.low_log10);
  CHECK(s.high_log10 == by_sorting.high_log10);
  CHECK(s.median_log10 == by_sorting.median_log10);
  CHECK(s.conservative_log10 == by_sorting.conservative_log10);
}
