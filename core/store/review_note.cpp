#include "core/store/review_note.hpp"

#include <string>

#include "core/reading/json_text.hpp"
#include "core/store/audit_log.hpp"
#include "core/store/canonical_json.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

namespace {
const validation::Location kWhere{"review", "note"};
}  // namespace

const char* review_verdict_name(ReviewVerdict verdict) {
  switch (verdict) {
    case ReviewVerdict::agree:
      return "agree";
    case ReviewVerdict::disagree:
      return "disagree";
    case ReviewVerdict::comment:
      return "comment";
  }
  return "comment";
}

std::optional<ReviewVerdict> review_verdict_from_name(std::string_view name) {
  for (ReviewVerdict v : {ReviewVerdict::agree, ReviewVerdict::disagree, ReviewVerdict::comment})
    if (name == review_verdict_name(v)) return v;
  return std::nullopt;
}

void check_review_note(ReviewVerdict verdict, const std::string& note) {
  if (note.size() > kMaxReviewNoteBytes)
    throw validation::InvalidValue(kWhere, "the note is longer than " +
                                               std::to_string(kMaxReviewNoteBytes) + " bytes");
  try {
    canonical_text(nlohmann::json(note));
  } catch (const validation::Error&) {
    throw validation::InvalidValue(kWhere, "the note is not valid UTF-8 text");
  }
  for (const char c : note) {
    const auto byte = static_cast<unsigned char>(c);
    if ((byte < 0x20 && c != '\n' && c != '\t') || byte == 0x7f)
      throw validation::InvalidValue(kWhere, "the note holds a control character");
  }
  if (verdict != ReviewVerdict::agree && note.find_first_not_of(" \t\n") == std::string::npos)
    throw validation::InvalidValue(
        kWhere, std::string("a ") + review_verdict_name(verdict) + " needs a note saying why");
}

nlohmann::json review_value(std::int64_t revision, ReviewVerdict verdict, const std::string& note) {
  return {{"note", note}, {"revision", revision}, {"verdict", review_verdict_name(verdict)}};
}

ReviewNote review_note_of(const AuditRow& row) {
  // Stored in the file, so untrusted: read with the bounds of an imported case.
  nlohmann::json value;
  if (row.new_value) {
    try {
      value = reading::parse_json_text(*row.new_value, "audit row " + std::to_string(row.seq) + ", field new_value");
    } catch (const validation::Error& e) {
      throw validation::InvalidValue(kWhere, std::string("malformed review row: ") + e.what());
    }
  }
  if (!value.is_object() || value.size() != 3 || !value.contains("revision") ||
      !value["revision"].is_number_unsigned() || !value.contains("verdict") ||
      !value["verdict"].is_string() || !value.contains("note") || !value["note"].is_string())
    throw validation::InvalidValue(kWhere, "malformed review row");
  const auto verdict = review_verdict_from_name(value["verdict"].get<std::string>());
  if (!verdict) throw validation::InvalidValue(kWhere, "unknown review verdict");
  ReviewNote note;
  note.seq = row.seq;
  note.revision = value["revision"].get<std::int64_t>();
  note.at = row.at;
  note.reviewer = row.examiner;
  note.account = row.account.value_or("");
  note.verdict = *verdict;
  note.note = value["note"].get<std::string>();
  check_review_note(note.verdict, note.note);
  return note;
}

}  // namespace counterpoise::store
