#pragma once
// The weight of findings for Hp against a set of exclusive alternatives Hd_1..Hd_k with the
// fact-finder's prior weights w_i among them (Bayes' theorem for exclusive propositions; e.g.
// Evett & Weir 1998, "Interpreting DNA Evidence", ch. on relatives as alternative donors —
// chapter from memory):
//   LR = P(E|Hp) / sum_i w_i P(E|Hd_i) = 1 / sum_i (w_i / LR_i),   weights summing to 1,
// where LR_i = P(E|Hp) / P(E|Hd_i). Only the pairwise LRs are needed, so it serves every model,
// including an LR reported by another method. Computed in log10 space (log-sum-exp shifted by
// the largest term), so LRs of 10^400 or 10^-400 lose nothing.

#include <span>

#include "core/numbers/likelihood_ratio.hpp"

namespace counterpoise::numbers {

// The compound LR of Hp against the weighted alternatives, from the pairwise LRs and the
// normalised weights (same length, each weight >= 0, summing to 1 within rounding). A zero
// pairwise LR with a positive weight gives zero (the findings are impossible under Hp); an
// infinite one contributes nothing; infinite when every weighted LR is infinite. Throws
// std::invalid_argument for lengths that differ, no alternative, a negative or non-finite
// weight or no positive weight.
LikelihoodRatio compound_lr(std::span<const LikelihoodRatio> pairwise, std::span<const double> weights);

// The same in log10 from log10 pairwise LRs (-inf for LR zero, +inf for an infinite LR) and the
// log10 of the normalised weights (-inf for a weight of zero), for one draw of many: no
// allocation, no checks (the caller passes lengths that agree and weights checked as above).
// Returns -inf when a weighted LR is zero, +inf when every weighted LR is infinite, NaN when a
// log10 LR is NaN.
double compound_log10_lr(std::span<const double> log10_pairwise, std::span<const double> log10_weights);

}  // namespace counterpoise::numbers
