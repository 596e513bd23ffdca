#include "app/cli/case_loading.hpp"

#include <ostream>

#include "core/store/document_loader.hpp"

namespace counterpoise::cli {

interchange::CaseReadResult read_case_argument(const std::string& path) {
  try {
    // Either file kind: a case store (.cpcase, opened read-only) or interchange JSON.
    const auto loaded = store::load_case_document(path);
    return interchange::read_case(loaded.document, loaded.base_dir);
  } catch (const validation::Error& error) {
    interchange::CaseReadResult result;
    result.diagnostics.add(error);
    return result;
  }
}

void print_problems(const std::string& path, const validation::Diagnostics& diagnostics, std::ostream& err) {
  for (const auto& problem : diagnostics.problems()) {
    const std::string text = problem.text();
    // File-level messages already name the file.
    const bool names_file = text.find(path) != std::string::npos;
    err << (names_file ? "" : path + ": ") << text << "\n";
  }
}

}  // namespace counterpoise::cli
