#pragma once
// The probability of the alleles observed at one locus under one proposition, as a function of
// the drop-out probability d: the semi-continuous (qualitative) model of Gill et al. 2006 and
// the ISFG DNA commission (Gill et al. 2012, Forensic Sci. Int. Genet. 6:679; Balding &
// Buckleton 2009, Forensic Sci. Int. Genet. 4:1). Given the contributors' genotypes:
// - each allele copy of a heterozygous contributor drops out independently with probability d,
//   a homozygous contributor's allele with probability d2 (d^2 unless stated);
// - an allele carried by contributors is seen unless every copy drops out;
// - observed alleles no contributor carries are drop-ins: none with probability 1 - c, and
//   alleles x1..xk with probability c^k p_x1 ... p_xk (c the drop-in probability per locus);
// - alleles carried but not observed have dropped out.
// The sum over the unknowns' genotypes (unknown_genotypes.hpp) is gathered once into terms that
// share the same drop-out pattern, so evaluating at another d costs one pass over the terms,
// not another enumeration. Every term is non-negative: nothing cancels.

#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

#include "core/models/dna_mixture/allele_classes.hpp"

namespace counterpoise::models::dna_mixture {

// The contributors under one proposition at one locus.
struct LocusContributors {
  std::vector<ClassGenotype> known;  // named contributors' genotypes
  int unknowns = 0;
  int total() const { return static_cast<int>(known.size()) + unknowns; }
};

// The drop-out probabilities at which the probability is evaluated.
struct Dropout {
  double d = 0.0;
  std::optional<double> homozygote;  // d2; nullopt: d^2
  double d2() const { return homozygote ? *homozygote : d * d; }
};

// Copies of one class among the contributors: heterozygous copies, homozygous contributors.
struct ClassCopies {
  int heterozygous = 0;
  int homozygous = 0;
  bool carried() const { return heterozygous + homozygous > 0; }
};

// The observation probability of the alleles seen, given the contributors' copies of each class.
double observation_probability(const LocusClasses& locus, std::span<const ClassCopies> copies, double dropin,
                               const Dropout& dropout);

class LocusLikelihood {
 public:
  // Sums over the unknowns' genotypes. Throws std::invalid_argument for more than
  // kMaxContributors contributors, dropin outside [0, 1] or theta outside [0, 1).
  LocusLikelihood(const LocusClasses& locus, const LocusContributors& contributors, double theta, double dropin);

  // P(observed alleles | proposition, d), in [0, 1].
  double probability(const Dropout& dropout) const;
  // The number of unordered sets of unknown genotypes with a non-zero share.
  std::size_t genotype_sets() const { return genotype_sets_; }
  // The number of distinct drop-out patterns gathered.
  std::size_t terms() const { return terms_.size(); }

 private:
  struct Term {
    double weight;                 // genotype probability x drop-in factor, summed
    std::uint8_t present[8];       // (het, hom) codes of the carried observed classes
    std::uint8_t present_count;
    std::uint8_t dropped_heterozygous, dropped_homozygous;
  };
  std::vector<Term> terms_;
  std::size_t genotype_sets_ = 0;
};

}  // namespace counterpoise::models::dna_mixture
