#include "core/evaluation/compound_spread.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/evaluation/case_evaluation.hpp"
#include "core/numbers/compound_lr.hpp"

namespace counterpoise::evaluation {

namespace {

// Draw k of the compound LR from draw k of each alternative's log10 LR (`by_alternative[i][k]`).
// False when a draw is undefined (NaN).
bool compound_draws(const std::vector<std::vector<double>>& by_alternative, std::span<const double> weights,
                    std::vector<double>& out) {
  std::vector<double> one(by_alternative.size()), log10_weights;
  for (double w : weights) log10_weights.push_back(std::log10(w));  // -inf for a weight of zero
  for (std::size_t k = 0; k < out.size(); ++k) {
    for (std::size_t i = 0; i < one.size(); ++i) one[i] = by_alternative[i][k];
    out[k] = numbers::compound_log10_lr(one, log10_weights);
    if (std::isnan(out[k])) return false;
  }
  return true;
}

std::optional<uncertainty::SpreadSummary> summary_of(const std::vector<std::vector<double>>& by_alternative,
                                                     std::span<const double> weights, const numbers::LikelihoodRatio& point,
                                                     const uncertainty::SpreadLevels& levels, std::vector<double>& buffer) {
  if (!point.is_finite() || !compound_draws(by_alternative, weights, buffer)) return std::nullopt;
  return uncertainty::summarize_draws(buffer, levels, point.log10());
}

}  // namespace

CompoundSpreads compound_spreads(const casefile::Case& value, std::span<const double> weights,
                                 std::span<const numbers::LikelihoodRatio> item_points,
                                 const numbers::LikelihoodRatio& combined_point) {
  const auto settings = value.uncertainty_or_default();
  const uncertainty::SpreadLevels levels{settings.credible_level_or_default(), settings.conservative_level_or_default()};
  const auto draws = static_cast<std::size_t>(settings.draws_or_default());
  const std::size_t alternatives = weights.size();
  CompoundSpreads result;
  result.items.resize(value.items.size());

  std::vector<std::vector<double>> item_draws(alternatives, std::vector<double>(draws));
  std::vector<std::vector<double>> sums(alternatives, std::vector<double>(draws, 0.0));
  std::vector<double> buffer(draws);
  bool any_uncertain_included = false;
  for (std::size_t index = 0; index < value.items.size(); ++index) {
    const auto& item = value.items[index];
    const auto& models = item.alternative_models;
    const bool uncertain = std::any_of(models.begin(), models.end(), [](const auto& m) { return m->is_uncertain(); });
    if (!uncertain) {
      if (item.included())
        for (std::size_t i = 0; i < alternatives; ++i) {
          const auto lr = models[i]->evaluate().lr;
          constexpr double kInfinity = std::numeric_limits<double>::infinity();
          const double log10_lr = lr.is_zero() ? -kInfinity : lr.is_infinite() ? kInfinity : lr.log10();
          for (double& s : sums[i]) s += log10_lr;
        }
      continue;
    }
    for (std::size_t i = 0; i < alternatives; ++i) {
      auto rng = item_generator(settings.seed_or_default(), index);
      models[i]->draw_log10_lr(rng, item_draws[i]);
    }
    result.items[index] = summary_of(item_draws, weights, item_points[index], levels, buffer);
    if (!item.included()) continue;
    any_uncertain_included = true;
    for (std::size_t i = 0; i < alternatives; ++i)
      for (std::size_t k = 0; k < draws; ++k) sums[i][k] += item_draws[i][k];
  }
  if (any_uncertain_included) result.combined = summary_of(sums, weights, combined_point, levels, buffer);
  return result;
}

}  // namespace counterpoise::evaluation
