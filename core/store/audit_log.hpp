#pragma once
// The audit log of a case: one row per change, chained by SHA-256 (FIPS 180-4).
//
// Row hash (docs/case-store.md, "Hash chain"):
//   hash(row) = SHA-256( canonical_text({["account"],"action","at","entity","examiner","field",
//                                        "key","new","old","prev","revision","seq"}) )
// where "old"/"new" are the stored canonical JSON texts as JSON strings (null when absent),
// "prev" is the previous row's hash (64 zeros for the first row), and canonical_text sorts
// members and writes no white space. "account" (the operating-system account) is a member only
// for rows that record one: rows written by schema version 1 do not, and keep their hashes, so
// a file upgraded in place keeps a valid chain. Replaying the rows from the first ("import")
// rebuilds the case state; each row must fit the state it is applied to.

#include <cstdint>
#include <map>
#include <optional>
#include <set>
#include <string>
#include <utility>

#include <nlohmann/json.hpp>

#include "core/store/case_state.hpp"

namespace counterpoise::store {

// The prev hash of the first row.
inline const std::string kGenesisHash(64, '0');

// Actions, as written in the audit's `action` column.
namespace action {
inline constexpr const char* import_case = "import";  // entity case, field import, new = document
inline constexpr const char* set_field = "set";       // entity section/item, old/new = values
inline constexpr const char* add_item = "add";        // new = {"item": body, "position": p}
inline constexpr const char* remove_item = "remove";  // old = {"item": body, "position": p}
inline constexpr const char* move_item = "move";      // field position, old = p, new = q
inline constexpr const char* open_revision =
    "open-revision";  // field revision, old = n, new = n + 1
inline constexpr const char* seal =
    "seal";  // field seal, new = {report_examiner, report_file_name, report_sha256, revision,
             // sealer_role, state_sha256} (report_examiner and sealer_role from version 2 on)
// Rows that record something about the case without changing its content; they may follow a
// seal without opening a new revision.
inline constexpr const char* upgrade_format =
    "upgrade-format";  // field format, old = schema version before, new = after
inline constexpr const char* declare_reviewer =
    "declare-reviewer";  // field reviewer, new = the reviewer's name (a JSON string)
inline constexpr const char* review =
    "review";  // field review, new = {note, revision, verdict} (review_note.hpp)
inline constexpr const char* change_member =
    "member";  // field member, old/new = the membership before and after (membership_change.hpp)
}  // namespace action

// True for the actions above that do not change the case and never open a revision.
bool is_annotation(const std::string& action);

struct AuditRow {
  std::int64_t seq = 0;       // 1, 2, 3, ... without gaps
  std::int64_t revision = 0;  // the revision the change belongs to
  std::string at;             // UTC, ISO 8601 with milliseconds: 2026-12-01T21:47:02.123Z
  std::string examiner;                // the declared name ("" only on an upgrade-format row)
  std::optional<std::string> account;  // the operating-system account; nullopt on version 1 rows
  std::string action;
  std::string entity;  // "case", "section" or "item"
  std::string key;     // section name or item id ("" for the case)
  std::string field;
  std::optional<std::string> old_value;  // canonical JSON text; nullopt: absent
  std::optional<std::string> new_value;
  std::string prev_hash;
  std::string hash;
};

// The hash of `row` as defined above (ignores row.hash). Throws std::runtime_error only if
// libcrypto fails.
std::string audit_row_hash(const AuditRow& row);

// Replays audit rows onto a case state, checking that each one fits.
class AuditReplay {
 public:
  AuditReplay() = default;
  // Continues a replay from a known state (used by the store to check a new row before writing).
  AuditReplay(CaseState state, std::int64_t revision, bool sealed, std::int64_t rows,
              bool records_accounts, std::set<std::string> reviewers,
              std::map<std::string, std::optional<std::string>> recorded_roles = {})
      : state_(std::move(state)),
        revision_(revision),
        sealed_(sealed),
        rows_(rows),
        records_accounts_(records_accounts),
        reviewers_(std::move(reviewers)),
        recorded_roles_(std::move(recorded_roles)) {}

  // Applies `row`. Throws validation::InvalidValue with the reason when the row does not fit:
  // a first row that is not an import, an import later on, an old value that differs from the
  // state, a change inside a sealed revision, a revision number out of step, a seal whose state
  // digest differs from the replayed state, or a value that is not canonical JSON. For rows that
  // record an account (version 2 on) also: a row without an account after one with, an account
  // first recorded by a row that is neither the import nor a format upgrade, an empty examiner,
  // a reviewer declared by anyone but the case's examiner, a seal by someone who is neither
  // the case's examiner nor a declared reviewer, or that does not name both, and a review note
  // by someone not declared a reviewer or on a revision that is not sealed. And a membership row
  // that is malformed (membership_change_of) or whose old role is not the role the last
  // membership row about the same member gave it.
  void apply(const AuditRow& row);

  const CaseState& state() const { return state_; }
  std::int64_t revision() const { return revision_; }
  bool sealed() const { return sealed_; }
  std::int64_t rows() const { return rows_; }
  bool records_accounts() const { return records_accounts_; }
  const std::set<std::string>& reviewers() const { return reviewers_; }
  // Each member a membership row named, with the role the last such row gave it (nullopt: no
  // longer a member). Members never named by a row (the case's creator; memberships set
  // before the store recorded them) are absent.
  const std::map<std::string, std::optional<std::string>>& recorded_roles() const {
    return recorded_roles_;
  }

 private:
  void apply_annotation(const AuditRow& row, const std::optional<nlohmann::json>& old_value,
                        const std::optional<nlohmann::json>& new_value);
  void check_seal_people(const AuditRow& row, const nlohmann::json& seal) const;

  CaseState state_;
  std::int64_t revision_ = 0;
  bool sealed_ = false;
  std::int64_t rows_ = 0;
  bool records_accounts_ = false;
  std::set<std::string> reviewers_;
  std::map<std::string, std::optional<std::string>> recorded_roles_;
};

// The report's examiner: the case section's "examiner" member without surrounding white space,
// or nullopt when the case names none.
std::optional<std::string> case_examiner(const CaseState& state);

// How a sealer relates to the report: "examiner" (the case's examiner) or "reviewer" (declared).
inline constexpr const char* kSealerIsExaminer = "examiner";
inline constexpr const char* kSealerIsReviewer = "reviewer";

// The canonical text of the current state, the form sealed and exported.
std::string state_text(const CaseState& state);

// UTC now in the audit's timestamp form.
std::string utc_timestamp_now();

}  // namespace counterpoise::store
