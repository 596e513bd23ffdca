#pragma once
// The interval of the likelihood ratio of Hp against the weighted set of alternatives,
// LR = P(E|Hp) / sum_i w_i P(E|Hd_i) = 1 / sum_i (w_i / LR_i) (numbers/compound_lr.hpp), from the
// same seeded draws as every Monte Carlo interval of a case: each item's model against each
// alternative is drawn from the item's own generator (item_generator), the generator the
// per-alternative evaluation draws it from. Draw k of every alternative thus comes from one state
// of the item's generator, and a model that offers it draws in two parts (models::DrawsInParts):
// what the item's alternatives share, drawn once per item by the first alternative's model
// (log10 P(E|Hp) of assigned probabilities), and each alternative's own part (-log10 P(E|Hd_i),
// from a stream of the alternative's own). A model without a shared part draws everything as its
// own part from that same state: a DNA profile's allele frequencies are drawn alike under every
// relationship, and the alternatives' reported LRs move together within their intervals (the
// wider of the choices, since nothing is known of how they depend on each other). Draw k of the
// compound is the shared part plus the compound of the own parts (formed once when no own part
// varies); for the combination, the parts of the included items add draw by draw. The interval
// is summarised as every Monte Carlo interval is, with the needed order statistics selected
// rather than all draws sorted (uncertainty/unordered_draws_summary). Nothing is allocated per
// draw: one set of buffers serves every item.

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
