#pragma once
// The case store: the current case state in entity tables, an append-only audit log chained by
// SHA-256, and sealed revisions. Kept either in one SQLite file per case (extension .cpcase) or
// as one case among a laboratory's cases in a PostgreSQL database (database_case.hpp); the
// chain, replay, sealing rules and verify are the same for both (store_backend.hpp).
// Format, guarantees and limits: docs/case-store.md.

#include <cstdint>
#include <filesystem>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/store/audit_log.hpp"
#include "core/store/case_state.hpp"
#include "core/store/database_case.hpp"
#include "core/store/examiner.hpp"
#include "core/store/review_note.hpp"
#include "core/store/seal_statement.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

inline constexpr const char* kCaseFileExtension = ".cpcase";

// Raised when another process holds the case open for editing. The message names the holder's
// account, process id, host and since when.
class CaseInUse : public validation::FileError {
 public:
  using validation::FileError::FileError;
};

// Raised when a case file opened for editing, or about to be written, fails verify(): nothing is
// written to it. The message names the first audit row that does not fit and the reason.
class CaseFailsVerification : public validation::FileError {
 public:
  using validation::FileError::FileError;
};

// Raised when an edit was made against a state of the case that is no longer the latest: someone
// else committed a change since this store read it. Nothing is written; the message names who
// changed what (the audit rows written since).
class CaseChanged : public validation::FileError {
 public:
  using validation::FileError::FileError;
};

// Every call that writes takes the declared name of the examiner making the change
// (ExaminerName); the store adds the operating-system account itself.
struct StoreOptions {
  // Called with the whole case document before an import or an edit is written; throws
  // (any std::exception) to refuse it. The exception's message reaches the caller unchanged.
  std::function<void(const nlohmann::json&)> validate;
  // How long to wait for another connection's lock before giving up, in milliseconds.
  int busy_timeout_ms = 5000;

  // Fault injection for tests: SQLite's max_page_count (a "disk" of that many pages) and a
  // connection that refuses every write (PRAGMA query_only), to simulate a full disk and a
  // read-only medium. Never set by the programs.
  std::optional<std::int64_t> testing_max_page_count;
  bool testing_refuse_writes = false;
};

enum class OpenMode {
  edit,       // takes the case's edit lock; CaseInUse if another process has it
  read_only,  // a view of the last committed state; never writes (unless SQLite must roll back
              // a transaction a crashed program left behind)
};

struct RevisionInfo {
  std::int64_t revision = 0;
  std::int64_t opened_seq = 0;              // the audit row that opened it
  std::optional<std::int64_t> sealed_seq;   // the seal row, when sealed
  std::string sealed_at, sealed_by;         // empty unless sealed; sealed_by is the declared name
  std::string sealed_by_account;            // the sealer's OS account (empty before version 2)
  std::string report_examiner;              // the report's examiner named by the seal (ditto)
  std::string sealer_role;                  // kSealerIsExaminer or kSealerIsReviewer (ditto)
  std::string state_sha256, report_sha256;  // empty unless sealed
  std::string report_file_name;
  // A signed seal's public key (hex of the raw key), signature (hex) and program; empty for an
  // unsigned seal (sealed without a key, or before seals were signed).
  std::string public_key, signature, program;
  bool sealed() const { return sealed_seq.has_value(); }
  bool signed_seal() const { return !signature.empty(); }
};

// A seal made ready before its report is rendered (CaseStore::prepare_seal): the rows it will
// write are fixed, so the report can print the signed statement and the chain head.
struct PreparedSeal {
  SealAnchor anchor;
  std::optional<AuditRow> open_revision;  // written first when the current revision is sealed
  std::int64_t after_seq = 0;             // the last audit row it was prepared on
  std::string after_hash;
  std::shared_ptr<const platform::Ed25519PrivateKey> key;  // null: an unsigned seal
};

// One seal as verify found it.
struct CheckedSeal {
  std::int64_t revision = 0, seq = 0;
  std::string sealer, sealed_at;
  std::string public_key;  // hex; "" for an unsigned seal
  bool signed_seal() const { return !public_key.empty(); }
};

struct VerifyProblem {
  std::int64_t seq = 0;  // the first audit row that does not fit (0: the file as a whole)
  std::string reason;
};

struct VerifyReport {
  std::int64_t rows_checked = 0;
  std::int64_t revisions = 0;
  std::vector<CheckedSeal> seals;        // every seal, in order (signatures checked by replay)
  std::optional<VerifyProblem> problem;  // the first one found
  bool ok() const { return !problem.has_value(); }
};

class CaseStore {
 public:
  // Creates `path` (which must not exist) holding `document` as its first audit row, imported
  // by `examiner`, with permissions 0600, and returns it open for editing. The file appears only
  // complete (built under a temporary name, then linked into place). Throws
  // validation::InvalidValue when the document is not a case or options.validate refuses it,
  // validation::FileError when the file exists or cannot be written.
  static CaseStore create(const std::filesystem::path& path, const nlohmann::json& document,
                          const ExaminerName& examiner, const StoreOptions& options = {});

  // Opens an existing case file. Before SQLite writes anything it checks the header (SQLite
  // magic, application_id, schema version, size) and runs PRAGMA integrity_check. Throws
  // validation::UnsupportedFormat for a file that is not a case file or is newer than this
  // program, validation::FileError for a damaged, truncated or unreadable file, CaseInUse
  // when opening for editing while another process edits it, CaseFailsVerification when opening
  // for editing a file that fails verify(). Leaves a refused file untouched.
  // Opening an older file for editing upgrades it in place (one transaction, recorded by an
  // upgrade-format audit row under the OS account); a read-only open reads it as it is.
  static CaseStore open(const std::filesystem::path& path, OpenMode mode,
                        const StoreOptions& options = {});

  // The same for a case in a PostgreSQL database (docs/case-store.md, "The shared store").
  // create: the reference must be new in the database; the connecting database role becomes
  // the case's first member, as examiner. open: reads what the role may read (row-level
  // security: members of the case only); a case the role may not read is reported as not
  // found. Both throw validation::FileError when the server cannot be reached or refuses (the
  // message never holds a password), validation::UnsupportedFormat when the database holds no
  // case store of this program's schema version, CaseFailsVerification as for a file. Several
  // people may edit one case at once: edits are serialised by the database, and an edit based
  // on a state someone else has changed since is refused with CaseChanged.
  static CaseStore create(const DatabaseCase& address, const nlohmann::json& document,
                          const ExaminerName& examiner, const StoreOptions& options = {});
  static CaseStore open(const DatabaseCase& address, OpenMode mode,
                        const StoreOptions& options = {});

  CaseStore(CaseStore&&) noexcept;
  CaseStore& operator=(CaseStore&&) noexcept;
  ~CaseStore();

  // The current case as a document (sections and items), and as canonical JSON text.
  nlohmann::json document() const;
  std::string export_canonical() const;
  const CaseState& state() const;

  // Edits by `examiner`: each is one transaction writing the change and its audit row (and,
  // when the current revision is sealed, first an "open-revision" row). Each returns the audit
  // seq of the change. Throw validation::InvalidValue when the edit does not apply (unknown
  // item, id change, bad position) or options.validate refuses the result,
  // validation::FileError when the file cannot be written (disk full, read-only) — the file
  // then stays at its last committed state —, CaseFailsVerification when the file was changed
  // by another program since it was verified and no longer verifies, and std::logic_error on a
  // store opened read-only. Each write is preceded by a verify walk when (and only when) another
  // connection changed the file since the last one.
  std::int64_t set_field(const ExaminerName& examiner, const EntityRef& entity,
                         const std::string& field, const std::optional<nlohmann::json>& value);
  std::int64_t add_item(const ExaminerName& examiner, const nlohmann::json& item,
                        std::optional<std::size_t> position = std::nullopt);
  std::int64_t remove_item(const ExaminerName& examiner, const std::string& id);
  std::int64_t move_item(const ExaminerName& examiner, const std::string& id,
                         std::size_t position);

  // The case's examiner declares `reviewer` a reviewer of this case (an audit row; the case's
  // content and revision are unchanged). Returns the audit seq. Throws validation::InvalidValue
  // when the case names no examiner (case.examiner), `examiner` is not that examiner, the
  // reviewer is the examiner or already declared; otherwise as the edits do.
  std::int64_t declare_reviewer(const ExaminerName& examiner, const ExaminerName& reviewer);
  // The declared reviewers, in name order.
  std::vector<std::string> reviewers() const;

  // An examiner of a case in a database makes `member` (a database role) a member of it in
  // `role` (member_role: examiner, reviewer or reader), changes its role, or, with nullopt,
  // ends its membership: one `member` audit row (membership_change.hpp) naming `examiner`, the
  // database role and the operating-system account, the case's content and revision unchanged.
  // The database applies the row to its members table and refuses it unless the connected role
  // is an examiner of the case (StoreAccessDenied), and refuses to leave the case without an
  // examiner (FileError). Returns the audit seq. Throws validation::InvalidValue for a case
  // file (it has no members), an unknown member role or database role, or a change that
  // changes nothing; otherwise as the edits do.
  std::int64_t change_membership(const ExaminerName& examiner, const std::string& member,
                                 const std::optional<std::string>& role);

  // `sealer` seals the current revision with the report that was issued from it: stores the
  // state as canonical JSON, its SHA-256, the report bytes and their SHA-256; the seal row names
  // the sealer and the report's examiner. Opens a new revision first when the current one is
  // already sealed. Returns the sealed revision. Throws validation::InvalidValue when the case
  // names no examiner or the sealer is neither that examiner nor a declared reviewer; otherwise
  // as the edits do.
  // This form makes an unsigned seal (recorded and reported as unsigned); the command line and
  // a laboratory's practice sign seals with the two calls below.
  RevisionInfo seal_revision(const ExaminerName& sealer, std::string_view report_bytes,
                             const std::string& report_file_name);
  // A signed seal in two steps, because the report prints its signature: prepare_seal fixes the
  // seal's time, revision and chain head and signs the seal statement with `key` (null: an
  // unsigned seal, on purpose); the report is rendered with prepared.anchor; seal_revision then
  // writes exactly the prepared rows, with the report's digest and a second signature over it.
  // Throws as seal_revision does; the second call throws CaseChanged when the store moved on
  // since prepare_seal (nothing is written: prepare and render again).
  PreparedSeal prepare_seal(const ExaminerName& sealer,
                            std::shared_ptr<const platform::Ed25519PrivateKey> key) const;
  RevisionInfo seal_revision(const PreparedSeal& prepared, std::string_view report_bytes,
                             const std::string& report_file_name);
  // A declared reviewer adds a review note on sealed revision `revision`: an audit row naming
  // the reviewer and the account, which changes nothing in the case or the revision. Returns the
  // audit seq. Throws validation::InvalidValue when `reviewer` is not a declared reviewer, the
  // revision is not sealed, or the note fails check_review_note; otherwise as the edits do.
  std::int64_t add_review_note(const ExaminerName& reviewer, std::int64_t revision,
                               ReviewVerdict verdict, const std::string& note);
  // Every review note, in the order written (for the history, the editor and the report).
  std::vector<ReviewNote> review_notes() const;

  // The role `sealer` would seal in (kSealerIsExaminer or kSealerIsReviewer), checked before a
  // report is made. Throws validation::InvalidValue as seal_revision does for the people.
  std::string sealer_role(const ExaminerName& sealer) const;
  // The most recently sealed revision, or nullopt when none is.
  std::optional<RevisionInfo> latest_seal() const;
  // The stored report bytes and state text of a sealed revision. Throw validation::InvalidValue
  // when the revision does not exist or is not sealed.
  std::string sealed_report_bytes(std::int64_t revision) const;
  std::string sealed_state_text(std::int64_t revision) const;

  // History.
  std::vector<RevisionInfo> revisions() const;
  std::vector<AuditRow> audit_rows() const;
  std::int64_t current_revision() const;
  // Who is recorded in every row this store writes: the operating-system account this program
  // runs under (a file), or the database role it connected as (a database).
  const std::string& account() const;
  // Why the case's content cannot be edited through this store although it was opened for
  // editing, or nullopt: a case in a database whose connecting role is a reviewer or reader of
  // it (the database would refuse every edit). A file's lock is settled when it is opened.
  std::optional<std::string> edit_refusal() const;
  // The case file; empty for a case in a database.
  const std::filesystem::path& path() const;
  // Where the case is, as messages name it: the file's path, or the database and reference.
  const std::string& where() const;

  // Re-walks the hash chain, replays the audit from the import and compares the result with the
  // entity tables and the sealed revisions; reports the first row that does not fit.
  // Throws validation::FileError only when the file cannot be read.
  VerifyReport verify() const;

 private:
  struct Impl;
  explicit CaseStore(std::unique_ptr<Impl> impl);
  std::unique_ptr<Impl> impl_;
};

// True when the file starts with the SQLite header and carries our application_id.
bool is_case_file(const std::filesystem::path& path);

}  // namespace counterpoise::store
