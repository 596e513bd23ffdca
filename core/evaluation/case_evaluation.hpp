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
#include "core/sensitivity/prior_sweep.hpp"
#include "core/uncertainty/spread_summary.hpp"
#include "core/verbal/verbal_scale.hpp"

namespace counterpoise::evaluation {

struct ItemEvaluation {
  std::string id;
  models::PointResult point;
  std::optional<uncertainty::SpreadSummary> spread;  // when the inputs are uncertain
  verbal::VerbalExpression verbal;
  bool included = true;
  std::string exclusion_reason;
};

struct CombinedEvaluation {
  numbers::LikelihoodRatio lr = numbers::LikelihoodRatio::neutral();
  std::optional<uncertainty::SpreadSummary> spread;
  verbal::VerbalExpression verbal;
  std::vector<std::string> included_ids;
  std::optional<uncertainty::SpreadSummary> monte_carlo_check;  // when requested
};

struct CaseEvaluation {
  std::vector<ItemEvaluation> items;
  CombinedEvaluation combined;
  sensitivity::PriorSensitivity sensitivity;
};

struct EvaluationOptions {
  bool monte_carlo_cross_check = false;  // also run joint Monte Carlo over all included items
};

// Evaluates `value`. Throws validation::InvalidValue (item "combination") when included items
// contradict each other (one has LR zero, another an infinite LR).
CaseEvaluation evaluate_case(const casefile::Case& value, const EvaluationOptions& options = {});

// The per-item generator seed: the case seed mixed with the item's position, so each item's
// draws are reproducible and independent of the others' (std::seed_seq).
std::mt19937_64 item_generator(std::uint64_t case_seed, std::size_t item_index);

}  // namespace counterpoise::evaluation
