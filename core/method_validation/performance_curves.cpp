#include "core/method_validation/performance_curves.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "core/method_validation/cllr.hpp"
#include "core/numbers/log10_math.hpp"

namespace counterpoise::method_validation {

SortedLog10Lrs::SortedLog10Lrs(std::vector<double> values) : values_(std::move(values)) {
  std::sort(values_.begin(), values_.end());
}

double SortedLog10Lrs::proportion_at_least(double x) const {
  if (values_.empty()) return 0.0;
  const auto first = std::lower_bound(values_.begin(), values_.end(), x);
  return static_cast<double>(values_.end() - first) / static_cast<double>(values_.size());
}

TippettCurves tippett_curves(const ValidationSet& set, std::span<const double> log10_lr_points) {
  const SortedLog10Lrs hp(set.hp_log10_lr), hd(set.hd_log10_lr);
  TippettCurves curves;
  for (double x : log10_lr_points) {
    curves.hp.push_back({x, hp.proportion_at_least(x)});
    curves.hd.push_back({x, hd.proportion_at_least(x)});
  }
  return curves;
}

std::vector<double> evenly_spaced(double from, double to, int count) {
  if (count < 2) throw std::invalid_argument("evenly_spaced: count must be at least 2");
  std::vector<double> points(static_cast<std::size_t>(count));
  for (int i = 0; i < count; ++i) points[static_cast<std::size_t>(i)] = from + (to - from) * i / (count - 1);
  return points;
}

namespace {

// P(Hp) and P(Hd) from the prior log10 odds, each computed directly (no 1 - p).
std::pair<double, double> prior_probabilities(double prior_log10_odds) {
  return {std::pow(10.0, numbers::log10_probability_from_log10_odds(prior_log10_odds)),
          std::pow(10.0, numbers::log10_probability_from_log10_odds(-prior_log10_odds))};
}

}  // namespace

double empirical_cross_entropy(const ValidationSet& set, double o) {
  require_both_truths(set);
  const auto [p_hp, p_hd] = prior_probabilities(o);
  double hp_bits = 0.0, hd_bits = 0.0;
  for (double x : set.hp_log10_lr) hp_bits += log2_one_plus_pow10(-(x + o));
  for (double x : set.hd_log10_lr) hd_bits += log2_one_plus_pow10(x + o);
  return p_hp * hp_bits / static_cast<double>(set.hp_log10_lr.size()) +
         p_hd * hd_bits / static_cast<double>(set.hd_log10_lr.size());
}

double empirical_cross_entropy(const PavFit& fit, double o) {
  const auto [p_hp, p_hd] = prior_probabilities(o);
  double hp_bits = 0.0, hd_bits = 0.0;
  for (const PavBlock& b : fit.blocks) {
    if (b.hp_weight > 0.0) hp_bits += b.hp_weight * log2_one_plus_pow10(-(b.log10_lr + o));
    if (b.hd_weight > 0.0) hd_bits += b.hd_weight * log2_one_plus_pow10(b.log10_lr + o);
  }
  return p_hp * hp_bits / fit.hp_total + p_hd * hd_bits / fit.hd_total;
}

double neutral_cross_entropy(double o) {
  const auto [p_hp, p_hd] = prior_probabilities(o);
  return p_hp * log2_one_plus_pow10(-o) + p_hd * log2_one_plus_pow10(o);
}

EceCurves ece_curves(const ValidationSet& set, const PavFit& fit, std::span<const double> prior_log10_odds) {
  require_both_truths(set);
  EceCurves curves;
  curves.prior_log10_odds.assign(prior_log10_odds.begin(), prior_log10_odds.end());
  for (double o : prior_log10_odds) {
    curves.method.push_back(empirical_cross_entropy(set, o));
    curves.calibrated.push_back(empirical_cross_entropy(fit, o));
    curves.neutral.push_back(neutral_cross_entropy(o));
  }
  return curves;
}

}  // namespace counterpoise::method_validation
