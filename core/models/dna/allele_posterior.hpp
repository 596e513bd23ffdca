#pragma once
// Sampling uncertainty of allele frequencies: with allele counts from a database of N people
// (2N alleles), the frequencies at a locus have a Dirichlet posterior; by the aggregation
// property of the Dirichlet distribution only three categories matter for one genotype — the
// profile's allele(s) and "all other alleles" (Kotz, Balakrishnan & Johnson 2000, "Continuous
// Multivariate Distributions" vol. 1, ch. 49 — from memory). The prior is Dirichlet with every
// parameter 1/K, K the number of allele types at the locus, as in the Bayesian method of Curran
// et al. (2002, Science & Justice 42:29 — from memory for the citation; the 1/k prior and the
// uniform prior are compared in "An investigation into the performance of methods for adjusting
// for sampling uncertainty in DNA likelihood ratio calculations", ESR). A Dirichlet draw is a set
// of independent Gamma(alpha_i, 1) draws divided by their sum (Devroye 1986, "Non-Uniform Random
// Variate Generation", ch. XI.4 — from memory). The Gamma draws come from the standard
// library's std::gamma_distribution (GCC's libstdc++ uses Marsaglia & Tsang 2000, ACM TOMS
// 26:363): about three times faster here than Boost.Random's, and reproducible from the seed
// for a given standard library (the supported toolchain is GCC on Debian 12); another standard
// library may draw different values from the same seed. GammaDistribution is the one switch.

#include <cstdint>
#include <random>

namespace counterpoise::models::dna {

// The Gamma generator used for the Dirichlet draws (see the top of this file).
using GammaDistribution = std::gamma_distribution<double>;

struct AllelePosterior {
  bool homozygote = false;
  double alpha_a = 0.0;     // posterior parameter of the first (or only) allele
  double alpha_b = 0.0;     // of the second allele (0 for a homozygote)
  double alpha_rest = 0.0;  // of all other alleles together (may be 0)
};

// The posterior for one genotype: counts n_a (and n_b) of the profile's alleles among
// `allele_total` alleles, K = `allele_types` allele types at the locus (including unseen profile
// alleles). Returns alpha_a = n_a + 1/K, alpha_b = n_b + 1/K, alpha_rest = (total - n_a - n_b) +
// (K - k)/K with k the number of distinct profile alleles. Throws std::invalid_argument when
// n_a + n_b > allele_total or allele_types < k.
AllelePosterior allele_posterior(bool homozygote, std::int64_t count_a, std::int64_t count_b,
                                 std::int64_t allele_total, std::int64_t allele_types);

// Draws the profile's allele frequencies from one locus's posterior. Holds the three Gamma
// distributions so that repeated draws do not rebuild them.
class AlleleSampler {
 public:
  explicit AlleleSampler(const AllelePosterior& posterior);
  // One joint draw of p (and q for a heterozygote); deterministic for a given generator state.
  void operator()(std::mt19937_64& rng, double& p, double& q);

 private:
  bool homozygote_;
  bool has_rest_;
  GammaDistribution gamma_a_, gamma_b_, gamma_rest_;
};

// One joint draw of the profile's allele frequencies (p, and q for a heterozygote) from the
// posterior; deterministic for a given generator state.
void draw_allele_frequencies(const AllelePosterior& posterior, std::mt19937_64& rng, double& p, double& q);

}  // namespace counterpoise::models::dna
