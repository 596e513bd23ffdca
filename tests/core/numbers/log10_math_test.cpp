// Log-space arithmetic: identities and the extremes the issue names (LRs 1e-300..1e300,
// priors down to 1e-12, complements ~1e-15 reported as such).
#include <catch2/catch.hpp>
#include <gsl/gsl_sys.h>

#include <cmath>
#include <iomanip>
#include <limits>

#include "core/numbers/log10_math.hpp"
#include "core/numbers/posterior.hpp"

using namespace counterpoise::numbers;

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
}

TEST_CASE("log10_add agrees with the direct sum where the direct sum is representable") {
  // Identity log10(10^a + 10^b) (common practice); tolerance 1e-14 relative: a few ulps of the result.
  const auto [a, b] = GENERATE(table<double, double>({{0.0, 0.0}, {-3.0, -5.0}, {2.5, -1.0}, {-300.0, -301.0}}));
  const double direct = std::log10(std::pow(10.0, a) + std::pow(10.0, b));
  CAPTURE(std::setprecision(17), a, b);
  CHECK(log10_add(a, b) == Approx(direct).epsilon(1e-14));
}

TEST_CASE("log10_add works where 10^x overflows or underflows") {
  CHECK(log10_add(400.0, 400.0) == Approx(400.0 + std::log10(2.0)).epsilon(1e-15));
  CHECK(log10_add(-400.0, -400.0) == Approx(-400.0 + std::log10(2.0)).epsilon(1e-15));
  CHECK(log10_add(-kInf, -kInf) == -kInf);
  CHECK(log10_add(-kInf, -2.0) == -2.0);
}

TEST_CASE("log10_sum matches pairwise addition") {
  const double terms[] = {-1.0, -2.0, -3.0};
  CHECK(log10_sum(terms) == Approx(std::log10(0.111)).epsilon(1e-14));
  CHECK(log10_sum(std::span<const double>{}) == -kInf);
}

TEST_CASE("log10_one_minus is exact for probabilities near 0 and near 1") {
  // Near 1: 1 - 10^-e ≈ e ln 10 for tiny e (first-order Taylor expansion, common practice).
  CHECK(log10_one_minus(-1e-20) == Approx(std::log10(1e-20 * kLn10)).epsilon(1e-12));
  // Near 0: log10(1 - 1e-20) ≈ -1e-20 / ln 10.
  CHECK(log10_one_minus(-20.0) == Approx(-1e-20 / kLn10).epsilon(1e-12));
  CHECK(log10_one_minus(std::log10(0.25)) == Approx(std::log10(0.75)).epsilon(1e-15));
  CHECK(log10_one_minus(0.0) == -kInf);
  CHECK_THROWS_AS(log10_one_minus(0.1), std::domain_error);
}

TEST_CASE("posterior of LR 1e18 with prior odds 1e-3 reports a complement of about 1e-15") {
  // Posterior odds 1e15: P(Hd|E) = 1/(1 + 1e15) = 9.99999999999999e-16 (odds form of Bayes' theorem).
  const auto p = posterior_from(-3.0, LikelihoodRatio::from_log10(18.0));
  CHECK(p.log10_odds == 15.0);
  CHECK(p.complement() == Approx(1.0 / (1.0 + 1e15)).epsilon(1e-13));
  CHECK(p.complement() > 0.0);
  CHECK(p.probability() < 1.0);
}

TEST_CASE("posteriors stay finite and ordered across LRs from 1e-300 to 1e300 and priors down to 1e-12") {
  const double log10_lr = GENERATE(-300.0, -150.0, -1.0, 0.0, 1.0, 150.0, 300.0);
  const double log10_prior = GENERATE(-12.0, -6.0, 0.0, 3.0);
  const auto p = posterior_from(log10_prior, LikelihoodRatio::from_log10(log10_lr));
  CAPTURE(log10_lr, log10_prior);
  CHECK(std::isfinite(p.log10_probability));
  CHECK(std::isfinite(p.log10_complement));
  CHECK(p.log10_probability <= 0.0);
  CHECK(p.log10_complement <= 0.0);
  // probability + complement = 1 to rounding, checked in log space for the larger of the two.
  CHECK(log10_add(p.log10_probability, p.log10_complement) == Approx(0.0).margin(1e-15));
}

TEST_CASE("posterior odds are monotone in the prior odds") {
  const auto lr = LikelihoodRatio::from_log10(4.2);
  double previous = -kInf;
  for (double prior = -12.0; prior <= 6.0; prior += 0.25) {
    const double p = posterior_from(prior, lr).log10_probability;
    CHECK(p >= previous);
    previous = p;
  }
}

TEST_CASE("zero and infinite LRs give certain posteriors without NaN") {
  const auto zero = posterior_from(2.0, LikelihoodRatio::zero());
  CHECK(zero.log10_probability == -kInf);
  CHECK(zero.log10_complement == 0.0);
  const auto inf = posterior_from(-12.0, LikelihoodRatio::infinite());
  CHECK(inf.log10_probability == 0.0);
  CHECK(inf.log10_complement == -kInf);
  CHECK_THROWS_AS(posterior_from(kInf, LikelihoodRatio::neutral()), std::invalid_argument);
  CHECK_THROWS_AS(posterior_from(std::nan(""), LikelihoodRatio::neutral()), std::invalid_argument);
}

TEST_CASE("threshold crossings invert the posterior") {
  const auto lr = LikelihoodRatio::from_log10(6.0);
  const double t = GENERATE(0.5, 0.95, 0.99, 0.999999);
  const double prior = prior_log10_odds_reaching(t, lr);
  CHECK(posterior_from(prior, lr).probability() == Approx(t).epsilon(1e-12));
  CHECK(prior_log10_odds_reaching(0.5, LikelihoodRatio::zero()) == kInf);
  CHECK(prior_log10_odds_reaching(0.5, LikelihoodRatio::infinite()) == -kInf);
  CHECK_THROWS_AS(prior_log10_odds_reaching(1.0, lr), std::invalid_argument);
}

TEST_CASE("log_one_plus agrees with GSL's log1p to 5 units in the last place") {
  // Goldberg 1991, ACM Computing Surveys 23(1), Theorem 4: relative error at most 5 ulp for
  // 0 <= r < 3/4; above 3/4 the plain log is as accurate. Reference: gsl_log1p (GSL 2.7).
  const double r = GENERATE(0.0, 1e-300, 1e-17, 1.1e-16, 3e-16, 1e-12, 1e-8, 0.001, 0.3, 0.7499, 0.75, 0.99, 1.0, 7.5, 1e30);
  CAPTURE(std::setprecision(17), r);
  const double reference = gsl_log1p(r);
  CHECK(std::abs(log_one_plus(r) - reference) <= 5.0 * std::numeric_limits<double>::epsilon() * reference);
}
