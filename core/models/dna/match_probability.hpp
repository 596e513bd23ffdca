#pragma once
// Single-locus match probabilities for a single-source STR profile, in log10.
// - Product rule: p^2 for a homozygote, 2pq for a heterozygote (National Research Council 1996,
//   "The Evaluation of Forensic DNA Evidence" (NRC II), eq. 4.1a/4.1b).
// - Balding-Nichols conditional match probabilities with co-ancestry coefficient theta
//   (Balding & Nichols 1994, Forensic Sci. Int. 64:125; NRC II eq. 4.10a/4.10b):
//     homozygote   [2t + (1-t)p][3t + (1-t)p] / [(1+t)(1+2t)]
//     heterozygote 2[t + (1-t)p][t + (1-t)q] / [(1+t)(1+2t)]
// - A relative of the person whose profile matches, by the IBD coefficients (k0, k1, k2):
//     P = k0 P0 + k1 P1 + k2,
//   where P0 is the unrelated conditional match probability above, P1 the probability of the
//   genotype given that one allele is shared identical by descent with the matching person,
//     homozygote   [2t + (1-t)p] / (1+t)
//     heterozygote [2t + (1-t)(p+q)] / [2(1+t)],
//   and k2 the probability that both are shared. This is the form of Fung & Hu (2005, "Kinship
//   determination using DNA", Forensic Science Communications 7(2), Tables 2-3) and of Weir's
//   relatives formulas with theta (as tabulated in Butler 2005, "Forensic DNA Typing" 2nd ed.,
//   Table 21.7); with t = 0 it reduces to NRC II's formulas for relatives (section 4.4).

#include <array>

namespace counterpoise::models::dna {

// Probabilities that two relatives share 0, 1 or 2 alleles identical by descent.
struct IbdCoefficients {
  double k0 = 1.0, k1 = 0.0, k2 = 0.0;
};

// The genotype at one locus by its allele frequencies; q is ignored for a homozygote.
struct LocusGenotype {
  bool homozygote = false;
  double p = 0.0;
  double q = 0.0;
};

// log10 of the unrelated conditional match probability (eq. 4.10a/b; the product rule when
// theta = 0). Frequencies and theta are not checked here: callers pass p, q in (0, 1] and
// theta in [0, 1).
double log10_match_probability_unrelated(const LocusGenotype& genotype, double theta);

// log10 of the probability that a person sharing one allele identical by descent with the
// matching person has the same genotype (P1 above).
double log10_match_probability_one_shared(const LocusGenotype& genotype, double theta);

// k0 P0 + k1 P1 + k2 as a plain probability, for frequencies p, q >= kLinearFrequencyFloor
// (every term then stays above 1e-300, so nothing underflows).
inline constexpr double kLinearFrequencyFloor = 1e-150;
double match_probability(const LocusGenotype& genotype, double theta, const IbdCoefficients& ibd);

// log10 of k0 P0 + k1 P1 + k2, for any frequencies in (0, 1] (in log space below
// kLinearFrequencyFloor). With ibd = (1, 0, 0) equals the unrelated form.
double log10_match_probability(const LocusGenotype& genotype, double theta, const IbdCoefficients& ibd);

}  // namespace counterpoise::models::dna
