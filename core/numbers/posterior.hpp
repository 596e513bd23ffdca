#pragma once
// Odds form of Bayes' theorem in log10 space: posterior odds = LR × prior odds
// (e.g. Aitken, Taroni & Bozza 2021, Statistics and the Evaluation of Evidence for Forensic
// Scientists, 3rd ed., eq. 2.xx, the odds form of Bayes' theorem — from memory for the number).
// The posterior probability and its complement are both computed from the log odds directly,
// so 1 - 1e-15 is reported as a complement of 1e-15, never as 1.

#include "core/numbers/likelihood_ratio.hpp"

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

// Prior log10 odds at which the posterior probability reaches `threshold` (0 < threshold < 1);
// NaN-free: returns ±inf when the LR is zero or infinite (never reached / always reached).
double prior_log10_odds_reaching(double threshold, const LikelihoodRatio& lr);

}  // namespace counterpoise::numbers
