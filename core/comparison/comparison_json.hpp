#pragma once
// The comparison as JSON ("format": "counterpoise.comparison", version 1), for `compare --json`.
// Members: a and b (label, sha256, log10_lr, lr_state, verbal), log10_lr_a, log10_lr_b,
// total_change_log10 (null when infinite; total_change_state says which way), band_changes,
// propositions_differ, differences (largest share first: kind, path {section, item, field},
// place, old, new, effect_log10 — its share of the total change — effect_state, item_effect_log10,
// alone_log10, note, files, and for changed wording guard {a, b}: the reasoning guard's
// findings on each side) and items (each item's LRs, change and attribution method). The
// shares sum to total_change_log10. With several alternatives to Hp: by_alternative (one entry
// per alternative: id, in_a, in_b, log10_lr_a/b, lr_state_a/b, verbal_a/b and favours_a/b (its
// LR's verbal expression and direction "hp", "hd", "neither" on each version's scale; null where
// absent), band_changes, attributed, total_change_log10,
// total_change_state, method, note, effects — path, place, effect_log10, effect_state,
// alone_log10, note — largest first, summing to its total_change_log10) and compound (the same
// against the weighted set) when weights are given. Documented in docs/file-formats.md. Also described in docs/user-guide.md ("Comparing two versions").

#include <nlohmann/json.hpp>

#include "core/comparison/case_comparison.hpp"

namespace counterpoise::comparison {

inline constexpr const char* kComparisonFormatName = "counterpoise.comparison";
inline constexpr int kComparisonFormatVersion = 1;

nlohmann::json comparison_to_json(const CaseComparison& comparison);

}  // namespace counterpoise::comparison
