#pragma once
// The review memo of a comparison of two case versions as a report model (rendered by
// render_pdf and render_text like the evaluative report): the two versions identified by digest,
// their combined LRs and verbal expressions, the changes that by themselves move a verbal
// conclusion (the combined LR's, an alternative's or the compound LR's) first, the table of
// differences with their effects (those movers first, then largest share first), the
// items' LRs, the reasoning guard's findings on changed wording, every difference by section,
// the method and the cautions; with several alternatives to Hp, the effects against each
// alternative and against the weighted set. Every number is the CaseComparison's (core/comparison); this file
// only words and arranges them.

#include <string>

#include "core/casefile/case_model.hpp"
#include "core/comparison/case_comparison.hpp"
#include "reports/pdf_writer.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports {

struct ComparisonMemoInfo {
  std::string laboratory;  // of the second version; may be empty
  std::string reference;   // the case reference (of the second version)
  std::string case_title;  // of the second version
  std::string reviewer;    // who made the comparison (compare --reviewer, the editor's examiner); may be empty
  std::string date;        // ISO 8601
};

ReportModel build_comparison_memo(const comparison::CaseComparison& comparison, const ComparisonMemoInfo& info);

// The memo's heading for a comparison whose second version has `second` as its case details,
// dated today: what both the command line (compare -o) and the editor put in the memo.
ComparisonMemoInfo comparison_memo_info(const casefile::CaseDetails& second, const std::string& reviewer);

// The memo as PDF: build_comparison_memo painted by render_pdf. Safe on any thread (no widgets).
// Throws what render_pdf throws.
PdfResult render_comparison_memo(const comparison::CaseComparison& comparison, const ComparisonMemoInfo& info);

}  // namespace counterpoise::reports
