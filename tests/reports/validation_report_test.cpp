// The validation report of an LR method: its numbers are the run's, its own sentences pass the
// wording guard, and the PDF carries the measures, the criteria and the three plots.
#include <catch2/catch.hpp>

#include "core/guard/wording_checker.hpp"
#include "core/method_validation/validation_run.hpp"
#include "core/numbers/number_text.hpp"
#include "report_test_support.hpp"
#include "reports/report_text.hpp"
#include "reports/validation_report.hpp"

using namespace counterpoise;
using namespace counterpoise::reports::testing;

namespace {
method_validation::ValidationRun demo_run() {
  method_validation::RunOptions options;
  options.bootstrap.resamples = 100;
  options.criteria = method_validation::read_criteria_file(demo_dir() / "method-validation/vale-criteria.json");
  return method_validation::run_validation(
      method_validation::read_results_file(demo_dir() / "method-validation/vale-glass-lrs.csv"), options);
}
}  // namespace

TEST_CASE("the validation report shows the run's own numbers") {
  const auto run = demo_run();
  const auto model = reports::build_validation_report(run, {"Vale Forensic Laboratory", "Dr Ines Harrow", "2026-12-03", "ab"});
  CHECK(reports::section_ids(model) == std::vector<std::string>{"validated", "measures", "criteria", "plots", "cautions"});
  const std::string text = reports::render_text(model);
  CHECK_THAT(text, Catch::Contains("Cllr (bits)"));
  // The one reader formatter (core/numbers/number_text), as in the case report.
  CHECK_THAT(text, Catch::Contains(numbers::decimal_for_readers(run.summary.cllr)));
  CHECK_THAT(text, Catch::Contains(numbers::decimal_for_readers(run.summary.eer)));
  CHECK_THAT(text, Catch::Contains("Cllr \u2212 Cllr_min"));  // a minus sign, never a hyphen
  CHECK_THAT(text, !Catch::Contains("e-0") && !Catch::Contains("e+0") && !Catch::Contains("^"));
  CHECK_THAT(text, Catch::Contains("large fragments"));
  CHECK_THAT(text, Catch::Contains("Tippett plot"));
  CHECK_THAT(text, Catch::Contains("A validation holds for the conditions tested"));
}

TEST_CASE("every sentence the validation report writes passes the wording guard") {
  const auto model = reports::build_validation_report(demo_run(), {"Vale Forensic Laboratory", "Dr Ines Harrow", "2026-12-03", "ab"});
  // The program's own text is held to the rules; the learned reading weighs what people write
  // (docs/reasoning-guard.md, "The learned reading").
  const guard::WordingChecker checker(guard::WordingChecker::load_default().rules());
  const auto findings = checker.check(reports::render_text(model));
  for (const auto& f : findings) {
    CAPTURE(f.matched_text, f.rule_id);
    CHECK(f.severity == guard::Severity::advice);
  }
  CHECK_FALSE(guard::has_flagged(findings));
}

TEST_CASE("method-validation -o writes a validation report with its plots, and never overwrites without --force") {
  const auto dir = temp_dir("validation-report");
  const auto pdf = dir / "validation.pdf";
  const std::string command = std::string("'") + COUNTERPOISE_CLI + "' method-validation " +
                              quoted(demo_dir() / "method-validation/vale-glass-lrs.csv") + " --criteria " +
                              quoted(demo_dir() / "method-validation/vale-criteria.json") +
                              " --bootstrap 100 --examiner 'Dr Ines Harrow' -o " + quoted(pdf);
  REQUIRE(run(command).exit_code == 0);
  const std::string text = pdf_text(pdf);
  for (const char* words : {"Validation of a likelihood-ratio method", "Validation criteria", "Tippett plot",
                            "Empirical cross-entropy", "Calibration: the LRs", "pass", "Dr Ines Harrow"})
    CHECK_THAT(text, Catch::Contains(words));
  CHECK(run("pdffonts " + quoted(pdf)).output.find("DejaVu") != std::string::npos);
  const auto again = run(command);
  CHECK(again.exit_code == 2);
  CHECK_THAT(again.output, Catch::Contains("--force"));
  std::filesystem::remove_all(dir);
}
