// counterpoise-cli evaluate CASE [--json] [--cross-check]
#include <ostream>

#include "app/cli/case_loading.hpp"
#include "app/cli/case_warnings.hpp"
#include "app/cli/cli_command.hpp"
#include "app/cli/evaluation_table.hpp"
#include "app/cli/json_output.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/evaluation_json.hpp"

namespace counterpoise::cli {

int run_evaluate(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const auto parsed = parse_arguments(args, {"--json", "--cross-check"}, {});
  if (parsed.positional.size() != 1) throw UsageError{"expected one case file"};
  const std::string& path = parsed.positional[0];
  const auto read = read_case_argument(path);
  if (!read.diagnostics.empty()) {
    print_problems(path, read.diagnostics, err);
    return kExitInvalidInput;
  }
  evaluation::EvaluationOptions options;
  options.monte_carlo_cross_check = parsed.has_flag("--cross-check");
  try {
    const auto result = evaluation::evaluate_case(*read.value, options);
    const auto warnings = case_warnings(*read.value);
    if (parsed.has_flag("--json")) {
      print_json(out, interchange::evaluation_to_json(*read.value, result, warnings));
    } else {
      print_evaluation_table(*read.value, result, out);
      out << "\n";
      print_case_warnings(warnings, out);
    }
  } catch (const validation::Error& error) {
    err << path << ": " << error.what() << "\n";
    return kExitInvalidInput;
  }
  return kExitOk;
}

}  // namespace counterpoise::cli
