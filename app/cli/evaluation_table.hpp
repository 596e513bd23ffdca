#pragma once
// The readable table that `evaluate` prints without --json.

#include <iosfwd>

#include "core/casefile/case_model.hpp"
#include "core/evaluation/case_evaluation.hpp"

namespace counterpoise::cli {

void print_evaluation_table(const casefile::Case& value, const evaluation::CaseEvaluation& result, std::ostream& out);

}  // namespace counterpoise::cli
