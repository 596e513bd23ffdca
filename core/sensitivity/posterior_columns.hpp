#pragma once
// The posterior at one LR for many priors, written into columns the caller provides: for a
// caller that needs only the numbers of each prior (a curve, a long table) and not the rows of
// sweep(), which carry the prior's origin and the band. Nothing is allocated: one pass over the
// priors, one exponential per prior (and one logarithm only where the posterior odds are within
// about 16 decades of 1). Each value equals, bit for bit, the row sweep() gives for the same
// prior and LR, because both use numbers::posterior_from_finite_log10_odds.

#include <span>

#include "core/numbers/likelihood_ratio.hpp"

namespace counterpoise::sensitivity {

// For each prior log10 odds (finite), the posterior log10 probability of Hp and of Hd given the
// findings at `lr`. Throws std::invalid_argument when the three columns differ in length, and
// for a prior that is not finite (as numbers::posterior_from does).
void posterior_columns(std::span<const double> log10_prior_odds, const numbers::LikelihoodRatio& lr,
                       std::span<double> log10_probability, std::span<double> log10_complement);

}  // namespace counterpoise::sensitivity
