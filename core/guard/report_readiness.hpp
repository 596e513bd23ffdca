#pragma once
// Whether the wording check will let a report be issued. One decision, used by `report` (the
// wording check of reports/report_wording) and by `validate`, so that the two commands agree: a
// statement that will make `report` refuse a casework report makes `validate` fail too
// (docs/reasoning-guard.md, "Validate and report agree").
//
// The rule (docs/report.md, "Wording check and overrides"): a statement counts when the checker
// flags it as the author's own (asserted, not reported, refuted or quoted) with severity error or
// warning. Such a statement in the program's own text always refuses the report (a defect); in
// the user's text it is let stand by an override naming its rule and item, and otherwise refuses
// a casework report and is listed in a training report.

#include <string>
#include <string_view>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/guard/wording_overrides.hpp"

namespace counterpoise::guard {

// Where a text of a report comes from: a field of the user's case file, or the program itself.
struct TextOrigin {
  bool from_user = false;
  std::string item;   // "case", "propositions", an item id; for the program's text, the item it describes or empty
  std::string field;  // "purpose", "hp", "description", ...; empty for the program's text
  // Someone else's words quoted by the report (a reviewer's note): checked and printed with what
  // the check finds, never refused or overridden, because the report does not state them.
  bool quoted = false;
};

// What the report does with a statement that counts against it.
enum class FlagOutcome { refuses, overridden, kept_for_training };

// True when the report's wording check counts `finding` against the report: asserted, and an
// error or a warning. Never throws.
bool counts_against_report(const WordingFinding& finding);

// The outcome for a counted statement of rule `rule_id` in a text from `origin`, in a report of
// `mode`, with the case's `overrides` (see the rule above). Never throws.
FlagOutcome flag_outcome(const TextOrigin& origin, std::string_view rule_id, CheckMode mode,
                         const std::vector<WordingOverride>& overrides);

// A piece of user text as the report prints it in a paragraph: trailing spaces and line breaks
// removed and a full stop added unless it ends with ".", "?" or "!". Never throws.
std::string as_report_sentence(std::string text);

// A text of the user's case as a report prints it.
struct UserText {
  TextOrigin origin;  // from_user is true
  std::string text;
};

// Every text of `value` that a report prints, as printed and in reading order: the case title
// (its reference when it has none), reference, laboratory, examiner, date, requested_by and
// purpose; Hp, Hd (with several alternatives to Hp: each alternative's text instead, the field
// named by alternative_text_field), the conditioning information and each assumption; each item's title,
// description, source_data, notes and, for an item left out of the combination, its exclusion
// reason; and, when more than one item is combined, each combined item's independence statement.
// Never throws.
std::vector<UserText> report_user_texts(const casefile::Case& value);

// The field that names the text of alternative `index` (0-based) to Hp: "alternatives[1].text".
std::string alternative_text_field(std::size_t index);

// A statement of the user's text that makes `report` refuse the report.
struct RefusingStatement {
  std::string item;
  std::string field;
  std::string sentence;  // the sentence that holds the flagged words
  std::string rule_id;
  std::string family_name;
  std::string suggestion;
};

// The statements of `value`'s own texts (report_user_texts) that would make a report of `mode`
// be refused, in reading order: checked with `checker` (the propositions fill the suggested
// rewrite) and the case's overrides. Empty in training mode. Throws validation::InvalidValue for
// a "report" section whose overrides are invalid (read_wording_overrides) and for text that is
// not well-formed UTF-8 (WordingChecker::check).
std::vector<RefusingStatement> statements_refusing_report(const casefile::Case& value, const WordingChecker& checker,
                                                          CheckMode mode);

// The mode a report on `value` is written in unless the command asks for another: the case's own
// mode (casework when it sets none). Never throws.
CheckMode default_report_mode(const casefile::Case& value);

// What both commands advise after listing refusing statements of the user's text.
inline constexpr std::string_view kRewordOrOverride =
    "Reword the text, or record an override with a reason in the case's \"report\" section "
    "(\"wording_overrides\": [{\"rule\": ..., \"item\": ..., \"reason\": ...}]).";

// "item E1, field notes".
std::string user_text_place(std::string_view item, std::string_view field);

// How both commands describe one refusing statement: `place` (user_text_place, or where the
// program's text is), rule, family and sentence on one line, and the suggested wording on a
// second line when there is one. No trailing line break. Never throws.
std::string describe_refusing_statement(std::string_view place, const RefusingStatement& statement);

}  // namespace counterpoise::guard
