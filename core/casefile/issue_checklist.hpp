#pragma once
// The checklist run before a casework report is issued and its revision sealed: what a reviewing
// scientist would send back (common practice of technical review: the case, the examiner, the date
// and each item's findings are stated; every combined item says why it is independent of the
// others). The command line prints it and the editor shows it in its issuing dialog; both refuse
// what blocks issuing.

#include <string>
#include <vector>

#include "core/casefile/case_model.hpp"

namespace counterpoise::casefile {

struct ChecklistPoint {
  enum class Severity {
    blocks,     // the report cannot be issued (a training case sent as casework)
    open_point  // issuing is allowed once the scientist has seen it and confirms
  };
  Severity severity = Severity::open_point;
  std::string item;     // "case", "propositions" or an item id
  std::string field;    // "date", "description", "combination.independence", ...
  std::string message;  // one sentence for the scientist
};

// What sealing a revision means, for the confirmation the scientist is asked for.
std::string sealing_explanation();

// The points for issuing `value` as a report of the given kind (`casework` false: a training
// report, for which only the missing case details are listed). Never throws (except bad_alloc).
std::vector<ChecklistPoint> issue_checklist(const Case& value, bool casework);

// True when any point blocks issuing.
bool blocks_issuing(const std::vector<ChecklistPoint>& points);

}  // namespace counterpoise::casefile
