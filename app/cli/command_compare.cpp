// counterpoise-cli compare A B [--json] [-o MEMO.pdf [--force] [--reviewer NAME]]: what differs between two versions of a case and how
// much each difference moved the LR (core/comparison). A and B are where comparison::
// parse_version_location says: JSON cases, case stores (files or database addresses; their
// current state), or STORE@REVISION for a sealed revision of a store.
#include <filesystem>
#include <optional>
#include <ostream>

#include "app/cli/case_loading.hpp"
#include "app/cli/cli_command.hpp"
#include "app/cli/json_output.hpp"
#include "core/comparison/case_comparison.hpp"
#include "core/comparison/comparison_json.hpp"
#include "core/comparison/comparison_text.hpp"
#include "core/comparison/version_location.hpp"
#include "core/reading/data_access.hpp"

#ifdef COUNTERPOISE_HAVE_REPORTS
#include "app/cli/headless_gui.hpp"
#include "reports/comparison_memo.hpp"
#include "reports/pdf_writer.hpp"
#endif

namespace counterpoise::cli {

namespace {

// Writes the review memo as PDF and returns its page count. Throws UsageError when this build has
// no reports, validation::FileError when the file exists (without --force) or cannot be written.
int write_memo(const comparison::CaseComparison& result, const casefile::Case& second, const std::string& output,
               const std::string& reviewer, bool force) {
  if (std::filesystem::exists(output) && !force)
    throw validation::FileError({}, output + ": already exists (use --force to replace it)");
#ifdef COUNTERPOISE_HAVE_REPORTS
  const auto app = make_headless_gui_application();
  const auto pdf = reports::render_comparison_memo(result, reports::comparison_memo_info(second.details, reviewer));
  reports::write_file_atomically(output, pdf.bytes);
  return pdf.pages;
#else
  (void)result, (void)second, (void)reviewer;
  throw UsageError{"this build has no PDF reports (it was built without Qt); leave out -o"};
#endif
}

}  // namespace

int run_compare(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const auto parsed = parse_arguments(args, {"--json", "--force"}, {"-o", "--output", "--reviewer"});
  const std::string output = parsed.option_or("-o", parsed.option_or("--output", ""));
  if (parsed.positional.size() != 2) throw UsageError{"expected two versions of a case (A and B)"};
  std::vector<comparison::CaseVersion> versions;
  for (const auto& text : parsed.positional) {
    comparison::VersionLocation where;
    try {
      where = comparison::parse_version_location(text);
    } catch (const validation::InvalidValue&) {
      throw UsageError{"'" + text + "': a revision is written STORE.cpcase@N or postgresql://…/DB?case=REF@N with N "
                       "a whole number"};
    }
    auto located = comparison::read_version_at(where);
    if (!located.read.diagnostics.empty()) {
      print_problems(text, located.read.diagnostics, err);
      return kExitInvalidInput;
    }
    versions.push_back(comparison::make_version(std::move(*located.read.value), located.base_dir, text));
  }
  // Attribution reads items that mix the two versions, each naming its own version's files: the
  // folders of the two cases the user gave are both allowed for this run.
  for (const auto& version : versions) reading::allow_folder_for_this_run(version.base_dir);
  try {
    const auto result = comparison::compare_cases(versions[0], versions[1]);
    if (parsed.has_flag("--json")) {
      print_json(out, comparison::comparison_to_json(result));
    } else {
      for (const auto& line : comparison::comparison_lines(result)) out << line << "\n";
    }
    if (!output.empty()) {
      const int pages = write_memo(result, versions[1].value, output, parsed.option_or("--reviewer", ""),
                                   parsed.has_flag("--force"));
      (parsed.has_flag("--json") ? err : out) << output << ": review memo written (" << pages << " pages)\n";
    }
  } catch (const validation::Error& error) {
    err << error.what() << "\n";
    return kExitInvalidInput;
  }
  return kExitOk;
}

}  // namespace counterpoise::cli
