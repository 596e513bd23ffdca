#include "core/evaluation/case_evaluation.hpp"

#include <cmath>
#include <stdexcept>

#include "core/uncertainty/lattice_choice.hpp"

namespace counterpoise::evaluation {

using numbers::LikelihoodRatio;
using uncertainty::GridPmf;
using uncertainty::SpreadLevels;

namespace {

// Tail mass folded into the end bins: of each item's term before it is convolved, and of the
// running total after each convolution. Moving at most 2e-10 per term (8e-9 for 40 items) into
// the end bins cannot move the 5 % or 95 % quantiles, and it keeps the lattice short.
constexpr double kTermTail = 1e-10;
constexpr double kTotalTail = 1e-13;
constexpr double kCombinedBins = 1000.0;  // bins across the combined central width

// What the engine holds for one uncertain item: its lattice form, or its draws.
struct ItemSpread {
  std::optional<GridPmf> grid;
  std::vector<double> draws;
  double width = 0.0;  // central width, for choosing the combined lattice
};

SpreadLevels levels_of(const casefile::Case& value) {
  const auto settings = value.uncertainty_or_default();
  return SpreadLevels{settings.credible_level_or_default(), settings.conservative_level_or_default()};
}

std::vector<double> draw_item(const models::EvidenceModel& model, std::uint64_t seed, std::size_t index,
                              std::int64_t count) {
  std::vector<double> draws(static_cast<std::size_t>(count));
  auto rng = item_generator(seed, index);
  model.draw_log10_lr(rng, draws);
  return draws;
}

// Central 99.8 % width of draws already sorted (by summarize_draws).
double sorted_draws_width(const std::vector<double>& sorted) {
  const double w = uncertainty::sorted_quantile(sorted, 0.999) - uncertainty::sorted_quantile(sorted, 0.001);
  return std::isfinite(w) ? w : 0.0;
}

}  // namespace

std::mt19937_64 item_generator(std::uint64_t case_seed, std::size_t item_index) {
  std::seed_seq sequence{static_cast<std::uint32_t>(case_seed), static_cast<std::uint32_t>(case_seed >> 32),
                         static_cast<std::uint32_t>(item_index), 0x636f756eu};
  return std::mt19937_64(sequence);
}

CaseEvaluation evaluate_case(const casefile::Case& value, const EvaluationOptions& options) {
  CaseEvaluation result;
  const SpreadLevels levels = levels_of(value);
  const auto settings = value.uncertainty_or_default();
  std::vector<ItemSpread> spreads(value.items.size());

  LikelihoodRatio combined = LikelihoodRatio::neutral();
  std::vector<std::string> zero_ids, infinite_ids;
  for (std::size_t i = 0; i < value.items.size(); ++i) {
    const auto& item = value.items[i];
    ItemEvaluation evaluation;
    evaluation.id = item.id;
    evaluation.point = item.model->evaluate();
    evaluation.verbal = value.verbal_scale.express(evaluation.point.lr);
    evaluation.included = item.included();
    if (!evaluation.included) evaluation.exclusion_reason = item.combination->exclusion_reason.value_or("");
    if (item.model->is_uncertain()) {
      ItemSpread& spread = spreads[i];
      spread.grid = uncertainty::resolved_grid(*item.model);
      const bool favours_hp = evaluation.point.lr.log10() >= 0.0;
      if (spread.grid) {
        evaluation.spread = uncertainty::summarize(*spread.grid, levels, favours_hp);
        spread.width = uncertainty::central_width(*spread.grid);
      } else {
        spread.draws = draw_item(*item.model, settings.seed_or_default(), i, settings.draws_or_default());
        auto sorted = spread.draws;  // the unsorted draws stay paired with the other items' for the cross-check
        evaluation.spread = uncertainty::summarize_draws(sorted, levels, favours_hp);
        spread.width = sorted_draws_width(sorted);
      }
    }
    if (evaluation.included) {
      result.combined.included_ids.push_back(item.id);
      if (evaluation.point.lr.is_zero()) zero_ids.push_back(item.id);
      if (evaluation.point.lr.is_infinite()) infinite_ids.push_back(item.id);
      if (zero_ids.empty() || infinite_ids.empty()) combined = combined * evaluation.point.lr;
    }
    result.items.push_back(std::move(evaluation));
  }
  if (!zero_ids.empty() && !infinite_ids.empty())
    throw validation::InvalidValue(validation::Location{"combination", ""},
                                   "item " + zero_ids.front() + " has LR zero (findings impossible if Hp is true) and item " +
                                       infinite_ids.front() +
                                       " an infinite LR (findings impossible if Hd is true): the items contradict each "
                                       "other and cannot be combined");
  result.combined.lr = combined;
  result.combined.verbal = value.verbal_scale.express(combined);

  // The combined spread: convolve the included items' distributions on one lattice.
  double width_squares = 0.0;
  bool any_uncertain = false;
  for (std::size_t i = 0; i < value.items.size(); ++i)
    if (result.items[i].included && result.items[i].spread)
      any_uncertain = true, width_squares += spreads[i].width * spreads[i].width;
  if (any_uncertain && combined.is_finite()) {
    const double step = width_squares > 0.0 ? std::sqrt(width_squares) / kCombinedBins : 1e-6;
    GridPmf total = GridPmf::point(0.0, step);
    for (std::size_t i = 0; i < value.items.size(); ++i) {
      if (!result.items[i].included) continue;
      const ItemSpread& spread = spreads[i];
      GridPmf term;
      if (!result.items[i].spread) term = GridPmf::point(result.items[i].point.lr.log10(), step);
      else if (spread.grid && spread.grid->step <= step) term = uncertainty::rebin(*spread.grid, step);
      else if (spread.grid) term = *value.items[i].model->log10_lr_grid(step);
      else term = GridPmf::from_draws(spread.draws, step);
      uncertainty::trim_tails(term, kTermTail);
      total = uncertainty::convolve(total, term);
      uncertainty::trim_tails(total, kTotalTail);
    }
    result.combined.spread = uncertainty::summarize(total, levels, combined.log10() >= 0.0);
    bool any_draws = false;
    for (std::size_t i = 0; i < value.items.size(); ++i)
      any_draws = any_draws || (result.items[i].included && !spreads[i].draws.empty());
    if (any_draws) result.combined.spread->method = "lattice convolution (items without a lattice form: Monte Carlo)";
  }

  if (options.monte_carlo_cross_check && any_uncertain && combined.is_finite()) {
    std::vector<double> sum(static_cast<std::size_t>(settings.draws_or_default()), 0.0);
    for (std::size_t i = 0; i < value.items.size(); ++i) {
      if (!result.items[i].included) continue;
      const auto draws = spreads[i].draws.empty()
                             ? draw_item(*value.items[i].model, settings.seed_or_default(), i, settings.draws_or_default())
                             : spreads[i].draws;
      for (std::size_t k = 0; k < sum.size(); ++k) sum[k] += draws[k];
    }
    result.combined.monte_carlo_check = uncertainty::summarize_draws(sum, levels, combined.log10() >= 0.0);
  }

  const auto thresholds = value.priors ? value.priors->thresholds_or_default() : casefile::PriorSettings{}.thresholds_or_default();
  result.sensitivity = sensitivity::sweep(sensitivity::prior_points(value.priors), combined, result.combined.spread, thresholds);
  return result;
}

}  // namespace counterpoise::evaluation
