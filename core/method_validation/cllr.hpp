#pragma once
// The log-likelihood-ratio cost (Brümmer & du Preez 2006, "Application-independent evaluation
// of speaker detection", Computer Speech and Language 20:230, eq. for C_llr):
//   Cllr = 1/2 [ (1/Np) sum_{Hp true} log2(1 + 1/LR_i) + (1/Nd) sum_{Hd true} log2(1 + LR_j) ],
// in bits. A method that always says LR = 1 scores exactly 1; a perfect one scores 0. An LR of 0
// for an Hp-true comparison, or of +inf for an Hd-true one, makes Cllr infinite: that is the
// honest value of a method that is sometimes certain and wrong.

#include <span>

#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation {

// log2(1 + 10^x) without overflow or cancellation; +inf for x = +inf, 0 for x = -inf.
double log2_one_plus_pow10(double log10_x);

// The mean cost of Hp-true results, (1/Np) sum log2(1 + 1/LR), and of Hd-true results.
double mean_hp_cost_bits(std::span<const double> hp_log10_lr);
double mean_hd_cost_bits(std::span<const double> hd_log10_lr);

// Cllr of the set, in bits. Throws as require_both_truths.
double cllr(const ValidationSet& set);

}  // namespace counterpoise::method_validation
