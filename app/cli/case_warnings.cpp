#include "app/cli/case_warnings.hpp"

#include <ostream>

#include "core/guard/case_rules.hpp"
#include "core/validation/display_text.hpp"

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
    using validation::display_text;
    out << "  " << guard::severity_name(w.severity) << " [" << display_text(w.rule) << "] " << display_text(w.item)
        << (w.field.empty() ? "" : ", " + display_text(w.field)) << ": " << display_text(w.message) << "\n";
  }
}

}  // namespace counterpoise::cli
