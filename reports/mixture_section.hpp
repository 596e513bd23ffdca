#pragma once
// The report section on a dna-mixture item: per locus, the alleles observed, the named people's
// genotypes, how many sets of unknown genotypes were summed and the leading ones, and the LR;
// then the LR over the drop-out probability d with the d that minimises it
// (core/models/dna_mixture; docs/methods.md, "DNA mixtures").

#include <optional>

#include "core/casefile/case_model.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports {

// The section for `item`, or nullopt when its model is not dna-mixture. With several
// alternatives (`propositions`), the table per locus and the curve over d are given for Hp
// against each alternative in turn, since each names its own contributors.
std::optional<Section> mixture_section(const casefile::Item& item, const casefile::Propositions& propositions);

}  // namespace counterpoise::reports
