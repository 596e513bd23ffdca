#pragma once
// The posterior illustration over a set of exclusive propositions: Hp and its alternatives
// Hd_1..Hd_k. Bayes' theorem for exclusive and exhaustive propositions gives
//   P(H_j | E) = pi_j P(E|H_j) / sum_m pi_m P(E|H_m)
// for prior weights pi (e.g. Aitken, Taroni & Bozza 2021, "Statistics and the Evaluation of
// Evidence for Forensic Scientists", 3rd ed., ch. 2 — chapter from memory). Dividing by P(E|Hp),
// only the pairwise LRs LR_i = P(E|Hp)/P(E|Hd_i) are needed: Hp's term is pi_p, Hd_i's
// pi_i / LR_i. Each posterior is formed from its log10 odds against all the other propositions
// (log-sum-exp of the others' terms), so both it and its complement are exact at the extremes.
// The priors are the fact-finder's; these figures are illustrations, never the scientist's.

#include <optional>
#include <span>
#include <string>
#include <vector>

#include "core/numbers/likelihood_ratio.hpp"
#include "core/numbers/posterior.hpp"
#include "core/sensitivity/prior_sweep.hpp"

namespace counterpoise::sensitivity {

// The posteriors of Hp (first) and each alternative, for log10 prior weights (Hp first, then one
// per alternative; need not be normalised; -inf for a weight of zero) and the pairwise LRs of Hp
// against each alternative. Each Posterior's "probability" is that of the proposition itself and
// its "complement" that of all the others. nullopt when some alternative with a positive weight
// has LR zero (the findings exclude Hp; how the alternatives share the posterior then needs
// their own probabilities of the findings, which the LRs do not carry), and when every weighted
// alternative has an infinite LR while Hp has no weight. Throws
// std::invalid_argument for sizes that do not agree, a NaN or +inf weight, or all weights zero.
std::optional<std::vector<numbers::Posterior>> posteriors_over_set(std::span<const double> log10_prior_weights,
                                                                   std::span<const numbers::LikelihoodRatio> pairwise);

struct SetIllustrationRow {
  PriorPoint prior;                           // prior odds of Hp against the whole set of alternatives
  std::vector<numbers::Posterior> posteriors; // Hp first, then each alternative
};

// For each prior point (prior odds O of Hp against the set), the alternatives sharing the rest in
// proportion to their normalised `weights`: log10 prior weights log10 O for Hp and log10 w_i for
// Hd_i. Rows whose posteriors cannot be formed (see posteriors_over_set) are left out.
std::vector<SetIllustrationRow> illustrate_over_set(const std::vector<PriorPoint>& points,
                                                    std::span<const numbers::LikelihoodRatio> pairwise,
                                                    std::span<const double> weights);

struct WeightStep {
  double fraction;             // of the alternative's stated weight, 0 to 1
  numbers::Posterior hp;       // the posterior of Hp at that weight
};

// How the posterior of Hp moves as the weight of alternative `index` goes from 0 to its stated
// value (`steps` + 1 evenly spaced fractions), with Hp's prior odds against the set and the
// other alternatives' weights held as stated. Throws std::invalid_argument for an index out of
// range or steps < 1; rows are left out as in posteriors_over_set.
std::vector<WeightStep> hp_as_weight_grows(double log10_prior_odds, std::span<const numbers::LikelihoodRatio> pairwise,
                                           std::span<const double> weights, std::size_t index, int steps);

}  // namespace counterpoise::sensitivity
