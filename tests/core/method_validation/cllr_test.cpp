// Cllr and the empirical cross-entropy against their definitions, their published reference
// values and an independent quadrature (GSL).
#include <catch2/catch.hpp>
#include <gsl/gsl_integration.h>

#include <cmath>
#include <vector>

#include "core/method_validation/cllr.hpp"
#include "core/method_validation/pav.hpp"
#include "core/method_validation/performance_curves.hpp"
#include "core/validation/input_error.hpp"
#include "simulated_method.hpp"

using namespace counterpoise::method_validation;

namespace {

ValidationSet make_set(std::vector<double> hp, std::vector<double> hd) { return {std::move(hp), std::move(hd)}; }

// E[log2(1 + e^{-L})] for L ~ N(mu, 2 mu), by GSL's adaptive quadrature over the real line: the
// expected Hp cost of the equal-variance Gaussian method with mu = d^2/2 (by symmetry also the Hd
// cost, so Cllr itself).
double gaussian_cllr_by_quadrature(double d, double prior_log10_odds = 0.0) {
  struct Params {
    double mu, sd, o_ln;
    int sign;
  };
  auto integrand = [](double l, void* p) {
    const auto* q = static_cast<const Params*>(p);
    const double z = (l - q->mu) / q->sd;
    const double density = std::exp(-0.5 * z * z) / (q->sd * std::sqrt(2 * M_PI));
    // Hp cost log2(1 + 1/(LR O)), Hd cost log2(1 + LR O), with LR = e^l.
    const double t = q->sign * (l + q->o_ln);
    const double cost = (t > 0 ? 0.0 : -t) + std::log1p(std::exp(-std::abs(t)));
    return density * cost / std::log(2.0);
  };
  gsl_integration_workspace* w = gsl_integration_workspace_alloc(1000);
  const double mu = d * d / 2, sd = d;
  const double o_ln = prior_log10_odds * std::log(10.0);
  Params hp{mu, sd, o_ln, +1}, hd{-mu, sd, o_ln, -1};
  gsl_function f{integrand, &hp};
  double hp_cost = 0, hd_cost = 0, err = 0;
  gsl_integration_qagi(&f, 1e-12, 1e-10, 1000, w, &hp_cost, &err);
  f.params = &hd;
  gsl_integration_qagi(&f, 1e-12, 1e-10, 1000, w, &hd_cost, &err);
  gsl_integration_workspace_free(w);
  const double p_hp = 1.0 / (1.0 + std::pow(10.0, -prior_log10_odds));
  return p_hp * hp_cost + (1.0 - p_hp) * hd_cost;
}

}  // namespace

TEST_CASE("a method that always says LR = 1 costs exactly one bit") {
  // Brümmer & du Preez 2006, Computer Speech and Language 20:230: the neutral reference system
  // has Cllr = 1 (log2 2 for every trial).
  CHECK(cllr(make_set({0, 0, 0}, {0, 0})) == 1.0);
}

TEST_CASE("a method certain and right costs nothing, certain and wrong costs infinitely much") {
  // Same source: Cllr -> 0 as the LRs of a perfect method go to +inf (Hp) and 0 (Hd).
  CHECK(cllr(make_set({INFINITY, INFINITY}, {-INFINITY})) == 0.0);
  CHECK(cllr(make_set({-INFINITY, 2.0}, {-1.0})) == INFINITY);
  CHECK(cllr(make_set({2.0}, {INFINITY})) == INFINITY);
}

TEST_CASE("Cllr follows its definition on a small set") {
  // Brümmer & du Preez 2006, eq. for Cllr, computed here term by term with std::log2.
  const std::vector<double> hp_lr = {10, 100, 0.5, 3}, hd_lr = {0.1, 2, 0.01};
  ValidationSet set;
  double hp_sum = 0, hd_sum = 0;
  for (double lr : hp_lr) {
    set.add(Truth::hp, std::log10(lr));
    hp_sum += std::log2(1 + 1 / lr);
  }
  for (double lr : hd_lr) {
    set.add(Truth::hd, std::log10(lr));
    hd_sum += std::log2(1 + lr);
  }
  const double expected = 0.5 * (hp_sum / 4 + hd_sum / 3);
  // Relative 1e-14: the two differ only by rounding in log1p against log2.
  CHECK(cllr(set) == Approx(expected).epsilon(1e-14));
}

TEST_CASE("huge LRs in the wrong direction neither overflow nor lose digits") {
  // log2(1 + 10^400) = 400 log2(10) + log2(1 + 10^-400), i.e. 400 log2 10 in double precision.
  const double expected = 0.5 * (0.0 + 400 * std::log2(10.0));
  CHECK(cllr(make_set({INFINITY}, {400.0})) == Approx(expected).epsilon(1e-15));
  // log2(1 + x) = x / ln 2 to within x^2: exact in double for x = 1e-300.
  CHECK(log2_one_plus_pow10(-300.0) == Approx(1e-300 / std::log(2.0)).epsilon(1e-14));
}

TEST_CASE("Cllr of a calibrated Gaussian method matches the quadrature of its expected cost") {
  // 200,000 comparisons of each truth; the Monte Carlo standard error of Cllr is below 0.002 for
  // these d (per-trial costs have SD < 1 bit), so 0.01 is five standard errors.
  for (double d : {1.0, 2.0, 3.0}) {
    CAPTURE(d);
    const auto m = testing::simulate_gaussian_method(d, 200000, 7);
    CHECK(cllr(m.log10_lrs) == Approx(gaussian_cllr_by_quadrature(d)).margin(0.01));
  }
}

TEST_CASE("the empirical cross-entropy equals Cllr at even prior odds and the quadrature elsewhere") {
  // Ramos & González-Rodríguez 2013, FSI 230:156: ECE at prior log odds 0 is Cllr.
  const auto m = testing::simulate_gaussian_method(2.0, 200000, 11);
  CHECK(empirical_cross_entropy(m.log10_lrs, 0.0) == Approx(cllr(m.log10_lrs)).epsilon(1e-12));
  for (double o : {-2.0, -1.0, 1.0, 2.0}) {
    CAPTURE(o);
    // The same five-standard-error margin as above.
    CHECK(empirical_cross_entropy(m.log10_lrs, o) == Approx(gaussian_cllr_by_quadrature(2.0, o)).margin(0.01));
  }
}

TEST_CASE("the neutral reference is the entropy of the prior") {
  // A method that always says LR = 1 leaves the prior as it was: ECE = H(P(Hp)) in bits
  // (Ramos & González-Rodríguez 2013, the "neutral" curve).
  for (double o : {-2.0, -0.5, 0.0, 1.0, 2.5}) {
    const double p = 1.0 / (1.0 + std::pow(10.0, -o));
    CHECK(neutral_cross_entropy(o) == Approx(-p * std::log2(p) - (1 - p) * std::log2(1 - p)).epsilon(1e-12));
  }
}

TEST_CASE("the PAV-calibrated cross-entropy is nowhere above the method's own") {
  // PAV gives the LRs with the least ECE at every prior among monotone transforms (Brümmer &
  // du Preez 2006, the optimality of PAV calibration); the method's LRs are one such transform.
  auto m = testing::simulate_gaussian_method(1.5, 5000, 3);
  for (double& x : m.log10_lrs.hp_log10_lr) x = 2.0 * x + 0.7;  // a badly calibrated method
  for (double& x : m.log10_lrs.hd_log10_lr) x = 2.0 * x + 0.7;
  const auto atoms = pooled_atoms(m.log10_lrs);
  const PavFit fit = fit_pav(atoms);
  for (double o : evenly_spaced(-2.5, 2.5, 21)) {
    CAPTURE(o);
    CHECK(empirical_cross_entropy(fit, o) <= empirical_cross_entropy(m.log10_lrs, o) + 1e-12);
  }
}

TEST_CASE("Cllr needs both truths") {
  CHECK_THROWS_AS(cllr(make_set({1.0}, {})), counterpoise::validation::InvalidValue);
  CHECK_THROWS_AS(cllr(make_set({}, {1.0})), counterpoise::validation::InvalidValue);
}

TEST_CASE("the ECE curve agrees with the exact ECE at each prior, extreme LRs included") {
  // ece_curves forms 10^x once per result; empirical_cross_entropy forms 10^(x + o) each time.
  // They differ only by rounding: relative 1e-12 covers the sum of 10^4 terms.
  auto m = testing::simulate_gaussian_method(2.0, 5000, 13);
  m.log10_lrs.add(Truth::hp, 400.0);
  m.log10_lrs.add(Truth::hd, -320.0);
  m.log10_lrs.add(Truth::hd, 260.0);
  const auto atoms = pooled_atoms(m.log10_lrs);
  const auto priors = evenly_spaced(-2.5, 2.5, 11);
  const EceCurves curves = ece_curves(m.log10_lrs, fit_pav(atoms), priors);
  for (std::size_t i = 0; i < priors.size(); ++i) {
    CAPTURE(priors[i]);
    CHECK(curves.method[i] == Approx(empirical_cross_entropy(m.log10_lrs, priors[i])).epsilon(1e-12));
  }
}
