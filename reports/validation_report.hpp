#pragma once
// The validation report of an LR method as a report model (rendered by render_pdf and
// render_text like the evaluative report): what was validated, the measures with their bootstrap
// intervals, the breakdown by condition, the laboratory's criteria with pass or fail, the Tippett,
// cross-entropy and calibration plots, the notes of the run and the cautions. Every number is
// the ValidationRun's (core/method_validation); this file only words and arranges them.

#include <string>

#include "core/method_validation/validation_run.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports {

struct ValidationReportInfo {
  std::string laboratory;      // may be empty
  std::string examiner;        // may be empty
  std::string date;            // ISO 8601
  std::string results_sha256;  // of the results file's bytes
};

ReportModel build_validation_report(const method_validation::ValidationRun& run, const ValidationReportInfo& info);

}  // namespace counterpoise::reports
