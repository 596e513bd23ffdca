#include "core/sensitivity/prior_sweep.hpp"

#include <cmath>
#include <limits>
#include <stdexcept>

namespace counterpoise::sensitivity {

using numbers::LikelihoodRatio;

std::vector<double> log_spaced(double log10_from, double log10_to, int points) {
  if (points < 2) throw std::invalid_argument("log_spaced: at least two points");
  std::vector<double> out(static_cast<std::size_t>(points));
  for (int i = 0; i < points; ++i)
    out[static_cast<std::size_t>(i)] = log10_from + (log10_to - log10_from) * i / (points - 1);
  out.back() = log10_to;
  return out;
}

std::vector<PriorPoint> prior_points(const std::optional<casefile::PriorSettings>& settings) {
  std::vector<PriorPoint> points;
  const bool empty = !settings || (settings->odds.empty() && !settings->range && settings->one_of_n.empty());
  if (empty) {
    for (double l : log_spaced(-6.0, 3.0, 10)) points.push_back({l, std::nullopt, "default"});
    return points;
  }
  for (double odds : settings->odds) points.push_back({std::log10(odds), std::nullopt, "odds"});
  if (settings->range)
    for (double l : log_spaced(std::log10(settings->range->from_odds), std::log10(settings->range->to_odds),
                               settings->range->points))
      points.push_back({l, std::nullopt, "range"});
  // One of N possible sources: prior odds 1 / (N - 1); log1p keeps N near 2 exact.
  for (double n : settings->one_of_n) points.push_back({-std::log10(n - 1.0), n, "one-of-n"});
  return points;
}

PriorSensitivity sweep(const std::vector<PriorPoint>& points, const LikelihoodRatio& lr,
                       const std::optional<uncertainty::SpreadSummary>& spread,
                       const std::vector<double>& thresholds) {
  PriorSensitivity result;
  result.rows.resize(points.size());
  // Point values the prior settings allow (finite priors; LRs may be 0 or infinite) go through
  // the checked form; the common case, all sums finite, through one loop without checks.
  const double log10_lr = lr.log10();
  const double low = spread ? spread->low_log10 : 0.0, high = spread ? spread->high_log10 : 0.0;
  const bool finite = std::isfinite(log10_lr) && std::isfinite(low) && std::isfinite(high);
  for (std::size_t i = 0; i < points.size(); ++i) {
    SensitivityRow& row = result.rows[i];
    row.prior = points[i];
    const double prior = points[i].log10_prior_odds;
    if (!finite || !std::isfinite(prior)) {
      row.posterior = numbers::posterior_from(prior, lr);
      if (spread) {
        row.at_low = numbers::posterior_from_log10_odds(prior + low);
        row.at_high = numbers::posterior_from_log10_odds(prior + high);
      }
      continue;
    }
    row.posterior = numbers::posterior_from_finite_log10_odds(prior + log10_lr);
    if (spread) {
      row.at_low = numbers::posterior_from_finite_log10_odds(prior + low);
      row.at_high = numbers::posterior_from_finite_log10_odds(prior + high);
    }
  }
  const auto crossing_at = [](double threshold, double log10_lr) {
    if (std::isinf(log10_lr)) return log10_lr > 0 ? -std::numeric_limits<double>::infinity() : std::numeric_limits<double>::infinity();
    return numbers::prior_log10_odds_reaching(threshold, LikelihoodRatio::from_log10(log10_lr));
  };
  for (double t : thresholds) {
    ThresholdCrossing crossing{t, numbers::prior_log10_odds_reaching(t, lr), std::nullopt, std::nullopt};
    if (spread) {
      crossing.log10_prior_odds_low_lr = crossing_at(t, spread->low_log10);
      crossing.log10_prior_odds_high_lr = crossing_at(t, spread->high_log10);
    }
    result.thresholds.push_back(crossing);
  }
  return result;
}

}  // namespace counterpoise::sensitivity
