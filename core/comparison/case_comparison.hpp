#pragma once
// A reviewer's comparison of two versions of a case: what differs (case_differences), how much
// each difference moved its item's log10 LR and the combined log10 LR (item_attribution), and
// whether the verbal expression of the combined LR changes. With several alternatives to Hp, the
// same against each alternative and against the weighted set (alternative_attribution). The combined log10 LR is the sum of
// the included items' point log10 LRs (as evaluate_case combines them), so the total change is
// the sum of the items' changes and each item's change is the sum of its differences' shares.
// Changed wording is checked by the reasoning guard on both sides (wording_review).

#include <cstddef>
#include <string>
#include <vector>

#include "core/comparison/alternative_attribution.hpp"
#include "core/comparison/case_differences.hpp"
#include "core/comparison/item_attribution.hpp"
#include "core/comparison/wording_review.hpp"
#include "core/numbers/likelihood_ratio.hpp"
#include "core/verbal/verbal_scale.hpp"

namespace counterpoise::comparison {

struct VersionSummary {
  std::string label;
  std::string sha256;
  numbers::LikelihoodRatio combined_lr = numbers::LikelihoodRatio::neutral();
  verbal::VerbalExpression verbal;  // of the combined LR, on the version's own verbal scale
};

struct CaseComparison {
  VersionSummary a, b;
  std::vector<Difference> differences;     // in document order
  std::vector<DifferenceEffect> effects;   // one per difference
  std::vector<ItemAttribution> items;      // items with a difference that enters the LR
  // Against each alternative and the weighted set, when either version has alternatives. The
  // combined LR above is against the first alternative, as evaluate reports it.
  AlternativesComparison alternatives;
  Log10Change total_change;                // of the combined log10 LR, from a to b
  WordingReviews wording;                  // the guard's findings on each side of changed wording
  // Per difference: whether it alone, changed from a, would put the combined LR in another verbal
  // band (or the other direction) on b's scale than a's combined LR is in (band_move.hpp). The
  // same against each alternative and the weighted set: AlternativeAttribution::moves_conclusion.
  std::vector<bool> moves_conclusion;

  // Whether the words for the combined LR differ (another band, or the other proposition).
  bool band_changes() const;
  // Whether difference `k` alone moves the verbal expression of the combined LR, of the LR
  // against any alternative or of the compound LR. Throws std::out_of_range for a `k` past the
  // differences.
  bool moves_any_conclusion(std::size_t k) const;
  // Whether Hp, Hd or their level differ: the two LRs then answer different questions.
  bool propositions_differ() const;
  // The differences' indexes by the size of their share of the combined change, largest first
  // (infinite first); differences with no share keep document order after them.
  std::vector<std::size_t> by_effect() const;
  // by_effect() with the differences that move any conclusion (moves_any_conclusion) first: the
  // order in which the comparison lists its differences.
  std::vector<std::size_t> movers_first() const;
  // The sum of the shares of the combined change when all are finite (equals total_change to
  // rounding), else the total change itself.
  double sum_of_shares() const;
};

// Compares `a` (the first version) with `b`. Throws validation::InvalidValue (item
// "combination", naming the version) when a version's included items contradict each other (one
// with LR zero, another infinite), as evaluate_case does.
CaseComparison compare_cases(const CaseVersion& a, const CaseVersion& b);

}  // namespace counterpoise::comparison
