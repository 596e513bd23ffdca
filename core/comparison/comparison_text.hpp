#pragma once
// The comparison in words, for the command line and the review memo: the two versions by
// label and digest, their combined LRs and verbal expressions, the effects of the differences on
// the combined log10 LR (those that alone move a verbal conclusion first, then largest first), the item LRs, and the differences section by section.
// Numbers go through the one formatter (core/numbers/number_text); text from the cases is
// escaped (validation::display_text).

#include <string>
#include <vector>

#include "core/comparison/case_comparison.hpp"

namespace counterpoise::comparison {

// The whole comparison as lines of text (each without its line end).
std::vector<std::string> comparison_lines(const CaseComparison& comparison);

// "A: LR 2.34 × 10⁵ (log10 5.37). The findings provide very strong support for Hp rather than Hd."
std::string version_line(const std::string& tag, const VersionSummary& version);

// The band of a verbal expression with its direction: "strong support for Hd".
std::string band_words(const verbal::VerbalExpression& verbal);

// How band words name the weighted set of alternatives: "moderate support for the weighted set
// of alternatives".
inline constexpr const char* kWeightedSetWords = "the weighted set of alternatives";

// The same against one alternative (or the weighted set), named as given: "strong support for
// Hp", "moderate support for Hd2".
std::string band_words(const verbal::VerbalExpression& verbal, const std::string& alternative);

// The verbal expression of the LR against one alternative (or the weighted set) in each version,
// as a sentence: "The verbal expression changes: weak support for Hp → moderate support for
// Hp." or "… is the same in both versions: …", or "Verbal expression in A only: …" for an
// alternative that one version has. `alternative` is its name as shown.
std::string alternative_band_sentence(const AlternativeAttribution& against, const std::string& alternative);

// One difference's values: "0.95 → 0.9", or the data files' names and digests.
std::string change_words(const Difference& difference);

// One difference's change in a short line: "0.95 → 0.9" (values cut), "left out → included",
// "added, <title> (model assigned)", the data files' names and digests, or for a list of
// alternatives whose weights alone changed "weights Hd1 6, Hd2 3 → Hd1 4, Hd2 5".
std::string change_summary(const Difference& difference);

// An item as written, in a line: its title and model ("(no title) (model assigned)").
std::string item_words(const std::optional<nlohmann::json>& item);

// An LR whose verbal expression one difference alone would change: its name for readers and the
// difference's effect alone on it.
struct MovedConclusion {
  std::string id;    // "combined LR", the alternative's id, or kCompoundId
  std::string name;  // "the combined LR", "the LR against Hd2", "the compound LR"
  std::optional<Log10Change> alone;
};

// The LRs whose verbal expression difference `k` alone, changed from A, would change, in the
// comparison's order (the combined LR, each alternative's, the compound LR against the weighted
// set); empty when it changes none. Throws std::out_of_range for a `k` past the differences.
std::vector<MovedConclusion> conclusions_moved(const CaseComparison& comparison, std::size_t k);

// The same in a phrase: "the combined LR, the LR against Hd2 and the compound LR"; empty when none.
std::string conclusions_moved_words(const CaseComparison& comparison, std::size_t k);

// Whose verbal band difference `k` alone moves, for a table cell: "yes" in a case without
// alternatives, else the ids in the comparison's order ("combined LR, Hd2, weighted set");
// empty when it moves none.
std::string conclusions_moved_cell(const CaseComparison& comparison, std::size_t k);

// Whether a difference leaves an LR exactly where it was, alone and as a share (a member changed
// only for other alternatives).
bool moves_nothing(const DifferenceEffect& effect);

// The cautions that go with any comparison of LRs.
std::vector<std::string> comparison_cautions(const CaseComparison& comparison);

}  // namespace counterpoise::comparison
