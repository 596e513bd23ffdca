#pragma once
// The evaluation as JSON (counterpoise-cli evaluate --json; docs/file-formats.md). A log10
// value that is infinite is written as the string "infinity" or "-infinity", never as null.

#include <nlohmann/json.hpp>

#include "core/casefile/case_model.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/case_guard.hpp"

namespace counterpoise::interchange {

// The number, or "infinity" / "-infinity".
nlohmann::json log10_json(double log10_value);

// The "warnings" array: one object per warning with item, rule, severity, message (and field when
// known). Never throws (except std::bad_alloc).
nlohmann::json warnings_to_json(const std::vector<guard::CaseWarning>& warnings);

// The evaluation document; `warnings` (from guard::check_case) fill its "warnings" array.
nlohmann::json evaluation_to_json(const casefile::Case& value, const evaluation::CaseEvaluation& result,
                                  const std::vector<guard::CaseWarning>& warnings = {});

}  // namespace counterpoise::interchange
