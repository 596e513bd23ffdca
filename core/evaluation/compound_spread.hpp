#pragma once
// The interval of the likelihood ratio of Hp against the weighted set of alternatives,
// LR = P(E|Hp) / sum_i w_i P(E|Hd_i) = 1 / sum_i (w_i / LR_i) (numbers/compound_lr.hpp), from the
// same seeded draws as every Monte Carlo interval of a case: each item's model against each
// alternative is drawn from the item's own generator (item_generator), the generator the
// per-alternative evaluation draws it from. Draw k of every alternative thus comes from one state
// of the item's generator, and a model draws what its alternatives share from that state alone:
// P(E|Hp) for assigned probabilities (P(E|Hd_i) from a stream of the alternative's own), the
// allele frequencies for a DNA profile (the relationship differs, the frequencies drawn do not),
// the position within the stated interval for a reported LR (the alternatives' reported LRs are
// taken as moving together, the wider of the choices, since nothing is known of how they
// depend on each other). Draw k of the compound LR is formed from draw k of each alternative's
// LR (for the combination: of each alternative's sum over the included items), and the interval
// is summarised as every Monte Carlo interval is (uncertainty::summarize_draws).

#include <optional>
#include <span>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/numbers/likelihood_ratio.hpp"
#include "core/uncertainty/spread_summary.hpp"

namespace counterpoise::evaluation {

struct CompoundSpreads {
  std::vector<std::optional<uncertainty::SpreadSummary>> items;  // one per item, nullopt when certain
  std::optional<uncertainty::SpreadSummary> combined;            // nullopt when no included item is uncertain
};

// The spreads of the compound LR of each item of `value` (a case with several alternatives,
// each item holding one model per alternative) and of the included items combined, with the
// normalised `weights`. `item_points` and `combined_point` are the point compound LRs, around
// which the conservative bound is taken; a spread is given only where that point is finite and
// no draw is undefined (items contradicting each other within one draw). Rethrows whatever a
// model's draws throw.
CompoundSpreads compound_spreads(const casefile::Case& value, std::span<const double> weights,
                                 std::span<const numbers::LikelihoodRatio> item_points,
                                 const numbers::LikelihoodRatio& combined_point);

}  // namespace counterpoise::evaluation
