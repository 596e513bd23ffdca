#pragma once
// The reasoning guard's findings on the wording that differs between two versions: each changed
// text (propositions, conditioning information, assumptions, an item's description, notes or
// reasons) is checked on each side with that version's own rules (the shipped rules and the
// laboratory's rule files the case names, guard::checker_for_case), mode and propositions, so a
// reviewer sees whether a rewording introduced or removed a transposed conditional or a related
// error. The checker is called as it is; nothing here changes what it finds.

#include <optional>
#include <string>
#include <vector>

#include "core/comparison/case_differences.hpp"

namespace counterpoise::comparison {

// One finding of the wording checker, as a reviewer reads it.
struct WordingFlag {
  std::string rule_id;
  std::string family_name;  // "transposed conditional (prosecutor's fallacy)"
  std::string severity;     // "error", "warning", "advice"
  std::string assertion;    // "asserted", "negated", "quoted"
  std::string matched_text;
  std::string explanation;
};

struct WordingReview {
  std::vector<WordingFlag> a, b;  // the findings in the first and the second version's text
};

struct WordingReviews {
  std::vector<std::optional<WordingReview>> by_difference;  // one per difference; set for wording
  std::string not_checked;  // why the wording could not be checked (a rule file unreadable); "" when it was
};

// The findings for every difference that is wording (Difference::is_wording). Never throws: when
// a version's rules cannot be loaded the reason is in `not_checked` and no review is given.
WordingReviews review_wording(const CaseVersion& a, const CaseVersion& b, const std::vector<Difference>& differences);

// How many findings are errors or warnings (advice does not count).
std::size_t flagged_count(const std::vector<WordingFlag>& flags);

}  // namespace counterpoise::comparison
