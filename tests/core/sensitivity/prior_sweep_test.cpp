// Sensitivity over priors: the population form, log spacing, monotonicity and crossings.
#include <catch2/catch.hpp>
#include <cmath>

#include "core/sensitivity/prior_sweep.hpp"

using namespace counterpoise;

TEST_CASE("one of N possible sources gives prior odds 1/(N - 1)") {
  // Population prior: each of N possible sources equally likely a priori, so P(Hp) = 1/N and
  // the odds are 1/(N-1) (e.g. Balding 2005, Weight-of-evidence for Forensic DNA Profiles, ch. 3 — from memory for the chapter).
  casefile::PriorSettings settings;
  settings.one_of_n = {2.0, 1000.0, 5e6};
  const auto points = sensitivity::prior_points(settings);
  REQUIRE(points.size() == 3);
  CHECK(points[0].log10_prior_odds == 0.0);
  CHECK(points[1].log10_prior_odds == Approx(-std::log10(999.0)).epsilon(1e-15));
  const auto sweep = sensitivity::sweep(points, numbers::LikelihoodRatio::neutral(), std::nullopt, {0.5});
  CHECK(sweep.rows[1].posterior.probability() == Approx(1.0 / 1000.0).epsilon(1e-13));
}

TEST_CASE("log-spaced sweeps include both ends") {
  const auto v = sensitivity::log_spaced(-12.0, 3.0, 16);
  CHECK(v.front() == -12.0);
  CHECK(v.back() == 3.0);
  CHECK(v[1] == Approx(-11.0));
  CHECK_THROWS_AS(sensitivity::log_spaced(0, 1, 1), std::invalid_argument);
}

TEST_CASE("the band from the LR interval brackets the point posterior") {
  uncertainty::SpreadSummary spread{6.0, 5.5, 6.8, 5.5, {}, "test", 0.0};
  const auto points = sensitivity::prior_points(std::nullopt);
  const auto sweep = sensitivity::sweep(points, numbers::LikelihoodRatio::from_log10(6.2), spread, {0.5, 0.99});
  for (const auto& row : sweep.rows) {
    CHECK(row.at_low->log10_probability <= row.posterior.log10_probability);
    CHECK(row.at_high->log10_probability >= row.posterior.log10_probability);
  }
  // Reaching 0.5 needs prior odds 1/LR; a larger LR needs smaller prior odds.
  CHECK(sweep.thresholds[0].log10_prior_odds == Approx(-6.2));
  CHECK(*sweep.thresholds[0].log10_prior_odds_high_lr < *sweep.thresholds[0].log10_prior_odds_low_lr);
}
