// counterpoise-cli method-validation RESULTS: judges an LR method from comparisons whose ground
// truth is known (Cllr, Cllr_min, calibration loss, EER, rates of misleading evidence, bootstrap
// intervals, the laboratory's criteria). The measures live in core/method_validation.
#include <cstdint>
#include <filesystem>
#include <iomanip>
#include <ostream>
#include <string>

#include "app/cli/cli_command.hpp"
#include "app/cli/headless_gui.hpp"
#include "app/cli/json_output.hpp"
#include "core/method_validation/validation_run.hpp"
#include "core/numbers/number_text.hpp"
#include "core/platform/sha256.hpp"
#include "core/platform/today.hpp"
#include "core/reading/text_file.hpp"
#ifdef COUNTERPOISE_HAVE_REPORTS
#include "reports/pdf_writer.hpp"
#include "reports/validation_report.hpp"
#endif

namespace counterpoise::cli {

namespace mv = method_validation;

namespace {

// The report's formatter, so that the terminal and the PDF print the same figures.
std::string measure_text(double x) { return numbers::decimal_for_readers(x); }

std::string interval_text(const mv::Interval& i) { return measure_text(i.low) + " to " + measure_text(i.high); }

mv::Calibration parse_calibration(const std::string& text) {
  if (text.empty() || text == "none") return mv::Calibration::none;
  if (text == "linear") return mv::Calibration::linear;
  if (text == "pav") return mv::Calibration::pav;
  throw UsageError{"--calibrate must be linear or pav, not \"" + text + "\""};
}

long long parse_whole(const std::string& text, const std::string& option, long long fallback, long long most) {
  if (text.empty()) return fallback;
  std::size_t used = 0;
  long long value = 0;
  try {
    value = std::stoll(text, &used);
  } catch (const std::exception&) {
    used = 0;
  }
  if (used != text.size() || value < 1 || value > most)
    throw UsageError{option + " takes a whole number from 1 to " + std::to_string(most)};
  return value;
}

void print_row(std::ostream& out, const std::string& name, double value, const mv::Interval& interval) {
  out << "  " << std::left << std::setw(42) << name << std::setw(10) << measure_text(value) << interval_text(interval) << "\n";
}

void print_run(const mv::ValidationRun& run, std::ostream& out) {
  const mv::PerformanceSummary& s = run.summary;
  const mv::BootstrapIntervals& b = run.intervals;
  out << "Validation of the LRs in " << run.source << ": " << s.hp_count << " comparisons with Hp true, " << s.hd_count
      << " with Hd true\nCalibration: " << run.calibration_text << "\n\n";
  out << "  " << std::left << std::setw(42) << "measure" << std::setw(10) << "value"
      << numbers::percent_for_readers(b.options.level) << " bootstrap interval (" << b.options.resamples
      << " resamples, seed " << b.options.seed << ")\n";
  print_row(out, "Cllr (bits)", s.cllr, b.cllr);
  print_row(out, "Cllr_min, after PAV (bits)", s.cllr_min, b.cllr_min);
  print_row(out, "calibration loss Cllr - Cllr_min (bits)", s.cllr_cal, b.cllr_cal);
  print_row(out, "equal error rate", s.eer, b.eer);
  print_row(out, "misleading, Hp true: LR < 1", s.misleading.hp, b.misleading_hp);
  print_row(out, "misleading, Hd true: LR > 1", s.misleading.hd, b.misleading_hd);
  print_row(out, "strongly misleading, Hp true: LR <= 1/100", s.misleading.strong_hp, b.strong_hp);
  print_row(out, "strongly misleading, Hd true: LR >= 100", s.misleading.strong_hd, b.strong_hd);
  if (s.misleading.neutral_hp + s.misleading.neutral_hd > 0)
    out << "  (" << s.misleading.neutral_hp + s.misleading.neutral_hd << " result(s) with LR exactly 1 favour neither and are not counted as misleading)\n";
  if (!run.by_condition.empty()) {
    out << "\nBy condition:\n  " << std::left << std::setw(24) << "condition" << std::setw(14) << "Hp / Hd" << std::setw(10)
        << "Cllr" << std::setw(10) << "Cllr_min" << "EER\n";
    for (const auto& [condition, c] : run.by_condition)
      out << "  " << std::setw(24) << condition << std::setw(14)
          << (std::to_string(c.hp_count) + " / " + std::to_string(c.hd_count)) << std::setw(10) << measure_text(c.cllr)
          << std::setw(10) << measure_text(c.cllr_min) << measure_text(c.eer) << "\n";
  }
  out << "\nValidation criteria (Meuwly, Ramos & Haraksim 2017):\n";
  if (run.criteria.empty()) {
    for (const mv::Criterion& c : run.rows_without_criteria)
      out << "  " << std::setw(22) << c.characteristic << std::setw(44) << mv::metric_description(c.metric)
          << std::setw(10) << measure_text(mv::metric_value(s, c.metric, {"criteria", c.metric}))
          << "no criterion set by the laboratory\n";
  }
  for (const mv::CriterionResult& r : run.criteria) {
    std::string bound;
    if (r.criterion.at_most) bound += "at most " + measure_text(*r.criterion.at_most);
    if (r.criterion.at_least) bound += (bound.empty() ? "" : ", ") + std::string("at least ") + measure_text(*r.criterion.at_least);
    out << "  " << std::setw(22) << r.criterion.characteristic << std::setw(44) << mv::metric_description(r.criterion.metric)
        << std::setw(10) << measure_text(r.value) << std::setw(22) << bound << (r.pass ? "pass" : "FAIL") << "\n";
  }
  for (const std::string& w : run.warnings) out << "\nNote: " << w << "\n";
  out << "\nA validation holds for the conditions tested: the kinds of material, quantities and instruments in these "
         "results. Criteria are the laboratory's, set before the run. Follow your accredited laboratory's procedures.\n";
}

// Writes the validation report as PDF. Throws UsageError when this build has no reports.
void write_validation_report(const mv::ValidationRun& run, const std::string& results_path, const std::string& output,
                             const std::string& examiner, const std::string& laboratory) {
#ifdef COUNTERPOISE_HAVE_REPORTS
  const auto app = make_headless_gui_application();
  reports::ValidationReportInfo info;
  info.examiner = examiner;
  info.laboratory = laboratory;
  info.date = platform::today_iso_date();
  info.results_sha256 = platform::sha256_hex(reading::read_text_file(results_path, {"results", "file"}));
  const auto model = reports::build_validation_report(run, info);
  reports::write_file_atomically(output, reports::render_pdf(model).bytes);
#else
  (void)run, (void)results_path, (void)output, (void)examiner, (void)laboratory;
  throw UsageError{"this build has no PDF reports (it was built without Qt); leave out -o"};
#endif
}

}  // namespace

int run_method_validation(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const auto parsed = parse_arguments(args, {"--json", "--force"},
                                      {"--criteria", "--calibrate", "--train", "--seed", "--bootstrap", "-o", "--output",
                                       "--examiner", "--laboratory"});
  if (parsed.positional.size() != 1) throw UsageError{"expected one results file"};
  const std::string output = parsed.option_or("-o", parsed.option_or("--output", ""));
  if (!output.empty() && std::filesystem::exists(output) && !parsed.has_flag("--force"))
    throw UsageError{output + " exists; add --force to replace it"};
  mv::RunOptions options;
  options.calibration = parse_calibration(parsed.option_or("--calibrate", ""));
  options.bootstrap.resamples =
      static_cast<int>(parse_whole(parsed.option_or("--bootstrap", ""), "--bootstrap", options.bootstrap.resamples, 100000));
  options.bootstrap.seed = static_cast<std::uint64_t>(parse_whole(
      parsed.option_or("--seed", ""), "--seed", static_cast<long long>(options.bootstrap.seed), 9007199254740991LL));
  try {
    const mv::ResultsTable results = mv::read_results_file(parsed.positional[0]);
    if (const std::string train = parsed.option_or("--train", ""); !train.empty()) options.training = mv::read_results_file(train);
    if (const std::string criteria = parsed.option_or("--criteria", ""); !criteria.empty())
      options.criteria = mv::read_criteria_file(criteria);
    const mv::ValidationRun run = mv::run_validation(results, options);
    if (parsed.has_flag("--json"))
      print_json(out, mv::run_to_json(run));
    else
      print_run(run, out);
    if (!output.empty())
      write_validation_report(run, parsed.positional[0], output, parsed.option_or("--examiner", ""),
                              parsed.option_or("--laboratory", ""));
    for (const mv::CriterionResult& r : run.criteria)
      if (!r.pass) return kExitInvalidInput;
  } catch (const validation::Error& e) {
    err << parsed.positional[0] << ": " << e.what() << "\n";
    return kExitInvalidInput;
  }
  return kExitOk;
}

}  // namespace counterpoise::cli
