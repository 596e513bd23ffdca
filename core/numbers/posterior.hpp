#pragma once
// Odds form of Bayes' theorem in log10 space: posterior odds = LR × prior odds
// (e.g. Aitken, Taroni & Bozza 2021, Statistics and the Evaluation of Evidence for Forensic
// Scientists, 3rd ed., eq. 2.xx, the odds form of Bayes' theorem — from memory for the number).
// The posterior probability and its complement are both computed from the log odds directly,
// so 1 - 1e-15 is reported as a complement of 1e-15, never as 1.

#include <cmath>

#include "core/numbers/likelihood_ratio.hpp"
#include "core/numbers/log10_math.hpp"

namespace counterpoise::numbers {

struct Posterior {
  double log10_odds;              // -inf when LR is zero, +inf when LR is infinite
  double log10_probability;       // log10 P(Hp | E, prior)
  double log10_complement;        // log10 P(Hd | E, prior) = log10(1 - P(Hp | E, prior))

  double probability() const;     // 10^log10_probability
  double complement() const;      // 10^log10_complement
};

// Posterior for prior odds given as log10 (finite). Throws std::invalid_argument for NaN or
// infinite prior log10 odds.
Posterior posterior_from(double log10_prior_odds, const LikelihoodRatio& lr);

// Posterior for a posterior log10 odds already formed (may be ±inf).
Posterior posterior_from_log10_odds(double log10_posterior_odds);

// The same for finite log10 odds, without the checks (for loops over many priors whose sums are
// known to be finite). With t = 10^-|L|, the smaller of P(Hp|E) and P(Hd|E) is t / (1 + t) and
// the larger 1 / (1 + t): one exponential and one ln(1 + t) give both, each without
// cancellation. t is formed as exp(-|L| ln 10) rather than pow(10, -|L|) (several times faster):
// its relative error, about |L| ln 10 units in the last place, enters ln(1 + t) only as an
// absolute error of t times that, far below the rounding of the result.
inline Posterior posterior_from_finite_log10_odds(double l) {
  const double magnitude = std::abs(l);
  const double log10_larger = -log_one_plus(std::exp(-magnitude * kLn10)) / kLn10;
  const double log10_smaller = -magnitude + log10_larger;
  return l >= 0.0 ? Posterior{l, log10_larger, log10_smaller} : Posterior{l, log10_smaller, log10_larger};
}

// Prior log10 odds at which the posterior probability reaches `threshold` (0 < threshold < 1);
// NaN-free: returns ±inf when the LR is zero or infinite (never reached / always reached).
double prior_log10_odds_reaching(double threshold, const LikelihoodRatio& lr);

}  // namespace counterpoise::numbers
