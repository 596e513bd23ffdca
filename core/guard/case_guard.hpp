#pragma once
// The numeric guard on a case: warnings about how the numbers and propositions of a case are set
// up, beside the wording checker's findings on the case's own sentences. The checks and their
// sources (docs/reasoning-guard.md, "Checks on the case"):
// - P(E|Hp) and P(E|Hd) are probabilities of the same findings under two propositions and need
//   not sum to 1; a sum of exactly 1 suggests they were treated as complements (common practice);
// - a value of an item described in its own text as the probability of a proposition is the
//   transposed conditional (Thompson & Schumann 1987, Law and Human Behavior 11:167);
// - propositions must be mutually exclusive (ENFSI 2015 Guideline for Evaluative Reporting);
// - a lower level of the hierarchy does not answer a higher one (Cook, Evett, Jackson, Jones &
//   Lambert 1998, Science & Justice 38:231-239);
// - multiplying the LRs of the same or dependent findings double-counts them (common practice);
// - in casework the prior odds are the fact-finder's, not the scientist's (ENFSI 2015);
// - with several alternatives, a text that weighs the findings must say against which
//   (alternative_coverage.hpp; ENFSI 2015).

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/guard/wording_checker.hpp"

namespace counterpoise::guard {

struct CaseWarning {
  std::string item;   // the item id, or "propositions", "priors", "case"
  std::string field;  // the text or value concerned ("description", "hd", "p_given_hp"); may be empty
  std::string rule;   // stable rule id, e.g. "complementary-probabilities" or "wording:SP-01"
  Severity severity = Severity::warning;
  std::string message;  // plain sentence
};

// The stable ids of the checks on the case (wording findings use "wording:" + the wording rule id).
namespace case_rules {
inline constexpr std::string_view complementary_probabilities = "complementary-probabilities";
inline constexpr std::string_view value_as_proposition_probability = "value-as-proposition-probability";
inline constexpr std::string_view propositions_identical = "propositions-identical";
inline constexpr std::string_view propositions_overlap = "propositions-overlap";
inline constexpr std::string_view proposition_possibility = "proposition-possibility";
inline constexpr std::string_view lower_level_item = "lower-level-item";
inline constexpr std::string_view same_findings = "same-findings";
inline constexpr std::string_view covered_by_network = "covered-by-network";
inline constexpr std::string_view prior_in_casework = "prior-in-casework";
inline constexpr std::string_view single_alternative_wording = "single-alternative-wording";
}  // namespace case_rules

// The warnings for `value`, in order: case texts, propositions, each item (in case order), items
// that evaluate the same findings, items a network covers, priors.
// The case's texts are checked with `checker` in the case's mode; only flagged findings (errors
// and warnings, not advice) become warnings. Throws validation::InvalidValue when a text is not
// well-formed UTF-8 (as WordingChecker::check).
std::vector<CaseWarning> check_case(const casefile::Case& value, const WordingChecker& checker);

// The same warnings without the wording checker's: every check on how the case is set up
// (numbers, propositions, levels, same findings, networks, priors, the alternatives a text weighs
// against), for a caller that shows the wording findings itself (the editor's guard tab).
// Never reads a text with the wording checker, so it adds no wording cost. Throws as check_case.
std::vector<CaseWarning> check_case_setup(const casefile::Case& value);

// The level of the hierarchy an item's likelihood ratio addresses: the model's own level where
// the model has one (dna-single-source, dna-mixture: sub-source; transfer: activity), otherwise the item's
// declared level; nullopt when neither is known. Never throws.
std::optional<casefile::PropositionLevel> item_level(const casefile::Item& item);

// `text` as a space-separated list of its case-folded words and numbers, punctuation left out,
// so that wordings differing only in case, spacing or punctuation compare equal. Throws as
// tokenise for ill-formed UTF-8.
std::string normalised_words(std::string_view text);

}  // namespace counterpoise::guard
