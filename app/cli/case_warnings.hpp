#pragma once
// The reasoning guard's warnings on a case for `evaluate` and `validate` (core/guard/case_guard):
// computed with the shipped wording rules and printed under a "Warnings" heading.

#include <iosfwd>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/guard/case_guard.hpp"

namespace counterpoise::cli {

// The warnings on `value` with the shipped wording rules. Throws validation::Error when the rule
// file cannot be read or a text is not well-formed UTF-8.
std::vector<guard::CaseWarning> case_warnings(const casefile::Case& value);

// "Warnings: none", or a "Warnings (N):" heading and one line per warning:
// "  warning [rule] item, field: message".
void print_case_warnings(const std::vector<guard::CaseWarning>& warnings, std::ostream& out);

}  // namespace counterpoise::cli
