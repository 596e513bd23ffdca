#pragma once
// The case file's "report" section: settings that belong to the report rather than to the
// evaluation. Format (docs/report.md, "The report section of a case file"):
//   "report": { "reported_value": "point" | "conservative",
//               "wording_overrides": [ { "rule": RULE_ID, "item": WHERE, "reason": TEXT } ] }
// WHERE is an item id, "case" (the case details), "propositions", or "*" for any text.

#include <string>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/guard/wording_overrides.hpp"

namespace counterpoise::reports {

// Which value of an uncertain LR the evaluation sentence states; the other is shown beside it.
enum class ReportedValue { point, conservative };

// The overrides are read in core (guard::read_wording_overrides) because `validate` applies them
// too, to say whether the report will be refused.
using WordingOverride = guard::WordingOverride;

struct ReportSettings {
  ReportedValue reported_value = ReportedValue::point;
  std::vector<WordingOverride> wording_overrides;
};

// The settings of `value.report` (defaults when absent). Throws validation::InvalidValue naming
// item "report" and the field for an unknown member, a reported_value other than "point" or
// "conservative", an override without rule, item or reason (or with an empty one), and an
// override naming an item the case does not have.
ReportSettings read_report_settings(const casefile::Case& value);

// "point" or "conservative".
std::string_view reported_value_name(ReportedValue value);

}  // namespace counterpoise::reports
