#pragma once
// Evaluates a case: each item's LR (point, spread, verbal expression), the combined LR of the
// items declared independent (the sum of their log10 LRs), and the sensitivity of the
// posterior to the prior odds. The spread of independent items is combined by convolution on a
// lattice (deterministic); items whose model offers only draws use seeded Monte Carlo, and a
// joint Monte Carlo cross-check can be requested.

#include <optional>
#include <string>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/sensitivity/posterior_over_set.hpp"
#include "core/sensitivity/prior_sweep.hpp"
#include "core/uncertainty/spread_summary.hpp"
#include "core/verbal/verbal_scale.hpp"

namespace counterpoise::evaluation {

// Hp against one of several alternatives (propositions.alternatives).
struct AlternativeEvaluation {
  std::string id;
  numbers::LikelihoodRatio lr = numbers::LikelihoodRatio::neutral();
  std::optional<uncertainty::SpreadSummary> spread;  // when the inputs are uncertain
  verbal::VerbalExpression verbal;
};

// Hp against the weighted set of alternatives: P(E|Hp) / sum_i w_i P(E|Hd_i), the weights the
// fact-finder's (numbers/compound_lr.hpp).
struct CompoundEvaluation {
  numbers::LikelihoodRatio lr = numbers::LikelihoodRatio::neutral();
  std::vector<double> weights;  // normalised, in the order of the alternatives
  verbal::VerbalExpression verbal;
  // From joint draws of the alternatives' LRs (compound_spread.hpp), when any of them is uncertain.
  std::optional<uncertainty::SpreadSummary> spread;
  // Why no interval is given although an alternative's LR has a spread (empty otherwise).
  std::string interval_note;
  // With some alternatives marked unspecified and others not: the compound LR against the
  // specified ones alone (their weights renormalised), to show what the unspecified ones change.
  std::optional<numbers::LikelihoodRatio> without_unspecified;
};

struct ItemEvaluation {
  std::string id;
  models::PointResult point;
  std::optional<uncertainty::SpreadSummary> spread;  // when the inputs are uncertain
  verbal::VerbalExpression verbal;
  bool included = true;
  std::string exclusion_reason;
  // With several alternatives: Hp against each (the first is the same as the fields above), and
  // against the weighted set when weights are given. Empty in a two-proposition case.
  std::vector<AlternativeEvaluation> by_alternative;
  std::optional<CompoundEvaluation> compound;
};

struct CombinedEvaluation {
  numbers::LikelihoodRatio lr = numbers::LikelihoodRatio::neutral();
  std::optional<uncertainty::SpreadSummary> spread;
  verbal::VerbalExpression verbal;
  std::vector<std::string> included_ids;
  std::optional<uncertainty::SpreadSummary> monte_carlo_check;  // when requested
  // As for an item: the combined LR of Hp against each alternative (independent items multiply
  // under each proposition) and against the weighted set.
  std::vector<AlternativeEvaluation> by_alternative;
  std::optional<CompoundEvaluation> compound;
};

struct CaseEvaluation {
  std::vector<ItemEvaluation> items;
  CombinedEvaluation combined;
  sensitivity::PriorSensitivity sensitivity;
  // With several weighted alternatives: the posterior of Hp and of each alternative for each
  // prior (prior odds of Hp against the whole set, shared among the alternatives by weight).
  std::vector<sensitivity::SetIllustrationRow> over_set;
};

struct EvaluationOptions {
  bool monte_carlo_cross_check = false;  // also run joint Monte Carlo over all included items
};

// Evaluates `value`. With several alternatives, the fields of a two-proposition evaluation hold
// Hp against the first alternative, and by_alternative and compound the rest. Throws
// validation::InvalidValue (item "combination") when included items contradict each other (one
// has LR zero, another an infinite LR) against any alternative.
CaseEvaluation evaluate_case(const casefile::Case& value, const EvaluationOptions& options = {});

// The per-item generator seed: the case seed mixed with the item's position, so each item's
// draws are reproducible and independent of the others' (std::seed_seq).
std::mt19937_64 item_generator(std::uint64_t case_seed, std::size_t item_index);

}  // namespace counterpoise::evaluation
