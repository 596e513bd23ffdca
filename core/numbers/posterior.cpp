#include "core/numbers/posterior.hpp"

#include <cmath>
#include <limits>
#include <stdexcept>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::numbers {

double Posterior::probability() const { return std::pow(10.0, log10_probability); }
double Posterior::complement() const { return std::pow(10.0, log10_complement); }

Posterior posterior_from_log10_odds(double log10_posterior_odds) {
  if (std::isnan(log10_posterior_odds)) throw std::invalid_argument("posterior log10 odds is NaN");
  const double l = log10_posterior_odds;
  if (std::isinf(l)) return Posterior{l, log10_probability_from_log10_odds(l), log10_probability_from_log10_odds(-l)};
  return posterior_from_finite_log10_odds(l);
}

Posterior posterior_from(double log10_prior_odds, const LikelihoodRatio& lr) {
  if (!std::isfinite(log10_prior_odds))
    throw std::invalid_argument("prior log10 odds must be finite (prior probability strictly between 0 and 1)");
  return posterior_from_log10_odds(log10_prior_odds + lr.log10());
}

double prior_log10_odds_reaching(double threshold, const LikelihoodRatio& lr) {
  if (!(threshold > 0.0 && threshold < 1.0))
    throw std::invalid_argument("threshold must be strictly between 0 and 1");
  const double inf = std::numeric_limits<double>::infinity();
  if (lr.is_zero()) return inf;
  if (lr.is_infinite()) return -inf;
  const double log10_threshold_odds = std::log10(threshold) - std::log1p(-threshold) / kLn10;
  return log10_threshold_odds - lr.log10();
}

}  // namespace counterpoise::numbers
