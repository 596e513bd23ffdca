#pragma once
// The wording check of a report: every text of the report model goes through a checker (the
// reasoning guard, core/guard); a flagged text written by the program is always refused, a
// flagged text from the user's case file is refused in casework mode unless the case's "report"
// section records an override for that rule and place, with a reason. The outcome becomes the
// report's "Wording check" section (docs/report.md, "Wording check and overrides").

#include <functional>
#include <memory>
#include <string>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/validation/input_error.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports {

// One text of the report as the checker sees it.
struct CheckedText {
  std::string text;
  TextSource source;
  std::string section_id;
};

// A statement the checker flags as the author's own error (advice and reported statements are
// not flags).
struct WordingFlag {
  std::size_t text_index = 0;  // into the list that was checked
  std::string sentence;        // the sentence that holds the flagged words
  std::string rule_id;
  std::string family_name;
  std::string severity;        // "error" or "warning"
  std::string explanation;
  std::string suggestion;
};

// The seam: any checker that maps texts to flags. `mode` is the report's mode.
using WordingCheck = std::function<std::vector<WordingFlag>(const std::vector<CheckedText>&, ReportMode)>;

// A check backed by the reasoning guard; the propositions fill the suggested rewrites.
WordingCheck guard_wording_check(std::shared_ptr<const guard::WordingChecker> checker,
                                 const casefile::Propositions& propositions);

// Every text of the model in reading order: paragraphs, table cells that hold words (not only
// numbers), chart captions; not the text of a quoted paragraph (its label is read).
std::vector<CheckedText> report_texts(const ReportModel& model);

// The report is refused: the flags that stop it, each with where it is and what to do.
class ReportRefused : public validation::InvalidValue {
 public:
  ReportRefused(std::vector<WordingFlag> flags, std::vector<CheckedText> texts, std::string message);
  const std::vector<WordingFlag>& flags() const noexcept { return flags_; }
  const std::vector<CheckedText>& texts() const noexcept { return texts_; }

 private:
  std::vector<WordingFlag> flags_;
  std::vector<CheckedText> texts_;
};

// Checks each quoted review note of `model` (a paragraph whose source is quoted, field
// kReviewNoteField) on its own and inserts beneath it a note of what the check found (or that
// it found nothing). A quoted text never refuses the report: it is the reviewer's statement,
// which the report quotes and does not adopt (docs/report.md, "Review notes"). Returns the number
// of notes checked.
std::size_t annotate_quoted_texts(ReportModel& model, const WordingCheck& check);

// Runs annotate_quoted_texts, then checks every other text of `model` (report_texts leaves quoted
// texts out) and inserts the "wording" section (before any appendix).
// `checker_description` names the checker in that section. What a flag does is decided by
// guard::flag_outcome (core/guard/report_readiness, shared with `validate`). Throws ReportRefused
// when the program's own text is flagged (a defect to report), or, in casework mode, when user
// text is flagged and no override covers it; throws validation::InvalidValue for bad "report"
// settings.
void apply_wording_check(ReportModel& model, const casefile::Case& value, const WordingCheck& check,
                         const std::string& checker_description);

}  // namespace counterpoise::reports
