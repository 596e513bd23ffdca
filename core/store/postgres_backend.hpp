#pragma once
// The shared back end: one case among a laboratory's cases in a PostgreSQL database, reached
// through libpq (postgres_connection.hpp), in the tables of postgres_schema.hpp. The database
// decides who reads and writes a case (row-level security keyed on the role); this back end
// records the database role as the audit rows' account. Writes take the case's row lock
// (SELECT ... FOR UPDATE), so edits by several people are serialised; reads of the head and of
// verify run in one repeatable-read snapshot, so they never mix two states.

#include <memory>
#include <string>
#include <vector>

#include "core/store/case_store.hpp"
#include "core/store/store_backend.hpp"

namespace counterpoise::store {

class PgConnection;
class PgResult;
struct PgParam;

class PostgresBackend final : public StoreBackend {
 public:
  // Connects and checks that the database holds a store of this program's version and that
  // the case exists and the role may read it (else validation::FileError "no case ... that
  // role ... may read").
  static std::unique_ptr<PostgresBackend> open(const DatabaseCase& address, OpenMode mode,
                                               const StoreOptions& options);
  // Connects for creating the case (which must not exist yet).
  static std::unique_ptr<PostgresBackend> open_new(const DatabaseCase& address,
                                                   const StoreOptions& options);
  // Writes the case's first rows in one transaction; the role becomes its examiner. Throws
  // validation::FileError when a case with the reference exists.
  void create_case(const CaseState& state, const AuditRow& import_row);

  ~PostgresBackend() override;

  const std::string& where() const override { return where_; }
  const std::string& account() const override { return role_; }
  std::optional<std::string> edit_refusal() override;
  bool has_members() const override { return true; }
  std::optional<std::string> member_role(const std::string& member) override;
  bool prepare_for_editing() override { return false; }

  std::map<std::string, std::string> sections() override;
  std::vector<StoredItem> items() override;
  std::optional<AuditRow> last_audit_row() override;
  void each_audit_row(const std::function<void(const AuditRow&)>& visit) override;
  std::optional<AuditRow> audit_row(std::int64_t seq) override;
  std::vector<std::string> new_values_of(const char* action) override;
  std::vector<StoredRevision> revisions(bool with_content) override;
  std::optional<std::string> sealed_state_json(std::int64_t revision) override;
  std::optional<std::string> sealed_report_bytes(std::int64_t revision) override;
  std::string chain_head() override;
  void begin_snapshot() override;
  void end_snapshot() noexcept override;

  void begin_write() override;
  void commit_write() override;
  void rollback_write() noexcept override;
  bool changed_since_verified() override { return !verified_; }
  void mark_verified() override { verified_ = true; }
  void insert_audit_row(const AuditRow& row) override;
  void insert_revision(std::int64_t revision, std::int64_t opened_seq) override;
  void put_section(const std::string& name, const std::string& body) override;
  void delete_section(const std::string& name) override;
  void insert_item(const StoredItem& item) override;
  void update_item(const StoredItem& item) override;
  void delete_item(const std::string& id) override;
  void seal_revision(const SealedRevisionRecord& record) override;
  void write_chain_head(std::int64_t seq, const std::string& hash) override;

 private:
  PostgresBackend(const DatabaseCase& address, const StoreOptions& options);
  // Runs a writing statement; a refusal on the role's rights is reported as such.
  PgResult write(const char* sql, const std::vector<PgParam>& params);

  std::unique_ptr<PgConnection> db_;
  std::string reference_;
  std::string where_;
  std::string role_;
  bool verified_ = false;
  int snapshot_depth_ = 0;
  bool in_write_ = false;
};

}  // namespace counterpoise::store
