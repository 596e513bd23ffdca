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
// - alleles carried but not observed have dropped out;
// - an allele marked uncertain (a peak below the threshold) is left out of the observation: its
//   copies may have been seen or not, and it needs no drop-in (docs/methods.md, "Uncertain alleles").
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

// The drop-out group of a contributor: kSharedDropout (the shared d) or 1 + the index of the
// person's own rate in Dropout::own.
inline constexpr int kSharedDropout = 0;

// A contributor's genotype with the drop-out group it follows.
struct TypedContributor {
  ClassGenotype genotype;
  int group = kSharedDropout;
};

// The contributors under one proposition at one locus.
struct LocusContributors {
  std::vector<TypedContributor> known;  // named contributors' genotypes
  int unknowns = 0;                     // unknowns always follow the shared d
  int total() const { return static_cast<int>(known.size()) + unknowns; }
};

// One drop-out rate: d for each allele copy of a heterozygote, d2 for a homozygote's allele.
struct DropoutRate {
  double d = 0.0;
  std::optional<double> homozygote;  // d2; nullopt: d^2
  double d2() const { return homozygote ? *homozygote : d * d; }
};

// The drop-out probabilities at which the probability is evaluated: the shared rate, and the own
// rates of the named people who have one (group g >= 1 is own[g - 1]).
struct Dropout {
  double d = 0.0;
  std::optional<double> homozygote;  // d2 of the shared rate; nullopt: d^2
  std::vector<DropoutRate> own;
  double d2() const { return homozygote ? *homozygote : d * d; }
  // Throws std::invalid_argument for a group with no rate.
  DropoutRate rate(int group) const;
};

// The observation probability of the alleles seen, given every contributor's genotype.
double observation_probability(const LocusClasses& locus, std::span<const TypedContributor> contributors,
                               double dropin, const Dropout& dropout);

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
  // Copies of the shared d carried in a class: present[i] holds (het x 5 + hom) in its low 5
  // bits and, when a named person with an own rate also carries the class, 1 + its position in
  // own_classes_ above them (own rates are applied at evaluation: a term holds at any rates).
  struct Term {
    double weight;                 // genotype probability x drop-in factor, summed
    std::uint16_t present[8];      // codes of the carried observed classes
    std::uint8_t present_count;
    std::uint8_t dropped_heterozygous, dropped_homozygous;  // shared copies of unobserved classes
  };
  // The product over the own-rate contributors carrying each class of their d or d2.
  std::vector<double> own_loss(const Dropout& dropout) const;

  std::vector<bool> absent_;  // per class: neither observed nor uncertain (carried copies dropped out)
  std::vector<TypedContributor> own_rate_contributors_;
  std::vector<int> own_classes_;  // the classes they carry
  std::vector<Term> terms_;
  std::size_t genotype_sets_ = 0;
};

}  // namespace counterpoise::models::dna_mixture
