#include "core/sensitivity/posterior_columns.hpp"

#include <cmath>
#include <stdexcept>

#include "core/numbers/posterior.hpp"

namespace counterpoise::sensitivity {

namespace {

// An LR of zero or infinity, or a prior that is not finite: the checked form, value by value.
void checked_columns(std::span<const double> priors, const numbers::LikelihoodRatio& lr, std::span<double> probability,
                     std::span<double> complement) {
  for (std::size_t i = 0; i < priors.size(); ++i) {
    const numbers::Posterior p = numbers::posterior_from(priors[i], lr);
    probability[i] = p.log10_probability;
    complement[i] = p.log10_complement;
  }
}

}  // namespace

void posterior_columns(std::span<const double> log10_prior_odds, const numbers::LikelihoodRatio& lr,
                       std::span<double> log10_probability, std::span<double> log10_complement) {
  const std::size_t n = log10_prior_odds.size();
  if (log10_probability.size() != n || log10_complement.size() != n)
    throw std::invalid_argument("posterior_columns: the prior, probability and complement columns differ in length");
  const double log10_lr = lr.log10();
  bool all_finite = std::isfinite(log10_lr);
  for (std::size_t i = 0; all_finite && i < n; ++i) all_finite = std::isfinite(log10_prior_odds[i]);
  if (!all_finite) return checked_columns(log10_prior_odds, lr, log10_probability, log10_complement);
  // Every sum finite: no check inside the loop.
  for (std::size_t i = 0; i < n; ++i) {
    const numbers::Posterior p = numbers::posterior_from_finite_log10_odds(log10_prior_odds[i] + log10_lr);
    log10_probability[i] = p.log10_probability;
    log10_complement[i] = p.log10_complement;
  }
}

}  // namespace counterpoise::sensitivity
