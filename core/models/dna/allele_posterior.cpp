#include "core/models/dna/allele_posterior.hpp"

#include <stdexcept>

#include <boost/random/gamma_distribution.hpp>

namespace counterpoise::models::dna {

AllelePosterior allele_posterior(bool homozygote, std::int64_t count_a, std::int64_t count_b,
                                 std::int64_t allele_total, std::int64_t allele_types) {
  const std::int64_t distinct = homozygote ? 1 : 2;
  if (homozygote) count_b = 0;
  if (count_a < 0 || count_b < 0 || count_a + count_b > allele_total)
    throw std::invalid_argument("allele counts exceed the number of alleles counted");
  if (allele_types < distinct) throw std::invalid_argument("fewer allele types than profile alleles");
  const double prior = 1.0 / static_cast<double>(allele_types);
  AllelePosterior posterior;
  posterior.homozygote = homozygote;
  posterior.alpha_a = static_cast<double>(count_a) + prior;
  posterior.alpha_b = homozygote ? 0.0 : static_cast<double>(count_b) + prior;
  posterior.alpha_rest = static_cast<double>(allele_total - count_a - count_b) +
                         static_cast<double>(allele_types - distinct) * prior;
  return posterior;
}

namespace {
double draw_gamma(double alpha, std::mt19937_64& rng) {
  if (alpha <= 0.0) return 0.0;  // an empty category contributes nothing
  boost::random::gamma_distribution<double> gamma(alpha, 1.0);
  return gamma(rng);
}
}  // namespace

void draw_allele_frequencies(const AllelePosterior& posterior, std::mt19937_64& rng, double& p, double& q) {
  const double ga = draw_gamma(posterior.alpha_a, rng);
  const double gb = posterior.homozygote ? 0.0 : draw_gamma(posterior.alpha_b, rng);
  const double gr = draw_gamma(posterior.alpha_rest, rng);
  const double sum = ga + gb + gr;
  p = ga / sum;
  q = posterior.homozygote ? 0.0 : gb / sum;
}

}  // namespace counterpoise::models::dna
