#include "app/cli/case_warnings.hpp"

#include <ostream>

#include "core/guard/case_rules.hpp"

namespace counterpoise::cli {

std::vector<guard::CaseWarning> case_warnings(const casefile::Case& value) {
  return guard::check_case(value, guard::checker_for_case(value));
}

void print_case_warnings(const std::vector<guard::CaseWarning>& warnings, std::ostream& out) {
  if (warnings.empty()) {
    out << "Warnings: none\n";
    return;
  }
  out << "Warnings (" << warnings.size() << "):\n";
  for (const auto& w : warnings) {
    out << "  " << guard::severity_name(w.severity) << " [" << w.rule << "] " << w.item
        << (w.field.empty() ? "" : ", " + w.field) << ": " << w.message << "\n";
  }
}

}  // namespace counterpoise::cli
