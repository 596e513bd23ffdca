// Rates of misleading evidence and the equal error rate against exact counts and the Gaussian
// model computed with GSL.
#include <catch2/catch.hpp>
#include <gsl/gsl_cdf.h>

#include <cmath>

#include "core/method_validation/error_rates.hpp"
#include "core/method_validation/pav.hpp"
#include "core/validation/input_error.hpp"
#include "simulated_method.hpp"

using namespace counterpoise::method_validation;

TEST_CASE("misleading evidence is counted in each direction, and LR = 1 is neither") {
  // Royall 2000, JASA 95:760: misleading = favouring the false proposition; strong at k = 100.
  const ValidationSet set{{3.0, 0.5, -0.5, -2.0, 0.0}, {-3.0, 0.2, 2.0, 0.0}};
  const MisleadingRates r = misleading_rates(set);
  CHECK(r.hp == Approx(2.0 / 5));
  CHECK(r.strong_hp == Approx(1.0 / 5));  // log10 LR -2 is LR 1/100, on the threshold
  CHECK(r.hd == Approx(2.0 / 4));
  CHECK(r.strong_hd == Approx(1.0 / 4));  // log10 LR 2 is LR 100, on the threshold
  CHECK(r.neutral_hp == 1);
  CHECK(r.neutral_hd == 1);
  CHECK_THROWS_AS(misleading_rates(set, 1.0), counterpoise::validation::InvalidValue);
}

TEST_CASE("strongly misleading evidence of a calibrated method stays under Royall's bound") {
  // Royall 2000: P(LR >= k | Hd) <= 1/k for any k. For the equal-variance Gaussian method the
  // exact rate is P(N(-mu, 2mu) >= ln k) with mu = d^2/2 (GSL gsl_cdf_gaussian_Q).
  const double d = 3.0, mu = d * d / 2;
  const auto m = testing::simulate_gaussian_method(d, 200000, 17);
  const MisleadingRates r = misleading_rates(m.log10_lrs);
  const double exact = gsl_cdf_gaussian_Q(std::log(100.0) + mu, d);
  // Binomial standard error sqrt(p(1-p)/n) is about 1.4e-4 here; 5 standard errors.
  CHECK(r.strong_hd == Approx(exact).margin(7e-4));
  CHECK(r.strong_hd <= 1.0 / 100);
  // Misleading at all (LR > 1 under Hd): P(N(-mu, d^2) > 0) = Q(mu / d).
  CHECK(r.hd == Approx(gsl_cdf_gaussian_Q(mu, d)).margin(5 * std::sqrt(0.07 * 0.93 / 200000)));
}

TEST_CASE("the equal error rate of the Gaussian method is Phi(-d/2)") {
  // Scores N(+d/2, 1) and N(-d/2, 1): at the threshold 0 both error rates are Phi(-d/2)
  // (GSL gsl_cdf_ugaussian_P). The convex hull can only lower the empirical EER by O(1/sqrt(n)).
  for (double d : {1.0, 2.0, 3.0}) {
    CAPTURE(d);
    const auto m = testing::simulate_gaussian_method(d, 100000, 23);
    const auto atoms = pooled_atoms(m.scores);
    const double eer = equal_error_rate(fit_pav(atoms));
    const double p = gsl_cdf_ugaussian_P(-d / 2);
    // Five binomial standard errors of a rate p from 100,000 trials.
    CHECK(eer == Approx(p).margin(5 * std::sqrt(p * (1 - p) / 100000)));
  }
}

TEST_CASE("the equal error rate at the extremes") {
  const auto separated = pooled_atoms({{2.0, 3.0}, {-1.0, 0.0}});
  CHECK(equal_error_rate(fit_pav(separated)) == 0.0);
  const auto tied = pooled_atoms({{1.0, 1.0}, {1.0, 1.0}});
  CHECK(equal_error_rate(fit_pav(tied)) == Approx(0.5));
  // Reversed: every Hd score above every Hp score; the convex hull is the chance diagonal.
  const auto reversed = pooled_atoms({{-2.0, -1.0}, {1.0, 2.0}});
  CHECK(equal_error_rate(fit_pav(reversed)) == Approx(0.5));
}
