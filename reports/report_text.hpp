#pragma once
// A plain-text rendering of the report model, for review and for diffs between revisions: the
// same words and numbers as the PDF, one paragraph per line, tables as aligned columns and the
// charts as their data.

#include <string>

#include "reports/report_model.hpp"

namespace counterpoise::reports {

// The report as UTF-8 text ending in a newline. Never throws (except std::bad_alloc).
std::string render_text(const ReportModel& model);

}  // namespace counterpoise::reports
