#include "core/numbers/compound_lr.hpp"

#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::numbers {

LikelihoodRatio compound_lr(std::span<const LikelihoodRatio> pairwise, std::span<const double> weights) {
  if (pairwise.size() != weights.size() || pairwise.empty())
    throw std::invalid_argument("compound_lr: one weight per alternative, at least one alternative");
  std::vector<double> log10_terms;  // log10 (w_i / LR_i)
  log10_terms.reserve(pairwise.size());
  bool any_weight = false;
  for (std::size_t i = 0; i < pairwise.size(); ++i) {
    if (!(weights[i] >= 0.0) || !std::isfinite(weights[i]))
      throw std::invalid_argument("compound_lr: weights are finite and >= 0");
    if (weights[i] == 0.0) continue;  // an alternative the fact-finder gives no weight
    any_weight = true;
    if (pairwise[i].is_zero()) return LikelihoodRatio::zero();
    if (pairwise[i].is_infinite()) continue;
    log10_terms.push_back(std::log10(weights[i]) - pairwise[i].log10());
  }
  if (!any_weight) throw std::invalid_argument("compound_lr: at least one weight must be positive");
  const double log10_sum_of_terms = log10_sum(log10_terms);
  if (std::isinf(log10_sum_of_terms)) return LikelihoodRatio::infinite();
  return LikelihoodRatio::from_log10(-log10_sum_of_terms);
}

}  // namespace counterpoise::numbers
