#include "core/casefile/issue_checklist.hpp"

#include <algorithm>

#include "core/casefile/item_templates.hpp"

namespace counterpoise::casefile {

namespace {

bool blank(const std::optional<std::string>& text) {
  return !text || text->find_first_not_of(" \t\r\n") == std::string::npos;
}

ChecklistPoint open_point(std::string item, std::string field, std::string message) {
  return {ChecklistPoint::Severity::open_point, std::move(item), std::move(field), std::move(message)};
}

}  // namespace

std::string sealing_explanation() {
  return "Issuing seals the current revision of the case: its state and the report's bytes are recorded with their "
         "SHA-256 digests and can no longer be changed. Later edits make a new revision, and the issued report stays "
         "tied to the sealed one.";
}

std::vector<ChecklistPoint> issue_checklist(const Case& value, bool casework) {
  std::vector<ChecklistPoint> points;
  if (casework && value.mode_or_default() == CaseMode::training)
    points.push_back({ChecklistPoint::Severity::blocks, "case", "mode",
                      "The case is marked as a training case; a casework report cannot be issued from it."});
  const auto& d = value.details;
  if (blank(d.laboratory)) points.push_back(open_point("case", "laboratory", "The laboratory is not recorded."));
  if (blank(d.examiner)) points.push_back(open_point("case", "examiner", "The examiner is not recorded."));
  if (blank(d.date)) points.push_back(open_point("case", "date", "The date of the evaluation is not recorded."));
  if (blank(d.purpose))
    points.push_back(open_point("case", "purpose", "The question the laboratory was asked is not recorded."));
  if (!casework) return points;

  const auto included = std::count_if(value.items.begin(), value.items.end(), [](const Item& i) { return i.included(); });
  for (const auto& item : value.items) {
    if (holds_starting_fields(item))
      points.push_back(open_point(item.id, "model", "Item " + item.id +
                                                        " still holds the starting values of a new item; its inputs "
                                                        "have not been entered."));
    if (blank(item.description))
      points.push_back(open_point(item.id, "description", "Item " + item.id + " has no description of the findings."));
    if (included > 1 && item.included() && (!item.combination || blank(item.combination->independence)))
      points.push_back(open_point(item.id, "combination.independence",
                                  "Item " + item.id +
                                      " is combined with other items but no reason is recorded for treating it as "
                                      "independent of them."));
  }
  return points;
}

bool blocks_issuing(const std::vector<ChecklistPoint>& points) {
  return std::any_of(points.begin(), points.end(),
                     [](const ChecklistPoint& p) { return p.severity == ChecklistPoint::Severity::blocks; });
}

}  // namespace counterpoise::casefile
