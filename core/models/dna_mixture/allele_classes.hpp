#pragma once
// The allele classes of one locus of a mixture: each observed allele, each allele of a named
// person that was not observed, and Q, all other alleles together (frequency 1 minus the sum of
// the others). Unknown contributors' genotypes are built from these classes only, so the sum
// over unknown genotypes never runs over the whole frequency table. Lumping the unseen alleles
// into Q is exact under the Balding-Nichols sampling formula (the Dirichlet aggregation
// property; Balding & Nichols 1994, Forensic Sci. Int. 64:125) and for drop-out whenever a
// homozygote's drop-out probability is d^2 (an unseen pair then drops out with d^2 whether its
// two alleles are alike or not); with a stated d2 an unknown carrying two unseen alleles is
// treated as homozygous for Q (the usual Q convention, see docs/methods.md).

#include <optional>
#include <string>
#include <vector>

namespace counterpoise::models::dna_mixture {

// The name of the class of all other alleles in detail and text.
inline constexpr const char* kOtherAlleles = "Q";

struct AlleleClass {
  std::string allele;              // the designation ("9.3"), or kOtherAlleles
  double frequency = 0.0;          // the frequency used (after any minimum frequency)
  std::optional<double> listed;    // as listed in the table (nullopt: not listed, or Q)
  bool floored = false;            // the minimum allele frequency was used
  bool observed = false;           // in the questioned profile at this locus (and not uncertain)
  bool uncertain = false;          // marked uncertain at this locus: neither seen nor missing
  bool other = false;              // the class Q
  int conditioning_copies = 0;     // copies among the named people's genotypes (for theta)
};

// A genotype as two class indices, first <= second.
struct ClassGenotype {
  int first = 0, second = 0;
  bool homozygote() const { return first == second; }
  friend bool operator==(const ClassGenotype&, const ClassGenotype&) = default;
};

// The classes of one locus: observed first (in the order given), then the alleles marked
// uncertain, then the named people's unobserved alleles, then Q when its frequency is above 0.
struct LocusClasses {
  std::vector<AlleleClass> classes;
  int observed_count() const;
  int conditioning_total() const;  // 2 x the number of named people
  // The index of `allele`, or -1.
  int index_of(const std::string& allele) const;
};

}  // namespace counterpoise::models::dna_mixture
