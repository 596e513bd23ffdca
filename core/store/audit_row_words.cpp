#include "core/store/audit_row_words.hpp"

#include <optional>

#include "core/casefile/field_names.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/membership_change.hpp"
#include "core/store/review_note.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

namespace {

std::string stored(const std::optional<std::string>& value) { return value.value_or(""); }

// A stored value read as JSON, or nullopt when it does not read (it is shown as stored).
std::optional<nlohmann::json> read_value(const AuditRow& row, const std::optional<std::string>& value) {
  if (!value) return std::nullopt;
  try {
    return reading::parse_json_text(*value, "audit row " + std::to_string(row.seq));
  } catch (const validation::Error&) {
    return std::nullopt;
  }
}

std::optional<std::string> string_member(const nlohmann::json& value, const char* name) {
  if (!value.is_object() || !value.contains(name) || !value[name].is_string()) return std::nullopt;
  return value[name].get<std::string>();
}

AuditRowWords review_words(const AuditRow& row, AuditRowWords words) {
  try {
    const ReviewNote note = review_note_of(row);
    words.who = row.examiner + " (reviewer)";
    words.action = "review note";
    words.place = "sealed revision " + std::to_string(note.revision);
    words.new_value = std::string(review_verdict_name(note.verdict)) +
                      (note.note.empty() ? "" : ": \u201c" + note.note + "\u201d");
  } catch (const validation::Error&) {
    words.action = "review note (does not read)";
  }
  return words;
}

AuditRowWords seal_words(const AuditRow& row, AuditRowWords words) {
  words.action = "sealed";
  words.place = "revision " + std::to_string(row.revision);
  const auto value = read_value(row, row.new_value);
  if (!value) return words;
  const auto file = string_member(*value, "report_file_name");
  const auto examiner = string_member(*value, "report_examiner");
  if (!file) return words;
  words.new_value = "report " + *file + (examiner && !examiner->empty() ? ", the report of " + *examiner : "");
  return words;
}

AuditRowWords membership_words(const AuditRow& row, AuditRowWords words) {
  try {
    const MembershipChange change = membership_change_of(row);
    words.action = !change.old_role   ? "added a member"
                   : !change.new_role ? "ended a membership"
                                      : "changed a member's role";
    words.place = "member " + change.member;
    words.old_value = change.old_role.value_or("not a member");
    words.new_value = change.new_role.value_or("not a member") + " (operating-system account " +
                      change.os_account + ")";
  } catch (const validation::Error&) {
    words.action = "membership change (does not read)";
  }
  return words;
}

}  // namespace

AuditRowWords audit_row_words(const AuditRow& row) {
  AuditRowWords words{row.examiner.empty() ? "(program)" : row.examiner, casefile::action_words(row.action),
                      casefile::change_place_words(row.entity, row.key, row.field), stored(row.old_value),
                      stored(row.new_value)};
  if (row.action == action::review) return review_words(row, words);
  if (row.action == action::seal) return seal_words(row, words);
  if (row.action == action::change_member) return membership_words(row, words);
  if (row.action == action::declare_reviewer) {
    words.action = "declared a reviewer";
    words.place = "reviewers";
    const auto value = read_value(row, row.new_value);
    if (value && value->is_string()) words.new_value = value->get<std::string>();
  } else if (row.action == action::upgrade_format) {
    words.action = "upgraded the file format";
    words.place = "file format";
  } else if (row.action == action::open_revision) {
    words.place = "revision";
  }
  return words;
}

}  // namespace counterpoise::store
