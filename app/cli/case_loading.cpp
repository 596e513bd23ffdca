#include "app/cli/case_loading.hpp"

#include <ostream>

#include "core/store/document_loader.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::cli {

reading::DataAccess data_access_for(const std::filesystem::path& case_folder, const ParsedArguments& arguments) {
  return arguments.has_flag(kAllowDataOutside) ? reading::DataAccess::allowing_outside(case_folder)
                                               : reading::DataAccess(case_folder);
}

interchange::CaseReadResult read_case_argument(const std::string& path, const ParsedArguments& arguments) {
  try {
    // Either file kind: a case store (.cpcase, opened read-only) or interchange JSON.
    const auto loaded = store::load_case_document(path);
    return interchange::read_case(loaded.document, data_access_for(loaded.base_dir, arguments));
  } catch (const validation::Error& error) {
    interchange::CaseReadResult result;
    result.diagnostics.add(error);
    return result;
  }
}

void print_problems(const std::string& path, const validation::Diagnostics& diagnostics, std::ostream& err) {
  for (const auto& problem : diagnostics.problems()) {
    const std::string text = problem.text();  // escaped by describe()
    const std::string shown_path = validation::display_text(path);
    // File-level messages already name the file.
    const bool names_file = text.find(shown_path) != std::string::npos;
    err << (names_file ? "" : shown_path + ": ") << text << "\n";
  }
}

}  // namespace counterpoise::cli
