#include "core/models/dna/allele_posterior.hpp"

#include <stdexcept>

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

// A Gamma distribution needs alpha > 0; an empty category (alpha 0) is never drawn, so a placeholder
// parameter of 1 is stored for it.
AlleleSampler::AlleleSampler(const AllelePosterior& posterior)
    : homozygote_(posterior.homozygote),
      has_rest_(posterior.alpha_rest > 0.0),
      gamma_a_(posterior.alpha_a, 1.0),
      gamma_b_(posterior.homozygote ? 1.0 : posterior.alpha_b, 1.0),
      gamma_rest_(has_rest_ ? posterior.alpha_rest : 1.0, 1.0) {}

void AlleleSampler::operator()(std::mt19937_64& rng, double& p, double& q) {
  const double ga = gamma_a_(rng);
  const double gb = homozygote_ ? 0.0 : gamma_b_(rng);
  const double gr = has_rest_ ? gamma_rest_(rng) : 0.0;
  const double sum = ga + gb + gr;
  p = ga / sum;
  q = homozygote_ ? 0.0 : gb / sum;
}

void draw_allele_frequencies(const AllelePosterior& posterior, std::mt19937_64& rng, double& p, double& q) {
  AlleleSampler sampler(posterior);
  sampler(rng, p, q);
}

}  // namespace counterpoise::models::dna
