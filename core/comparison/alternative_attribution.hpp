#pragma once
// In cases with several alternatives to Hp (propositions.alternatives): how much each difference
// moved the combined log10 LR against each alternative, and the compound log10 LR against the
// weighted set of alternatives when both versions give weights.
//
// Against one alternative Hd_i the combined log10 LR is the sum of the included items' log10 LRs
// against it, so its change is shared out item by item exactly as the combined LR's
// (item_attribution.hpp): Shapley values over each item's changed inputs, independent items
// side by side. The compound log10 LR, -log10 sum_i w_i 10^(-log10 LR_i), does not add over
// items: its game has every player of every changed item (and the weights, when they changed)
// as players, v(S) being the compound log10 LR with the players in S from the second version,
// and the shares are its Shapley values (exact up to kExactShapleyPlayers players, seeded
// sampled orders beyond). Either way the shares add up to the change.
//
// Alternatives are matched by id. An alternative that only one version has is listed with its
// LR in that version and is not attributed (its LR has no first or no second value). The
// compound is attributed only when both versions give weights to the same set of alternatives;
// otherwise its two values are listed side by side, with the reason.

#include <optional>
#include <string>
#include <vector>

#include "core/comparison/item_attribution.hpp"
#include "core/comparison/mixed_item.hpp"
#include "core/verbal/verbal_scale.hpp"

namespace counterpoise::comparison {

// The id under which the comparison lists the compound LR.
inline constexpr const char* kCompoundId = "weighted set";

struct AlternativeAttribution {
  std::string id;                                // the alternative's id, or kCompoundId
  std::optional<double> log10_lr_a, log10_lr_b;  // combined log10 LR (±inf); nullopt: not in that version
  bool attributed = false;                       // whether the change is shared out
  Log10Change total_change;                      // when both versions have it
  AttributionMethod method = AttributionMethod::single;
  std::vector<DifferenceEffect> effects;         // one per difference; combined_* against this LR
  std::vector<std::size_t> entering;             // the differences with a share, in document order
  std::string note;                              // why not attributed, or how
  // The verbal expression of its LR on each version's own verbal scale (as the combined LR's);
  // nullopt where the version does not have it.
  std::optional<verbal::VerbalExpression> verbal_a, verbal_b;
  // One per difference: whether it alone, changed from the first version, would put this LR in
  // another verbal band (or the other direction) on the second version's scale (band_move.hpp);
  // false throughout unless both versions have the LR and the change is shared out.
  std::vector<bool> moves_conclusion;

  bool in_a() const { return log10_lr_a.has_value(); }
  // Whether both versions have it and its words differ (another band, or the other direction).
  bool band_changes() const;
  bool in_b() const { return log10_lr_b.has_value(); }
  // `entering` by the size of the share, largest first (infinite first).
  std::vector<std::size_t> by_effect() const;
  // by_effect() with the differences that move this LR's verbal expression first.
  std::vector<std::size_t> movers_first() const;
  // The sum of the shares when all are finite (equals total_change to rounding), else the total change.
  double sum_of_shares() const;
};

struct AlternativesComparison {
  std::vector<AlternativeAttribution> by_alternative;  // A's alternatives in order, then those only in B
  std::optional<AlternativeAttribution> compound;      // when either version gives weights
};

// The comparison against each alternative and the weighted set; empty when neither version has
// alternatives. `items` are the changed items of `differences` (changed_items). Throws
// validation::InvalidValue (item "combination", naming the version and the alternative) when a
// version's included items contradict each other against an alternative (one with LR zero,
// another infinite), as evaluate_case does.
AlternativesComparison compare_alternatives(const CaseVersion& a, const CaseVersion& b,
                                            const std::vector<Difference>& differences,
                                            std::vector<ChangedItem>& items);

}  // namespace counterpoise::comparison
