#pragma once
// Where a case store keeps its tables: one SQLite file per case (sqlite_backend.hpp) or one
// case among many in a PostgreSQL database (postgres_backend.hpp). A back end only stores and
// fetches rows; everything that gives them meaning — building and checking audit rows, the hash
// chain, replay, sealing rules and verify — is CaseStore's, the same for both, so a chain
// written through either verifies identically (docs/case-store.md, "Two back ends").

#include <cstdint>
#include <functional>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/store/audit_log.hpp"

namespace counterpoise::store {

// One row of the items table as stored.
struct StoredItem {
  std::string id;
  std::int64_t position = 0;
  std::string body;
};

// One row of the revisions table as stored (the seal columns empty until sealed).
struct StoredRevision {
  std::int64_t revision = 0;
  std::int64_t opened_seq = 0;
  std::optional<std::int64_t> sealed_seq;
  std::string sealed_at, sealed_by;
  std::string state_json, state_sha256;
  std::string report_file_name, report_bytes, report_sha256;
};

// What sealing writes into the sealed revision's row.
struct SealedRevisionRecord {
  std::int64_t revision = 0;
  std::int64_t sealed_seq = 0;
  std::string sealed_at, sealed_by;
  std::string state_json, state_sha256;
  std::string report_file_name, report_bytes, report_sha256;
};

class StoreBackend {
 public:
  virtual ~StoreBackend() = default;

  // The start of every message about this store: the file's path, or the database and case
  // reference (never a password).
  virtual const std::string& where() const = 0;
  // Who is recorded in the audit rows this program writes: the operating-system account for a
  // file, the database role for a database.
  virtual const std::string& account() const = 0;
  // Called once when the store is opened for editing, after the caller has verified it: a file
  // is upgraded to the current schema and records who holds it. True when audit rows were
  // added (the caller then reads the head again).
  virtual bool prepare_for_editing() = 0;
  // Why this connection will not be let edit the case's content, or nullopt: a file says
  // nothing here (its lock decides when it is opened); a database says so for a member who is
  // not an examiner of the case (its reviewers and readers).
  virtual std::optional<std::string> edit_refusal() { return std::nullopt; }
  // True when the case has members with roles (a database); a file has none: whoever holds its
  // edit lock writes it.
  virtual bool has_members() const { return false; }
  // The role `member` holds in the case, nullopt when it is not a member. Throws
  // validation::InvalidValue when it is not a member and there is no database role of that
  // name; never called on a back end without members.
  virtual std::optional<std::string> member_role(const std::string& member) {
    (void)member;
    return std::nullopt;
  }

  // Reading. Each throws validation::FileError when the store cannot be read.
  virtual std::map<std::string, std::string> sections() = 0;  // name → canonical body
  virtual std::vector<StoredItem> items() = 0;                // by position, then id
  virtual std::optional<AuditRow> last_audit_row() = 0;
  // Every audit row in seq order, handed to `visit` one at a time.
  virtual void each_audit_row(const std::function<void(const AuditRow&)>& visit) = 0;
  virtual std::optional<AuditRow> audit_row(std::int64_t seq) = 0;
  // The stored new values of the audit rows with this action, in seq order.
  virtual std::vector<std::string> new_values_of(const char* action) = 0;
  // Every revision in order; the state and report columns only when `with_content`.
  virtual std::vector<StoredRevision> revisions(bool with_content) = 0;
  // The state text or report bytes of a sealed revision; nullopt when not sealed or absent.
  virtual std::optional<std::string> sealed_state_json(std::int64_t revision) = 0;
  virtual std::optional<std::string> sealed_report_bytes(std::int64_t revision) = 0;
  // The recorded end of the chain, "<last seq> <last hash>" (empty when missing).
  virtual std::string chain_head() = 0;
  // Reads between begin_snapshot() and end_snapshot() see one committed state, even while
  // others write (a file needs nothing: its edit lock keeps other writers out). Nest freely.
  virtual void begin_snapshot() {}
  virtual void end_snapshot() noexcept {}

  // Writing: between begin_write() (which takes the store's write lock, waiting for another
  // writer) and commit_write(); rollback_write() undoes everything since begin_write().
  virtual void begin_write() = 0;
  virtual void commit_write() = 0;
  virtual void rollback_write() noexcept = 0;
  // True when someone other than this connection may have changed the store since
  // mark_verified(), so it must be verified again before a write.
  virtual bool changed_since_verified() = 0;
  virtual void mark_verified() = 0;
  virtual void insert_audit_row(const AuditRow& row) = 0;
  virtual void insert_revision(std::int64_t revision, std::int64_t opened_seq) = 0;
  virtual void put_section(const std::string& name, const std::string& body) = 0;
  virtual void delete_section(const std::string& name) = 0;
  virtual void insert_item(const StoredItem& item) = 0;
  virtual void update_item(const StoredItem& item) = 0;
  virtual void delete_item(const std::string& id) = 0;
  // Fills the seal columns of an open revision; throws validation::FileError when the revision
  // is missing or already sealed.
  virtual void seal_revision(const SealedRevisionRecord& record) = 0;
  virtual void write_chain_head(std::int64_t seq, const std::string& hash) = 0;
};

// Reads of one committed state, for as long as the object lives.
class BackendSnapshot {
 public:
  explicit BackendSnapshot(StoreBackend& backend) : backend_(backend) { backend_.begin_snapshot(); }
  ~BackendSnapshot() { backend_.end_snapshot(); }
  BackendSnapshot(const BackendSnapshot&) = delete;
  BackendSnapshot& operator=(const BackendSnapshot&) = delete;

 private:
  StoreBackend& backend_;
};

// A write between begin_write() and commit(), rolled back when left without commit().
class BackendWrite {
 public:
  explicit BackendWrite(StoreBackend& backend) : backend_(backend) { backend_.begin_write(); }
  ~BackendWrite() {
    if (open_) backend_.rollback_write();
  }
  BackendWrite(const BackendWrite&) = delete;
  BackendWrite& operator=(const BackendWrite&) = delete;
  void commit() {
    backend_.commit_write();
    open_ = false;
  }

 private:
  StoreBackend& backend_;
  bool open_ = true;
};

}  // namespace counterpoise::store
