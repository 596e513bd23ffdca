// counterpoise-cli validate CASE: lists every problem in a case file; exit 1 if any. The reasoning
// guard's warnings are printed too but do not change the exit code (they are not errors).
#include <ostream>

#include "app/cli/case_loading.hpp"
#include "app/cli/case_warnings.hpp"
#include "app/cli/cli_command.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::cli {

int run_validate(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const auto parsed = parse_arguments(args, {kAllowDataOutside}, {});
  if (parsed.positional.size() != 1) throw UsageError{"expected one case file"};
  const std::string& path = parsed.positional[0];
  const auto result = read_case_argument(path, parsed);
  if (!result.diagnostics.empty()) {
    print_problems(path, result.diagnostics, err);
    err << result.diagnostics.problems().size() << " problem(s) found\n";
    return kExitInvalidInput;
  }
  out << validation::display_text(path) << ": valid (" << result.value->items.size() << " items)\n";
  try {
    print_case_warnings(case_warnings(*result.value), out);
  } catch (const validation::Error& error) {
    err << validation::display_text(path) << ": " << error.what() << "\n";
    return kExitInvalidInput;
  }
  return kExitOk;
}

}  // namespace counterpoise::cli
