#include "core/evaluation/case_evaluation.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "core/evaluation/compound_spread.hpp"
#include "core/evaluation/item_lattice.hpp"
#include "core/evaluation/joint_monte_carlo.hpp"
#include "core/numbers/compound_lr.hpp"
#include "core/numbers/vector_state.hpp"
#include "core/uncertainty/lattice_choice.hpp"
#include "core/uncertainty/unordered_draws_summary.hpp"

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
constexpr double kHistogramBins = 2000.0;  // bins across a drawn item's own central width
constexpr double kMaxHistogramBins = 200000.0;

// What the engine holds for one uncertain item: its lattice form, or a fine histogram of its
// draws. The draws themselves are not kept (100 items of 100 000 draws would hold 80 MB): the
// histogram has a step of a 2 000th of the item's central width — at least twice as fine as
// the combined lattice can be (the combined width is at least the item's, with 1 000 bins) —
// and at most kMaxHistogramBins bins; where it is still too coarse, the draws are made again
// from the item's own seeded generator.
struct ItemSpread {
  std::optional<GridPmf> grid;
  std::optional<GridPmf> histogram;  // of the draws, for an item without a lattice form
  double width = 0.0;                // central width, for choosing the combined lattice
};

SpreadLevels levels_of(const casefile::Case& value) {
  const auto settings = value.uncertainty_or_default();
  return SpreadLevels{settings.credible_level_or_default(), settings.conservative_level_or_default()};
}

// The item's draws into `buffer` (resized to `count`; its storage is reused from item to item).
void draw_item(const models::EvidenceModel& model, std::uint64_t seed, std::size_t index, std::int64_t count,
               std::vector<double>& buffer) {
  buffer.resize(static_cast<std::size_t>(count));
  auto rng = item_generator(seed, index);
  model.draw_log10_lr(rng, buffer);
}

// Central 99.8 % width of draws already sorted (by summarize_draws).
double sorted_draws_width(const std::vector<double>& sorted) {
  const double w = uncertainty::sorted_quantile(sorted, 0.999) - uncertainty::sorted_quantile(sorted, 0.001);
  return std::isfinite(w) ? w : 0.0;
}

// A histogram of sorted draws fine enough to be re-binned onto the combined lattice.
GridPmf fine_histogram(const std::vector<double>& sorted, double width) {
  const auto first = std::find_if(sorted.begin(), sorted.end(), [](double d) { return std::isfinite(d); });
  const auto last = std::find_if(sorted.rbegin(), sorted.rend(), [](double d) { return std::isfinite(d); });
  double range = 0.0, centre = 0.0;
  if (first != sorted.end()) range = *last - *first, centre = *first;
  const double finest = 1e-12 * std::max(1.0, std::abs(centre));
  const double step = std::max({width / kHistogramBins, range / kMaxHistogramBins, finest});
  return GridPmf::from_draws(sorted, step);
}

}  // namespace

std::mt19937_64 item_generator(std::uint64_t case_seed, std::size_t item_index) {
  std::seed_seq sequence{static_cast<std::uint32_t>(case_seed), static_cast<std::uint32_t>(case_seed >> 32),
                         static_cast<std::uint32_t>(item_index), 0x636f756eu};
  return std::mt19937_64(sequence);
}

namespace {

// Hp against the one alternative each item's `model` addresses.
CaseEvaluation evaluate_against_one(const casefile::Case& value, const EvaluationOptions& options) {
  CaseEvaluation result;
  const SpreadLevels levels = levels_of(value);
  const auto settings = value.uncertainty_or_default();
  std::vector<ItemSpread> spreads(value.items.size());
  std::vector<double> buffer;  // one item's draws at a time

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
      spread.grid = resolved_grid(*item.model);
      const double reported_log10 = evaluation.point.lr.log10();
      if (spread.grid) {
        evaluation.spread = uncertainty::summarize(*spread.grid, levels, reported_log10);
        spread.width = uncertainty::central_width(*spread.grid);
      } else {
        draw_item(*item.model, settings.seed_or_default(), i, settings.draws_or_default(), buffer);
        evaluation.spread = uncertainty::summarize_draws(buffer, levels, reported_log10);
        spread.width = sorted_draws_width(buffer);
        spread.histogram = fine_histogram(buffer, spread.width);
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
  std::vector<std::size_t> included;
  for (std::size_t i = 0; i < value.items.size(); ++i)
    if (result.items[i].included) included.push_back(i);
  if (included.size() == 1 && result.items[included[0]].spread && combined.is_finite()) {
    // One item: the combined distribution is the item's own, so the report states one interval
    // for both, not the item's and a re-binned copy that can differ in the last digit.
    result.combined.spread = result.items[included[0]].spread;
  } else if (any_uncertain && combined.is_finite()) {
    const double step = width_squares > 0.0 ? std::sqrt(width_squares) / kCombinedBins : 1e-6;
    GridPmf total = GridPmf::point(0.0, step);
    for (std::size_t i = 0; i < value.items.size(); ++i) {
      if (!result.items[i].included) continue;
      const ItemSpread& spread = spreads[i];
      GridPmf term;
      if (!result.items[i].spread) term = GridPmf::point(result.items[i].point.lr.log10(), step);
      else if (spread.grid && spread.grid->step <= step) term = uncertainty::rebin(*spread.grid, step);
      else if (spread.grid) term = *value.items[i].model->log10_lr_grid(step);
      else if (spread.histogram->step <= step) term = uncertainty::rebin(*spread.histogram, step);
      else {
        draw_item(*value.items[i].model, settings.seed_or_default(), i, settings.draws_or_default(), buffer);
        term = GridPmf::from_draws(buffer, step);
      }
      uncertainty::trim_tails(term, kTermTail);
      total = uncertainty::convolve(total, term);
      uncertainty::trim_tails(total, kTotalTail);
    }
    result.combined.spread = uncertainty::summarize(total, levels, combined.log10());
    bool any_draws = false;
    for (std::size_t i = 0; i < value.items.size(); ++i)
      any_draws = any_draws || (result.items[i].included && spreads[i].histogram);
    if (any_draws) result.combined.spread->method = "lattice convolution (items without a lattice form: Monte Carlo)";
  }

  if (options.monte_carlo_cross_check && any_uncertain && combined.is_finite()) {
    std::vector<double> sum = joint_log10_lr_draws(value, included);
    // The same values as summarize_draws without sorting all the draws.
    result.combined.monte_carlo_check = uncertainty::summarize_unordered_draws(sum, levels, combined.log10());
  }

  const auto thresholds = value.priors ? value.priors->thresholds_or_default() : casefile::PriorSettings{}.thresholds_or_default();
  result.sensitivity = sensitivity::sweep(sensitivity::prior_points(value.priors), combined, result.combined.spread, thresholds);
  return result;
}

// The case with each item's model replaced by its model against alternative `index`.
casefile::Case against_alternative(const casefile::Case& value, std::size_t index) {
  casefile::Case view = value;
  for (auto& item : view.items) {
    item.model = item.alternative_models.at(index);
    item.alternative_models.clear();
  }
  return view;
}

AlternativeEvaluation alternative_of(const casefile::Case& value, const std::string& id, const numbers::LikelihoodRatio& lr,
                                     const std::optional<uncertainty::SpreadSummary>& spread) {
  return AlternativeEvaluation{id, lr, spread, value.verbal_scale.express_against(lr, id)};
}

std::optional<CompoundEvaluation> compound_of(const casefile::Case& value,
                                              const std::vector<AlternativeEvaluation>& by_alternative) {
  const auto weights = value.propositions.normalised_weights();
  if (!weights) return std::nullopt;
  CompoundEvaluation compound;
  std::vector<LikelihoodRatio> pairwise;
  bool any_spread = false;
  for (const auto& alternative : by_alternative) {
    pairwise.push_back(alternative.lr);
    any_spread = any_spread || alternative.spread.has_value();
  }
  compound.lr = numbers::compound_lr(pairwise, *weights);
  compound.weights = *weights;
  compound.verbal = value.verbal_scale.express_against(compound.lr, "the weighted set of alternatives");
  std::vector<LikelihoodRatio> specified;
  std::vector<double> specified_weights;
  for (std::size_t i = 0; i < by_alternative.size(); ++i)
    if (!value.propositions.alternatives[i].is_unspecified())
      specified.push_back(pairwise[i]), specified_weights.push_back((*weights)[i]);
  if (!specified.empty() && specified.size() < pairwise.size()) {
    double total = 0.0;
    for (double w : specified_weights) total += w;
    for (double& w : specified_weights) w /= total;
    compound.without_unspecified = numbers::compound_lr(specified, specified_weights);
  }
  if (any_spread)
    compound.interval_note = compound.lr.is_finite()
                                 ? "no interval for the compound LR: in some joint draws the items contradict each other "
                                   "(LR zero against an alternative in one item, infinite in another)"
                                 : "no interval for the compound LR: its value is not finite";
  return compound;
}

// The compound LRs' intervals from joint draws; where one is given, no note says why not.
void add_compound_spreads(const casefile::Case& value, CaseEvaluation& result) {
  std::vector<LikelihoodRatio> item_points;
  for (const auto& item : result.items) item_points.push_back(item.compound->lr);
  const auto spreads = compound_spreads(value, result.combined.compound->weights, item_points, result.combined.compound->lr);
  const auto attach = [](CompoundEvaluation& compound, const std::optional<uncertainty::SpreadSummary>& spread) {
    compound.spread = spread;
    if (spread) compound.interval_note.clear();
  };
  for (std::size_t i = 0; i < result.items.size(); ++i) attach(*result.items[i].compound, spreads.items[i]);
  attach(*result.combined.compound, spreads.combined);
}

}  // namespace

CaseEvaluation evaluate_case(const casefile::Case& value, const EvaluationOptions& options) {
  // Callers inside a Qt program (the editor's worker threads, the report command) may arrive
  // with dirty upper vector state, which slows every SSE instruction below (vector_state.hpp).
  numbers::clear_upper_vector_state();
  if (!value.propositions.has_alternatives()) return evaluate_against_one(value, options);
  const auto ids = value.propositions.alternative_ids();
  CaseEvaluation result = evaluate_against_one(against_alternative(value, 0), options);
  for (std::size_t index = 0; index < ids.size(); ++index) {
    // The first alternative's evaluation is the result itself; the others' are computed the same way.
    const CaseEvaluation other = index == 0 ? CaseEvaluation{} : evaluate_against_one(against_alternative(value, index), {});
    const CaseEvaluation& against = index == 0 ? result : other;
    for (std::size_t i = 0; i < result.items.size(); ++i) {
      const auto& item = against.items[i];
      result.items[i].by_alternative.push_back(alternative_of(value, ids[index], item.point.lr, item.spread));
    }
    result.combined.by_alternative.push_back(
        alternative_of(value, ids[index], against.combined.lr, against.combined.spread));
  }
  for (auto& item : result.items) item.compound = compound_of(value, item.by_alternative);
  result.combined.compound = compound_of(value, result.combined.by_alternative);
  if (result.combined.compound) add_compound_spreads(value, result);
  if (result.combined.compound) {
    std::vector<LikelihoodRatio> pairwise;
    for (const auto& a : result.combined.by_alternative) pairwise.push_back(a.lr);
    result.over_set = sensitivity::illustrate_over_set(sensitivity::prior_points(value.priors), pairwise,
                                                       result.combined.compound->weights);
  }
  return result;
}

}  // namespace counterpoise::evaluation
