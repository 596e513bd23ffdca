#pragma once
// The pool-adjacent-violators algorithm (PAV) on validation results: the monotone (isotonic)
// mapping from score to the probability that Hp is true that fits the ground truth best, and the
// likelihood ratios it implies. Cllr of those optimally calibrated LRs is Cllr_min, the
// discrimination part of Cllr; Cllr - Cllr_min is the calibration loss (Brümmer & du Preez 2006,
// Computer Speech and Language 20:230, section on "minimum Cllr"; the algorithm: Ayer, Brunk,
// Ewing, Reid & Silverman 1955, Annals of Mathematical Statistics 26:641).
// Equal scores are pooled before PAV (a score cannot be mapped to two values); blocks with equal
// means are merged, so each block is a vertex of the ROC convex hull.

#include <span>
#include <vector>

#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation {

// Results pooled by score: every result with this score, weighted (a weight of 1 per result; the
// bootstrap uses resampling counts).
struct ScoreAtom {
  double score = 0.0;
  double hp_weight = 0.0;
  double hd_weight = 0.0;
};

// One block of the PAV fit: scores from score_low to score_high map to one LR.
struct PavBlock {
  double score_low = 0.0;
  double score_high = 0.0;
  double hp_weight = 0.0;
  double hd_weight = 0.0;
  double log10_lr = 0.0;  // posterior odds of the block over the prior odds of the whole set
};

struct PavFit {
  std::vector<PavBlock> blocks;  // in increasing score
  double hp_total = 0.0;
  double hd_total = 0.0;
};

// The results as atoms sorted by score (log10 LR), equal scores pooled. Throws as
// require_both_truths.
std::vector<ScoreAtom> pooled_atoms(const ValidationSet& set);

// PAV over atoms sorted by increasing, distinct score. Throws std::invalid_argument when the
// atoms are not sorted or one truth has zero total weight.
PavFit fit_pav(std::span<const ScoreAtom> atoms);

// Cllr, in bits, of LRs given as weighted blocks (each block's log10_lr applies to its weights).
double weighted_cllr(const PavFit& fit);

// Cllr_min of the set: Cllr after the PAV transform. Throws as require_both_truths.
double cllr_min(const ValidationSet& set);

// The PAV block a score falls in: the last block whose score_low <= score, or the first block
// for a score below all (a step function, so it never extrapolates beyond the fitted values).
const PavBlock& block_for_score(const PavFit& fit, double score);

}  // namespace counterpoise::method_validation
