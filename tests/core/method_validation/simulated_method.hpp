#pragma once
// A simulated, perfectly calibrated method for the tests: scores s ~ N(+d/2, 1) when Hp is true
// and N(-d/2, 1) when Hd is true, drawn with GSL's generator. Its exact LR is the ratio of the two
// normal densities, ln LR = d s, so under Hp ln LR ~ N(d^2/2, d^2) and under Hd N(-d^2/2, d^2)
// (the equal-variance Gaussian model; e.g. van Leeuwen & Brümmer 2013, "The distribution of
// calibrated likelihood-ratios in speaker recognition", Interspeech — from memory).

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>

#include <cmath>
#include <cstddef>

#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation::testing {

struct SimulatedMethod {
  ValidationSet scores;      // the raw scores s
  ValidationSet log10_lrs;   // the exact log10 LRs, d s / ln 10
};

inline SimulatedMethod simulate_gaussian_method(double d, std::size_t n_each, unsigned long seed) {
  gsl_rng* rng = gsl_rng_alloc(gsl_rng_mt19937);
  gsl_rng_set(rng, seed);
  SimulatedMethod m;
  for (std::size_t i = 0; i < n_each; ++i) {
    const double hp = d / 2 + gsl_ran_gaussian(rng, 1.0);
    const double hd = -d / 2 + gsl_ran_gaussian(rng, 1.0);
    m.scores.add(Truth::hp, hp);
    m.scores.add(Truth::hd, hd);
    m.log10_lrs.add(Truth::hp, d * hp / std::log(10.0));
    m.log10_lrs.add(Truth::hd, d * hd / std::log(10.0));
  }
  gsl_rng_free(rng);
  return m;
}

}  // namespace counterpoise::method_validation::testing
