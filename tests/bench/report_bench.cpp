// Benchmark (measured, not asserted): the report of a 20-item case — evaluation, report model,
// wording check over every text, and the PDF/A-1b file — against the 0.5 s target of issue 6.
// Each item has a Beta P(E|Hp) and a count-based P(E|Hd). Prints the median of 7 runs per stage.
#include <QByteArray>
#include <QGuiApplication>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <memory>
#include <string>
#include <vector>

#include "bench_timer.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/interchange/case_json.hpp"
#include "reports/pdf_writer.hpp"
#include "reports/report_model.hpp"
#include "reports/report_wording.hpp"

using namespace counterpoise;

namespace {

using bench::median_milliseconds;

nlohmann::json twenty_item_case() {
  nlohmann::json items = nlohmann::json::array();
  for (int i = 1; i <= 20; ++i) {
    const std::string id = "E" + std::to_string(i);
    items.push_back({{"id", id},
                     {"title", "Finding " + std::to_string(i) + " on the items from Tanner Row"},
                     {"model", "assigned"},
                     {"description", "Trace " + std::to_string(i) + " could not be distinguished from the control material."},
                     {"p_given_hp", {{"beta", {20 + i, 3}}}},
                     {"p_given_hd", {{"counts", {{"k", 2 + i % 5}, {"n", 300 + 17 * i}}}}},
                     {"combination", {{"included", true}, {"independence", "Examined separately from the other traces."}}}});
  }
  return {{"format", "counterpoise.case"},
          {"version", 1},
          {"case", {{"reference", "HV-BENCH-20"}, {"title", "Twenty findings (invented benchmark case)"},
                    {"laboratory", "Vale Forensic Laboratory (fictional)"}, {"examiner", "Dr Ada Penhallow"},
                    {"date", "2026-06-01"}, {"purpose", "To time the report of a large case."}}},
          {"propositions", {{"level", "source"}, {"hp", "The traces come from the workshop at 3 Tanner Row"},
                            {"hd", "The traces come from other sources"}}},
          {"items", items},
          {"uncertainty", {{"seed", 20}}}};
}

}  // namespace

int main(int argc, char** argv) {
  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", QByteArray("offscreen"));
  QGuiApplication app(argc, argv);
  const auto read = interchange::read_case(twenty_item_case(), ".");
  if (!read.value) {
    std::fprintf(stderr, "benchmark case does not read\n");
    return 1;
  }
  const auto& value = *read.value;
  const auto checker = std::make_shared<const guard::WordingChecker>(guard::WordingChecker::load_default());
  reports::render_pdf(reports::ReportModel{});  // loads the fonts once, as a long-running program would

  evaluation::CaseEvaluation result;
  reports::ReportModel model;
  reports::PdfResult pdf;
  const double evaluate_ms = median_milliseconds(7, [&] { result = evaluation::evaluate_case(value); });
  const double model_ms = median_milliseconds(7, [&] { model = reports::build_report_model(value, result, reports::ReportMode::casework); });
  const double wording_ms = median_milliseconds(7, [&] {
    auto checked = reports::build_report_model(value, result, reports::ReportMode::casework);
    reports::apply_wording_check(checked, value, reports::guard_wording_check(checker, value.propositions), "bench");
    model = std::move(checked);
  });
  const double pdf_ms = median_milliseconds(7, [&] { pdf = reports::render_pdf(model); });
  const double total_ms = median_milliseconds(7, [&] {
    auto r = evaluation::evaluate_case(value);
    auto m = reports::build_report_model(value, r, reports::ReportMode::casework);
    reports::apply_wording_check(m, value, reports::guard_wording_check(checker, value.propositions), "bench");
    pdf = reports::render_pdf(m);
  });
  std::printf("report of a 20-item case (median of 7 runs)\n");
  std::printf("  evaluate_case              %8.1f ms\n", evaluate_ms);
  std::printf("  report model               %8.1f ms\n", model_ms);
  std::printf("  model + wording check      %8.1f ms\n", wording_ms);
  std::printf("  PDF (%d pages, %zu bytes) %8.1f ms\n", pdf.pages, pdf.bytes.size(), pdf_ms);
  std::printf("  whole report               %8.1f ms   (target 500 ms)\n", total_ms);
  return 0;
}
