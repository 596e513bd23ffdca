#include "core/numbers/compound_lr.hpp"

#include <cmath>
#include <limits>
#include <stdexcept>
#include <vector>

namespace counterpoise::numbers {

double compound_log10_lr(std::span<const double> log10_pairwise, std::span<const double> log10_weights) {
  // -log10 sum_i 10^(log10 w_i - log10 LR_i), the sum shifted by its largest term (log-sum-exp).
  constexpr double kInfinity = std::numeric_limits<double>::infinity();
  constexpr double kLn10 = 2.302585092994045684;
  double largest = -kInfinity;
  for (std::size_t i = 0; i < log10_pairwise.size(); ++i) {
    if (log10_weights[i] == -kInfinity) continue;  // an alternative the fact-finder gives no weight
    if (std::isnan(log10_pairwise[i])) return log10_pairwise[i];
    if (log10_pairwise[i] == -kInfinity) return -kInfinity;  // the findings are impossible under Hp
    largest = std::max(largest, log10_weights[i] - log10_pairwise[i]);
  }
  if (largest == -kInfinity) return kInfinity;  // every weighted LR is infinite
  double scaled_sum = 0.0;
  for (std::size_t i = 0; i < log10_pairwise.size(); ++i) {
    if (log10_weights[i] == -kInfinity) continue;
    // The largest term is exactly 1: no exp for it (this runs once per joint draw).
    const double shifted = log10_weights[i] - log10_pairwise[i] - largest;
    scaled_sum += shifted == 0.0 ? 1.0 : std::exp(shifted * kLn10);
  }
  return -(largest + std::log10(scaled_sum));
}

LikelihoodRatio compound_lr(std::span<const LikelihoodRatio> pairwise, std::span<const double> weights) {
  if (pairwise.size() != weights.size() || pairwise.empty())
    throw std::invalid_argument("compound_lr: one weight per alternative, at least one alternative");
  bool any_weight = false;
  std::vector<double> log10_pairwise, log10_weights;
  log10_pairwise.reserve(pairwise.size());
  log10_weights.reserve(pairwise.size());
  for (std::size_t i = 0; i < pairwise.size(); ++i) {
    if (!(weights[i] >= 0.0) || !std::isfinite(weights[i]))
      throw std::invalid_argument("compound_lr: weights are finite and >= 0");
    any_weight = any_weight || weights[i] > 0.0;
    log10_weights.push_back(std::log10(weights[i]));  // -inf for a weight of zero
    log10_pairwise.push_back(pairwise[i].is_zero() ? -std::numeric_limits<double>::infinity()
                             : pairwise[i].is_infinite() ? std::numeric_limits<double>::infinity()
                                                         : pairwise[i].log10());
  }
  if (!any_weight) throw std::invalid_argument("compound_lr: at least one weight must be positive");
  const double log10_compound = compound_log10_lr(log10_pairwise, log10_weights);
  if (log10_compound == -std::numeric_limits<double>::infinity()) return LikelihoodRatio::zero();
  if (log10_compound == std::numeric_limits<double>::infinity()) return LikelihoodRatio::infinite();
  return LikelihoodRatio::from_log10(log10_compound);
}

}  // namespace counterpoise::numbers
