#include "core/evaluation/compound_spread.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/evaluation/case_evaluation.hpp"
#include "core/models/draws_in_parts.hpp"
#include "core/numbers/compound_lr.hpp"
#include "core/uncertainty/unordered_draws_summary.hpp"

namespace counterpoise::evaluation {

namespace {

// Draws of log10 LR against every alternative in the parts of models::DrawsInParts:
// draw k against alternative i is shared[k] + own[i][k]. For one item, or summed over items (the
// items multiply under each proposition: their parts add).
struct PartDraws {
  std::vector<double> shared;
  std::vector<std::vector<double>> own;

  PartDraws(std::size_t alternatives, std::size_t draws)
      : shared(draws, 0.0), own(alternatives, std::vector<double>(draws, 0.0)) {}

  void add(const PartDraws& item) {
    for (std::size_t k = 0; k < shared.size(); ++k) shared[k] += item.shared[k];
    for (std::size_t i = 0; i < own.size(); ++i)
      for (std::size_t k = 0; k < shared.size(); ++k) own[i][k] += item.own[i][k];
  }
};

// True when every draw of `values` is the first (a part with no uncertainty).
bool constant(const std::vector<double>& values) {
  return std::all_of(values.begin(), values.end(), [first = values.front()](double v) { return v == first; });
}

// Draw k of the compound LR: LR_i = 10^shared / 10^-own_i, so 1 / sum_i w_i / LR_i is 10^shared
// times the compound of the own parts taken as LRs. Where no own part varies, the compound of
// the own parts is formed once. False when a draw is undefined (NaN).
bool compound_draws(const PartDraws& parts, std::span<const double> log10_weights, std::vector<double>& out) {
  const std::size_t alternatives = parts.own.size();
  std::vector<double> one(alternatives);
  const bool own_constant = std::all_of(parts.own.begin(), parts.own.end(), constant);
  if (own_constant) {
    for (std::size_t i = 0; i < alternatives; ++i) one[i] = parts.own[i].front();
    const double own = numbers::compound_log10_lr(one, log10_weights);
    for (std::size_t k = 0; k < out.size(); ++k) out[k] = parts.shared[k] + own;
  } else {
    for (std::size_t k = 0; k < out.size(); ++k) {
      for (std::size_t i = 0; i < alternatives; ++i) one[i] = parts.own[i][k];
      out[k] = parts.shared[k] + numbers::compound_log10_lr(one, log10_weights);
    }
  }
  return std::none_of(out.begin(), out.end(), [](double v) { return std::isnan(v); });
}

std::optional<uncertainty::SpreadSummary> summary_of(const PartDraws& parts, std::span<const double> log10_weights,
                                                     const numbers::LikelihoodRatio& point,
                                                     const uncertainty::SpreadLevels& levels, std::vector<double>& buffer) {
  if (!point.is_finite() || !compound_draws(parts, log10_weights, buffer)) return std::nullopt;
  return uncertainty::summarize_unordered_draws(buffer, levels, point.log10());
}

// Draws of one uncertain item against every alternative into `parts`: each alternative's model
// from the same state of the item's generator, so draw k of every alternative shares what the
// models share; the shared part is drawn once, by the first alternative's model.
void draw_item(const casefile::Item& item, std::uint64_t seed, std::size_t index, PartDraws& parts) {
  const auto& models = item.alternative_models;
  for (std::size_t i = 0; i < models.size(); ++i) {
    auto rng = item_generator(seed, index);
    if (const auto* in_parts = dynamic_cast<const models::DrawsInParts*>(models[i].get())) {
      in_parts->draw_log10_lr_parts(rng, i == 0 ? std::span<double>(parts.shared) : std::span<double>(), parts.own[i]);
    } else {
      // Drawn whole as its own part: the alternatives share nothing drawn apart.
      if (i == 0) std::fill(parts.shared.begin(), parts.shared.end(), 0.0);
      models[i]->draw_log10_lr(rng, parts.own[i]);
    }
  }
}

// A certain item's log10 LR against each alternative, added to the own parts of `sums`.
void add_point(const casefile::Item& item, PartDraws& sums) {
  constexpr double kInfinity = std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i < sums.own.size(); ++i) {
    const auto lr = item.alternative_models[i]->evaluate().lr;
    const double log10_lr = lr.is_zero() ? -kInfinity : lr.is_infinite() ? kInfinity : lr.log10();
    for (double& s : sums.own[i]) s += log10_lr;
  }
}

}  // namespace

CompoundSpreads compound_spreads(const casefile::Case& value, std::span<const double> weights,
                                 std::span<const numbers::LikelihoodRatio> item_points,
                                 const numbers::LikelihoodRatio& combined_point) {
  const auto settings = value.uncertainty_or_default();
  const uncertainty::SpreadLevels levels{settings.credible_level_or_default(), settings.conservative_level_or_default()};
  const auto draws = static_cast<std::size_t>(settings.draws_or_default());
  std::vector<double> log10_weights;
  for (double w : weights) log10_weights.push_back(std::log10(w));  // -inf for a weight of zero
  CompoundSpreads result;
  result.items.resize(value.items.size());

  // Every buffer is made once and reused from item to item.
  PartDraws item_parts(weights.size(), draws), sums(weights.size(), draws);
  std::vector<double> buffer(draws);
  bool any_uncertain_included = false;
  for (std::size_t index = 0; index < value.items.size(); ++index) {
    const auto& item = value.items[index];
    const auto& models = item.alternative_models;
    const bool uncertain = std::any_of(models.begin(), models.end(), [](const auto& m) { return m->is_uncertain(); });
    if (!uncertain) {
      if (item.included()) add_point(item, sums);
      continue;
    }
    draw_item(item, settings.seed_or_default(), index, item_parts);
    result.items[index] = summary_of(item_parts, log10_weights, item_points[index], levels, buffer);
    if (!item.included()) continue;
    any_uncertain_included = true;
    sums.add(item_parts);
  }
  if (any_uncertain_included) result.combined = summary_of(sums, log10_weights, combined_point, levels, buffer);
  return result;
}

}  // namespace counterpoise::evaluation
