#pragma once
// The evaluation as JSON (counterpoise-cli evaluate --json; docs/file-formats.md). A log10
// value that is infinite is written as the string "infinity" or "-infinity", never as null.

#include <nlohmann/json.hpp>

#include "core/casefile/case_model.hpp"
#include "core/evaluation/case_evaluation.hpp"

namespace counterpoise::interchange {

// The number, or "infinity" / "-infinity".
nlohmann::json log10_json(double log10_value);

nlohmann::json evaluation_to_json(const casefile::Case& value, const evaluation::CaseEvaluation& result);

}  // namespace counterpoise::interchange
