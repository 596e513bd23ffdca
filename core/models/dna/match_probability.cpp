#include "core/models/dna/match_probability.hpp"

#include <cmath>
#include <limits>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::models::dna {

namespace {
// log10 of theta-shifted frequency: k t + (1 - t) p, computed without forming 1 - t for t = 0.
double log10_shifted(double k, double theta, double p) { return std::log10(k * theta + (1.0 - theta) * p); }
}  // namespace

double log10_match_probability_unrelated(const LocusGenotype& g, double theta) {
  const double log10_denominator = std::log10(1.0 + theta) + std::log10(1.0 + 2.0 * theta);
  if (g.homozygote)
    return log10_shifted(2.0, theta, g.p) + log10_shifted(3.0, theta, g.p) - log10_denominator;
  return std::log10(2.0) + log10_shifted(1.0, theta, g.p) + log10_shifted(1.0, theta, g.q) - log10_denominator;
}

double log10_match_probability_one_shared(const LocusGenotype& g, double theta) {
  if (g.homozygote) return log10_shifted(2.0, theta, g.p) - std::log10(1.0 + theta);
  return std::log10(2.0 * theta + (1.0 - theta) * (g.p + g.q)) - std::log10(2.0 * (1.0 + theta));
}

double log10_match_probability(const LocusGenotype& g, double theta, const IbdCoefficients& ibd) {
  constexpr double minus_inf = -std::numeric_limits<double>::infinity();
  if (ibd.k0 == 1.0) return log10_match_probability_unrelated(g, theta);
  const double terms[] = {
      ibd.k0 > 0.0 ? std::log10(ibd.k0) + log10_match_probability_unrelated(g, theta) : minus_inf,
      ibd.k1 > 0.0 ? std::log10(ibd.k1) + log10_match_probability_one_shared(g, theta) : minus_inf,
      ibd.k2 > 0.0 ? std::log10(ibd.k2) : minus_inf};
  return numbers::log10_sum(terms);
}

}  // namespace counterpoise::models::dna
