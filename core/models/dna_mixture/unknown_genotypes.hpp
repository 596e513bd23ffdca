#pragma once
// The sum over the genotypes of unknown contributors at one locus. Each unknown's genotype is
// drawn from the allele classes by the Balding-Nichols sampling formula, conditioned on the named
// people's alleles: after n alleles of which n_j are of class j, the next allele is of class j
// with probability [n_j theta + (1 - theta) p_j] / [1 + (n - 1) theta] (Balding & Nichols 1994,
// Forensic Sci. Int. 64:125; for mixtures Curran, Triggs, Buckleton & Weir 1999, J. Forensic
// Sci. 44:987 — from memory for volume and pages). With theta = 0 this is the product rule of
// Weir et al. 1997 (J. Forensic Sci. 42:213). The sequence probability is exchangeable, so the
// unknowns are visited as unordered sets of genotypes, each with the probability of all its
// orderings: n! / (r_1! r_2! ...) orderings for runs r_i of equal genotypes.

#include <functional>
#include <span>

#include "core/models/dna_mixture/allele_classes.hpp"

namespace counterpoise::models::dna_mixture {

// The most contributors a proposition may have (named and unknown together).
inline constexpr int kMaxContributors = 4;

// Called once for each unordered set of unknown genotypes (in non-decreasing genotype order)
// with the probability of the set given the named people's alleles.
using GenotypeSetVisitor = std::function<void(std::span<const ClassGenotype> unknowns, double probability)>;

// Visits every set of `unknowns` genotypes built from `locus.classes`. With 0 unknowns visits
// the empty set once with probability 1. Throws std::invalid_argument when unknowns is outside
// [0, kMaxContributors] or theta outside [0, 1).
void for_each_unknown_genotype_set(const LocusClasses& locus, int unknowns, double theta,
                                   const GenotypeSetVisitor& visit);

}  // namespace counterpoise::models::dna_mixture
