// Sensitivity over priors: the population form, log spacing, monotonicity and crossings.
#include <catch2/catch.hpp>
#include <algorithm>
#include <cmath>
#include <vector>

#include "core/sensitivity/posterior_columns.hpp"
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

TEST_CASE("swept posteriors and their complements follow the odds form of Bayes' theorem at every scale") {
  // P(Hp | E) = O / (1 + O) and P(Hd | E) = 1 / (1 + O) with O = LR × prior odds (odds form of
  // Bayes' theorem, common practice), computed here in long double from 10^-|log10 O| directly,
  // (through the C library's long double log1p), independently of core's ln(1 + t) form. Posterior log10 odds from -81 to 81 cover
  // complements from about 1e-81 up to 1/2 and probabilities within 1e-15 of 1.
  const double log10_lr = GENERATE(0.0, 3.7, 75.4452, -20.0);
  CAPTURE(log10_lr);
  std::vector<sensitivity::PriorPoint> points;
  for (double l : sensitivity::log_spaced(-12.0, 6.0, 181)) points.push_back({l, std::nullopt, "range"});
  uncertainty::SpreadSummary spread;
  spread.low_log10 = log10_lr - 0.4;
  spread.high_log10 = log10_lr + 0.25;
  const auto sweep = sensitivity::sweep(points, numbers::LikelihoodRatio::from_log10(log10_lr), spread, {0.5});
  double worst = 0.0;
  const auto check = [&worst](const numbers::Posterior& p, double log10_odds) {
    const long double t = std::pow(10.0L, -std::fabs(static_cast<long double>(log10_odds)));
    const long double ln10 = std::log(10.0L);
    const long double log10_larger = -std::log1p(t) / ln10, log10_smaller = std::log10(t) + log10_larger;
    const long double expected_p = log10_odds >= 0 ? log10_larger : log10_smaller;
    const long double expected_c = log10_odds >= 0 ? log10_smaller : log10_larger;
    // Relative 1e-13 in log10 (absolute where the value is near 0): a few units in the last place
    // of the long double reference, whose 10^x carries |x| ln 10 units of relative error.
    const auto gap = [](long double got, long double want) {
      return static_cast<double>(std::fabs(got - want) / std::max(1e-300L, std::fabs(want)));
    };
    worst = std::max({worst, gap(p.log10_probability, expected_p), gap(p.log10_complement, expected_c)});
  };
  for (const auto& row : sweep.rows) {
    check(row.posterior, row.prior.log10_prior_odds + log10_lr);
    check(*row.at_low, row.prior.log10_prior_odds + spread.low_log10);
    check(*row.at_high, row.prior.log10_prior_odds + spread.high_log10);
  }
  CAPTURE(worst);
  CHECK(worst < 1e-13);
}

TEST_CASE("posterior columns are the rows of the sweep, value for value, and follow the odds form") {
  // The columns and the rows share one formula: equal to the last bit. Against the odds form of
  // Bayes' theorem (P(Hp | E) = O / (1 + O), O = LR × prior odds; common practice), computed in
  // long double as in the test above: relative 1e-13 in log10.
  const double log10_lr = GENERATE(0.0, 3.7, 75.4452, -20.0, 400.0);
  CAPTURE(log10_lr);
  const auto lr = numbers::LikelihoodRatio::from_log10(log10_lr);
  const std::vector<double> priors = sensitivity::log_spaced(-12.0, 6.0, 1001);
  std::vector<sensitivity::PriorPoint> points;
  for (double l : priors) points.push_back({l, std::nullopt, "range"});
  const auto rows = sensitivity::sweep(points, lr, std::nullopt, {0.5}).rows;
  std::vector<double> probability(priors.size()), complement(priors.size());
  sensitivity::posterior_columns(priors, lr, probability, complement);
  double worst = 0.0;
  for (std::size_t i = 0; i < priors.size(); ++i) {
    CHECK(probability[i] == rows[i].posterior.log10_probability);
    CHECK(complement[i] == rows[i].posterior.log10_complement);
    const long double odds = static_cast<long double>(priors[i]) + log10_lr;
    const long double t = std::pow(10.0L, -std::fabs(odds));
    const long double larger = -std::log1p(t) / std::log(10.0L), smaller = -std::fabs(odds) + larger;
    const long double want_p = odds >= 0 ? larger : smaller, want_c = odds >= 0 ? smaller : larger;
    const auto gap = [](long double got, long double want) {
      return static_cast<double>(std::fabs(got - want) / std::max(1e-300L, std::fabs(want)));
    };
    worst = std::max({worst, gap(probability[i], want_p), gap(complement[i], want_c)});
  }
  CAPTURE(worst);
  CHECK(worst < 1e-13);
}

TEST_CASE("posterior columns at LR zero and infinity are the explicit states, and sizes must agree") {
  // LR 0: the findings are impossible under Hp, so P(Hp | E) = 0 (log10 -inf) and P(Hd | E) = 1
  // whatever the prior; an infinite LR the reverse (common practice).
  const std::vector<double> priors = {-6.0, 0.0, 3.0};
  std::vector<double> probability(3), complement(3);
  sensitivity::posterior_columns(priors, numbers::LikelihoodRatio::zero(), probability, complement);
  for (std::size_t i = 0; i < 3; ++i) CHECK((std::isinf(probability[i]) && probability[i] < 0 && complement[i] == 0.0));
  sensitivity::posterior_columns(priors, numbers::LikelihoodRatio::infinite(), probability, complement);
  for (std::size_t i = 0; i < 3; ++i) CHECK((probability[i] == 0.0 && std::isinf(complement[i]) && complement[i] < 0));
  std::vector<double> short_column(2);
  CHECK_THROWS_AS(sensitivity::posterior_columns(priors, numbers::LikelihoodRatio::neutral(), short_column, complement),
                  std::invalid_argument);
  const std::vector<double> infinite_prior = {-6.0, INFINITY, 3.0};
  CHECK_THROWS_AS(sensitivity::posterior_columns(infinite_prior, numbers::LikelihoodRatio::neutral(), probability, complement),
                  std::invalid_argument);
}
