#pragma once
// The recomputation of a dna-mixture item's LR at one drop-out probability, for a second expert
// with a calculator: per locus and proposition, every set of genotypes the unknown contributors
// could have, with P(genotypes) (the Balding-Nichols sampling formula, every order of the
// unknowns), P(alleles observed | genotypes) and their product; the products' sum, and the ratio
// of the two sums, the locus's LR. Values at kWorkingFigures so that the product of the printed
// locus LRs gives the printed LR to kReaderFigures (docs/report.md, "Recomputation").

#include <vector>

#include "core/casefile/case_model.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports {

// The most sets listed per locus and proposition; the rest are summed in one row.
inline constexpr std::size_t kListedGenotypeSets = 40;

// The paragraph and table for `item` at its point drop-out; empty when the model is not dna-mixture.
std::vector<Block> mixture_recomputation(const casefile::Item& item);

}  // namespace counterpoise::reports
