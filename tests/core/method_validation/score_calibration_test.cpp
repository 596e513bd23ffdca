// Calibration of raw scores: the linear fit against an independent general-purpose minimiser
// (GSL's Nelder-Mead simplex) and against the known answer of the Gaussian model.
#include <catch2/catch.hpp>
#include <gsl/gsl_multimin.h>

#include <cmath>

#include "core/method_validation/score_calibration.hpp"
#include "core/validation/input_error.hpp"
#include "simulated_method.hpp"

using namespace counterpoise::method_validation;

namespace {

// Cllr (bits) of log10 LR = a s + b over the scores: the objective the linear calibration minimises.
double cllr_of_line(const gsl_vector* v, void* p) {
  const auto* scores = static_cast<const ValidationSet*>(p);
  const double a = gsl_vector_get(v, 0), b = gsl_vector_get(v, 1);
  auto softplus = [](double z) { return std::max(z, 0.0) + std::log1p(std::exp(-std::abs(z))); };
  double hp = 0, hd = 0;
  for (double s : scores->hp_log10_lr) hp += softplus(-(a * s + b) * std::log(10.0));
  for (double s : scores->hd_log10_lr) hd += softplus((a * s + b) * std::log(10.0));
  return 0.5 * (hp / scores->hp_log10_lr.size() + hd / scores->hd_log10_lr.size()) / std::log(2.0);
}

std::pair<double, double> minimise_with_gsl_simplex(const ValidationSet& scores) {
  gsl_multimin_function f{cllr_of_line, 2, const_cast<ValidationSet*>(&scores)};
  gsl_vector* x = gsl_vector_alloc(2);
  gsl_vector_set(x, 0, 0.1);
  gsl_vector_set(x, 1, 0.0);
  gsl_vector* step = gsl_vector_alloc(2);
  gsl_vector_set_all(step, 0.2);
  gsl_multimin_fminimizer* m = gsl_multimin_fminimizer_alloc(gsl_multimin_fminimizer_nmsimplex2, 2);
  gsl_multimin_fminimizer_set(m, &f, x, step);
  for (int i = 0; i < 5000; ++i) {
    if (gsl_multimin_fminimizer_iterate(m)) break;
    if (gsl_multimin_test_size(gsl_multimin_fminimizer_size(m), 1e-10) == GSL_SUCCESS) break;
  }
  const std::pair<double, double> ab{gsl_vector_get(m->x, 0), gsl_vector_get(m->x, 1)};
  gsl_multimin_fminimizer_free(m);
  gsl_vector_free(x);
  gsl_vector_free(step);
  return ab;
}

}  // namespace

TEST_CASE("the linear calibration is the minimum of Cllr found by GSL's simplex") {
  // Brümmer & du Preez 2006: logistic-regression calibration minimises Cllr over log LR = a s + b.
  auto m = testing::simulate_gaussian_method(1.5, 3000, 31);
  for (double& s : m.scores.hp_log10_lr) s = 4.0 * s + 10.0;  // raw scores on another scale
  for (double& s : m.scores.hd_log10_lr) s = 4.0 * s + 10.0;
  const LinearCalibration fit = fit_linear_calibration(m.scores);
  const auto [a, b] = minimise_with_gsl_simplex(m.scores);
  // The simplex stops at a size of 1e-10 in (a, b); 1e-6 leaves room for its flat valley.
  CHECK(fit.slope_log10 == Approx(a).margin(1e-6));
  CHECK(fit.offset_log10 == Approx(b).margin(1e-6));
}

TEST_CASE("the linear calibration recovers the Gaussian model's exact LR") {
  // ln LR = d s exactly for this model, so log10 LR = (d / ln 10) s + 0. With 50,000 comparisons
  // of each truth the fitted slope and offset have standard errors near 0.004; 0.02 is five.
  const double d = 2.0;
  const auto m = testing::simulate_gaussian_method(d, 50000, 37);
  const LinearCalibration fit = fit_linear_calibration(m.scores);
  CHECK(fit.slope_log10 == Approx(d / std::log(10.0)).margin(0.02));
  CHECK(fit.offset_log10 == Approx(0.0).margin(0.02));
}

TEST_CASE("scores that separate the truths, or are all equal, cannot be calibrated linearly") {
  CHECK_THROWS_AS(fit_linear_calibration({{2.0, 3.0}, {0.0, 1.0}}), counterpoise::validation::InvalidValue);
  CHECK_THROWS_AS(fit_linear_calibration({{1.0, 1.0}, {1.0}}), counterpoise::validation::InvalidValue);
  CHECK_THROWS_AS(fit_linear_calibration({{1.0, INFINITY}, {1.0, 0.5}}), counterpoise::validation::InvalidValue);
}

TEST_CASE("the PAV calibration is a step function of the training scores") {
  // Training: scores 0,1 are Hd only, 2 mixed (1 Hp, 1 Hd), 3 Hp only; 2 of each truth overall.
  const ValidationSet training{{2.0, 3.0}, {0.0, 1.0, 2.0}};
  const PavCalibration fit = fit_pav_calibration(training);
  // At score 2: posterior odds 1, prior odds 2/3, so LR = 3/2.
  CHECK(fit.log10_lr(2.0) == Approx(std::log10(1.5)).epsilon(1e-14));
  CHECK(fit.log10_lr(2.5) == Approx(std::log10(1.5)).epsilon(1e-14));
  CHECK(fit.log10_lr(-5.0) == -INFINITY);  // below the training data: the lowest step, reported as is
  CHECK(fit.log10_lr(9.0) == INFINITY);
  const ValidationSet applied = apply_calibration({{2.5}, {0.5}}, [&](double s) { return fit.log10_lr(s); });
  CHECK(applied.hp_log10_lr[0] == Approx(std::log10(1.5)).epsilon(1e-14));
  CHECK(applied.hd_log10_lr[0] == -INFINITY);
}
