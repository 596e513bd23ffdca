#include "app/cli/case_loading.hpp"

#include <ostream>

namespace counterpoise::cli {

interchange::CaseReadResult read_case_argument(const std::string& path) {
  return interchange::read_case_file(path);
}

void print_problems(const std::string& path, const validation::Diagnostics& diagnostics, std::ostream& err) {
  for (const auto& problem : diagnostics.problems()) err << path << ": " << problem.text() << "\n";
}

}  // namespace counterpoise::cli
