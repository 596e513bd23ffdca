#pragma once
// A review note: a declared reviewer's verdict on a sealed revision, recorded as a `review`
// audit row that changes nothing in the case (docs/case-store.md, "Review notes").

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

#include <nlohmann/json.hpp>

namespace counterpoise::store {

struct AuditRow;

enum class ReviewVerdict { agree, disagree, comment };

// "agree", "disagree", "comment": the words stored and shown.
const char* review_verdict_name(ReviewVerdict verdict);
// The verdict with that name, or nullopt.
std::optional<ReviewVerdict> review_verdict_from_name(std::string_view name);

inline constexpr std::size_t kMaxReviewNoteBytes = 10000;

struct ReviewNote {
  std::int64_t seq = 0;       // the audit row
  std::int64_t revision = 0;  // the sealed revision reviewed
  std::string at;
  std::string reviewer;  // declared name
  std::string account;   // operating-system account
  ReviewVerdict verdict = ReviewVerdict::comment;
  std::string note;
};

// Throws validation::InvalidValue (item "review", field "note") unless `note` is at most
// kMaxReviewNoteBytes bytes of valid UTF-8 without control characters other than line breaks
// and tabs, and not empty when the verdict is disagree or comment (a reviewer says why).
void check_review_note(ReviewVerdict verdict, const std::string& note);

// The stored value of a review row: {"note", "revision", "verdict"}.
nlohmann::json review_value(std::int64_t revision, ReviewVerdict verdict, const std::string& note);

// The note a `review` row records. Throws validation::InvalidValue when its value is malformed
// (not an object with a whole revision, a known verdict and a note that passes the check above).
ReviewNote review_note_of(const AuditRow& row);

}  // namespace counterpoise::store
