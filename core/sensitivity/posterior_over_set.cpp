#include "core/sensitivity/posterior_over_set.hpp"

#include <cmath>
#include <limits>
#include <stdexcept>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::sensitivity {

using numbers::LikelihoodRatio;

std::optional<std::vector<numbers::Posterior>> posteriors_over_set(std::span<const double> log10_prior_weights,
                                                                   std::span<const LikelihoodRatio> pairwise) {
  if (log10_prior_weights.size() != pairwise.size() + 1 || pairwise.empty())
    throw std::invalid_argument("posteriors_over_set: one prior weight for Hp and one per alternative");
  // Each proposition's term relative to P(E|Hp): log10 pi_p for Hp, log10 pi_i - log10 LR_i.
  std::vector<double> terms(log10_prior_weights.size());
  bool any_weight = false;
  for (std::size_t j = 0; j < terms.size(); ++j) {
    const double w = log10_prior_weights[j];
    if (std::isnan(w) || w == std::numeric_limits<double>::infinity())
      throw std::invalid_argument("posteriors_over_set: prior weights are finite or -inf (zero)");
    any_weight = any_weight || std::isfinite(w);
    if (j == 0 || std::isinf(w)) {
      terms[j] = w;
      continue;
    }
    const LikelihoodRatio& lr = pairwise[j - 1];
    if (lr.is_zero()) return std::nullopt;
    terms[j] = lr.is_infinite() ? -std::numeric_limits<double>::infinity() : w - lr.log10();
  }
  if (!any_weight) throw std::invalid_argument("posteriors_over_set: at least one prior weight must be positive");
  // Every weighted proposition makes the findings impossible: no posterior exists.
  if (std::isinf(numbers::log10_sum(terms))) return std::nullopt;
  std::vector<numbers::Posterior> out;
  out.reserve(terms.size());
  std::vector<double> others(terms.size() - 1);
  for (std::size_t j = 0; j < terms.size(); ++j) {
    for (std::size_t m = 0, k = 0; m < terms.size(); ++m)
      if (m != j) others[k++] = terms[m];
    out.push_back(numbers::posterior_from_log10_odds(terms[j] - numbers::log10_sum(others)));
  }
  return out;
}

std::vector<SetIllustrationRow> illustrate_over_set(const std::vector<PriorPoint>& points,
                                                    std::span<const LikelihoodRatio> pairwise,
                                                    std::span<const double> weights) {
  std::vector<double> log10_weights(pairwise.size() + 1);
  for (std::size_t i = 0; i < weights.size(); ++i) log10_weights[i + 1] = std::log10(weights[i]);
  std::vector<SetIllustrationRow> rows;
  for (const auto& point : points) {
    log10_weights[0] = point.log10_prior_odds;
    if (auto posteriors = posteriors_over_set(log10_weights, pairwise)) rows.push_back({point, std::move(*posteriors)});
  }
  return rows;
}

std::vector<WeightStep> hp_as_weight_grows(double log10_prior_odds, std::span<const LikelihoodRatio> pairwise,
                                           std::span<const double> weights, std::size_t index, int steps) {
  if (index >= weights.size() || steps < 1) throw std::invalid_argument("hp_as_weight_grows: index or steps out of range");
  std::vector<double> log10_weights(pairwise.size() + 1);
  log10_weights[0] = log10_prior_odds;
  for (std::size_t i = 0; i < weights.size(); ++i) log10_weights[i + 1] = std::log10(weights[i]);
  std::vector<WeightStep> out;
  for (int s = 0; s <= steps; ++s) {
    const double fraction = static_cast<double>(s) / steps;
    log10_weights[index + 1] = std::log10(weights[index] * fraction);  // -inf at 0: the alternative left out
    if (auto posteriors = posteriors_over_set(log10_weights, pairwise)) out.push_back({fraction, posteriors->front()});
  }
  return out;
}

}  // namespace counterpoise::sensitivity
