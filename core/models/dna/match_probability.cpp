#include "core/models/dna/match_probability.hpp"

#include <cmath>
#include <limits>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::models::dna {

namespace {
// k t + (1 - t) p: the Balding-Nichols probability of seeing an allele of frequency p after k
// copies of it, times (1 + (n-1) t) for n alleles seen (the denominators are applied apart).
double shifted(double k, double theta, double p) { return k * theta + (1.0 - theta) * p; }

double unrelated(const LocusGenotype& g, double t) {
  const double denominator = (1.0 + t) * (1.0 + 2.0 * t);
  if (g.homozygote) return shifted(2.0, t, g.p) * shifted(3.0, t, g.p) / denominator;
  return 2.0 * shifted(1.0, t, g.p) * shifted(1.0, t, g.q) / denominator;
}

double one_shared(const LocusGenotype& g, double t) {
  if (g.homozygote) return shifted(2.0, t, g.p) / (1.0 + t);
  return (2.0 * t + (1.0 - t) * (g.p + g.q)) / (2.0 * (1.0 + t));
}

bool linear_is_safe(const LocusGenotype& g) {
  return g.p >= kLinearFrequencyFloor && (g.homozygote || g.q >= kLinearFrequencyFloor);
}
}  // namespace

double log10_match_probability_unrelated(const LocusGenotype& g, double theta) {
  if (linear_is_safe(g)) return std::log10(unrelated(g, theta));
  // Tiny frequencies: the same formula factor by factor in log10.
  const double log10_denominator = std::log10(1.0 + theta) + std::log10(1.0 + 2.0 * theta);
  if (g.homozygote)
    return std::log10(shifted(2.0, theta, g.p)) + std::log10(shifted(3.0, theta, g.p)) - log10_denominator;
  return std::log10(2.0) + std::log10(shifted(1.0, theta, g.p)) + std::log10(shifted(1.0, theta, g.q)) -
         log10_denominator;
}

double log10_match_probability_one_shared(const LocusGenotype& g, double theta) {
  return std::log10(one_shared(g, theta));  // at least theta or p/2: no underflow short of subnormal p
}

double match_probability(const LocusGenotype& g, double theta, const IbdCoefficients& ibd) {
  if (ibd.k0 == 1.0) return unrelated(g, theta);
  return ibd.k0 * unrelated(g, theta) + ibd.k1 * one_shared(g, theta) + ibd.k2;
}

double log10_match_probability(const LocusGenotype& g, double theta, const IbdCoefficients& ibd) {
  if (ibd.k0 == 1.0) return log10_match_probability_unrelated(g, theta);
  if (linear_is_safe(g)) return std::log10(match_probability(g, theta, ibd));
  constexpr double minus_inf = -std::numeric_limits<double>::infinity();
  const double terms[] = {
      ibd.k0 > 0.0 ? std::log10(ibd.k0) + log10_match_probability_unrelated(g, theta) : minus_inf,
      ibd.k1 > 0.0 ? std::log10(ibd.k1) + log10_match_probability_one_shared(g, theta) : minus_inf,
      ibd.k2 > 0.0 ? std::log10(ibd.k2) : minus_inf};
  return numbers::log10_sum(terms);
}

}  // namespace counterpoise::models::dna
