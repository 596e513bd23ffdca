// counterpoise-cli validate CASE: lists every problem in a case file; exit 1 if any. The reasoning
// guard's warnings are printed too and do not change the exit code, with one exception: a
// flagged statement that will make `report` refuse the report (the decision `report` itself uses,
// guard::statements_refusing_report) is named with its item and field, and validate exits 1, so
// that a case that passes validate can be reported.
#include <ostream>

#include "app/cli/case_loading.hpp"
#include "app/cli/case_warnings.hpp"
#include "app/cli/cli_command.hpp"
#include "core/guard/case_rules.hpp"
#include "core/guard/report_readiness.hpp"

namespace counterpoise::cli {

namespace {

// The statements that will make `report` refuse, on stderr. Returns whether there were any.
bool print_report_refusals(const std::string& path, const std::vector<guard::RefusingStatement>& refusing,
                           guard::CheckMode mode, std::ostream& err) {
  if (refusing.empty()) return false;
  err << path << ": report will refuse the " << guard::mode_name(mode) << " report: " << refusing.size()
      << (refusing.size() == 1 ? " statement is" : " statements are") << " flagged by the wording check\n";
  for (const auto& s : refusing)
    err << "  " << guard::describe_refusing_statement(guard::user_text_place(s.item, s.field), s) << "\n";
  err << "  " << guard::kRewordOrOverride << "\n";
  return true;
}

}  // namespace

int run_validate(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const auto parsed = parse_arguments(args, {}, {});
  if (parsed.positional.size() != 1) throw UsageError{"expected one case file"};
  const std::string& path = parsed.positional[0];
  const auto result = read_case_argument(path);
  if (!result.diagnostics.empty()) {
    print_problems(path, result.diagnostics, err);
    err << result.diagnostics.problems().size() << " problem(s) found\n";
    return kExitInvalidInput;
  }
  const casefile::Case& value = *result.value;
  out << path << ": valid (" << value.items.size() << (value.items.size() == 1 ? " item)\n" : " items)\n");
  try {
    const auto checker = guard::checker_for_case(value);
    print_case_warnings(guard::check_case(value, checker), out);
    const auto mode = guard::default_report_mode(value);
    if (print_report_refusals(path, guard::statements_refusing_report(value, checker, mode), mode, err))
      return kExitInvalidInput;
  } catch (const validation::Error& error) {
    err << path << ": " << error.what() << "\n";
    return kExitInvalidInput;
  }
  return kExitOk;
}

}  // namespace counterpoise::cli
