#pragma once
// How much each difference moved its item's log10 LR and its item's term in the combined log10
// LR. The players of an item's game are its differences that enter the LR (each changed model
// input or data file, the model itself with all its inputs when the model changed, and the
// item's inclusion in the combined LR); v(S) is the item's log10 LR, or its term in the combined
// log10 LR (the log10 LR when included, 0 when left out), with the players in S taken from the
// second version and the others from the first. Each player gets
//   - its effect alone: v({i}) - v(∅), changed one at a time from the first version, and
//   - its Shapley share (core/comparison/shapley_values.hpp), which adds up to v(N) - v(∅).
// Items are independent in the combined LR (their log10 LRs add), so an item's term changes only
// through its own players and the case's shares are the items' shares side by side.
//
// Explicit states, never NaN:
//   - the LR zero or infinite in one version: the change is infinite; it is given to the
//     players that make the LR zero or infinite (or undo it) by themselves, one at a time from
//     either version, and to all of them jointly when none does it alone; the others get none;
//   - the LR zero (or infinite) in both versions: no change, every share none;
//   - both versions finite but some mixture of them not readable or not finite (inputs that only
//     make sense together, a profile and its reference changed at once): the change is split
//     equally, which is the Shapley value of the game in which only all the changes together
//     count (a unanimity game), and said so.

#include <optional>
#include <string>
#include <vector>

#include "core/comparison/case_differences.hpp"
#include "core/comparison/game_shares.hpp"
#include "core/comparison/log10_change.hpp"
#include "core/comparison/mixed_item.hpp"

namespace counterpoise::comparison {

// The effect of one difference. Empty optionals: the difference does not enter the LR (wording,
// settings) or has no item LR (an item added or removed).
struct DifferenceEffect {
  std::optional<Log10Change> item_alone;      // on its item's log10 LR, alone from the first version
  std::optional<Log10Change> item_share;      // its share of the item's log10 LR change
  std::optional<Log10Change> combined_alone;  // on its item's term in the combined log10 LR, alone
  Log10Change combined_share;                 // its share of the combined log10 LR change
  std::string note;                           // how the share was found, when not plainly
};

// `indexes` (into `effects`) by the size of their share of the combined change, largest first
// (infinite first); equal sizes keep their order.
std::vector<std::size_t> largest_share_first(std::vector<std::size_t> indexes, const std::vector<DifferenceEffect>& effects);

// The sum of the shares of `indexes` when `total` is finite (equals it to rounding), else `total` itself.
double sum_of_shares(const std::vector<std::size_t>& indexes, const std::vector<DifferenceEffect>& effects,
                     const Log10Change& total);

struct ItemAttribution {
  std::string item_id;
  std::optional<double> log10_lr_a, log10_lr_b;  // the item's point log10 LR (±inf); nullopt: absent
  bool included_a = false, included_b = false;
  std::optional<Log10Change> item_change;        // when both versions hold the item
  Log10Change combined_change;                   // of the item's term in the combined log10 LR
  AttributionMethod method = AttributionMethod::single;
  int players = 0;
};

// Attributes the change of the item that `mixed` mixes, against `target`, to its differences,
// writing their effects into `effects` (one per difference of the comparison). Never throws for items of
// well-formed cases: a mixture the model reader refuses makes the game joint.
ItemAttribution attribute_item(MixedItem& mixed, const LrTarget& target, const std::string& item_id,
                               std::vector<DifferenceEffect>& effects);

// The effect of an item added or removed (difference `index`): its whole term in the combined
// log10 LR, `log10_lr` (against the target) counted when `included`.
ItemAttribution attribute_presence(const std::string& item_id, double log10_lr, bool included, bool added,
                                   std::size_t index, std::vector<DifferenceEffect>& effects);

}  // namespace counterpoise::comparison
