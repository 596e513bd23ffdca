#pragma once
// The examiner's overrides of the report's wording check, kept in the case's "report" section: a
// flagged statement of the user's own text that the examiner keeps, for a reason the report
// prints (docs/report.md, "Wording check and overrides"):
//   "report": { "wording_overrides": [ { "rule": RULE_ID, "item": WHERE, "reason": TEXT } ] }
// WHERE is an item id, "case" (the case details), "propositions", or "*" for any text.

#include <string>
#include <string_view>
#include <vector>

#include "core/casefile/case_model.hpp"

namespace counterpoise::guard {

struct WordingOverride {
  std::string rule;    // rule id of the reasoning guard
  std::string item;    // where the flagged text is: an item id, "case", "propositions" or "*"
  std::string reason;  // why the examiner keeps the wording (printed in the report)
};

// The overrides of `value.report` (none when the section or the member is absent). Throws
// validation::InvalidValue naming item "report" and the field when the section is not an object,
// `wording_overrides` is not an array, an entry is not an object, has an unknown member, lacks
// rule, item or reason or has an empty one, or names an item the case does not have. The other
// members of the section are the report's to check (reports/report_settings).
std::vector<WordingOverride> read_wording_overrides(const casefile::Case& value);

// The override that lets a flagged statement of rule `rule_id` in a text of `item` stand: one
// that names the rule and the item, or the rule and "*"; nullptr when none does. Never throws.
const WordingOverride* matching_override(std::string_view rule_id, std::string_view item,
                                         const std::vector<WordingOverride>& overrides);

}  // namespace counterpoise::guard
