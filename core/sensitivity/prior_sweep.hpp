#pragma once
// How the same LR would move different prior odds: posterior odds, probability and complement
// for each prior, with the band from the LR's interval, and the prior odds at which the
// posterior crosses chosen thresholds. Posteriors are illustrations for the fact-finder, whose
// prior they depend on; the scientist proposes no prior.

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/numbers/posterior.hpp"
#include "core/uncertainty/spread_summary.hpp"

namespace counterpoise::sensitivity {

struct PriorPoint {
  double log10_prior_odds;
  std::optional<double> one_of_n;  // when the prior came from "one of N possible sources"
  std::string_view origin;         // "odds", "range", "one-of-n" or "default" (a literal: no string work per point)
};

struct SensitivityRow {
  PriorPoint prior;
  numbers::Posterior posterior;              // at the point LR
  std::optional<numbers::Posterior> at_low;  // at the low end of the LR's interval
  std::optional<numbers::Posterior> at_high;
};

struct ThresholdCrossing {
  double threshold;                // posterior probability of Hp
  double log10_prior_odds;         // prior odds needed at the point LR (±inf: never / always)
  std::optional<double> log10_prior_odds_low_lr;   // needed at the interval's low end
  std::optional<double> log10_prior_odds_high_lr;
};

struct PriorSensitivity {
  std::vector<SensitivityRow> rows;
  std::vector<ThresholdCrossing> thresholds;
};

// The priors named in the settings, in order: the listed odds, then the range, then one-of-N.
// With no settings, a default illustration from 1e-6 to 1e3 prior odds by decades.
std::vector<PriorPoint> prior_points(const std::optional<casefile::PriorSettings>& settings);

// The sweep over `points` for the LR and its optional spread. One pass with no allocation per
// point: the posteriors of finite sums in one loop (numbers::posterior_from_finite_log10_odds).
PriorSensitivity sweep(const std::vector<PriorPoint>& points, const numbers::LikelihoodRatio& lr,
                       const std::optional<uncertainty::SpreadSummary>& spread,
                       const std::vector<double>& thresholds);

// Log-spaced prior log10 odds from `from` to `to` inclusive (points >= 2).
std::vector<double> log_spaced(double log10_from, double log10_to, int points);

}  // namespace counterpoise::sensitivity
