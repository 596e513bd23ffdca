#pragma once
// The single-file back end: one SQLite database per case (.cpcase), as described in
// docs/case-store.md ("Schema", "Connection settings and why", "Trust model"). It checks a
// file before SQLite touches it, takes the edit lock, upgrades older files when opened for
// editing, and records who holds the file in its session table.

#include <filesystem>
#include <memory>
#include <string>

#include "core/store/case_store.hpp"
#include "core/store/store_backend.hpp"

namespace counterpoise::store {

class Connection;
class EditLock;

class SqliteBackend final : public StoreBackend {
 public:
  // Opens an existing case file: header, edit lock (for editing), schema, pragmas and
  // integrity check, with the errors CaseStore::open documents.
  static std::unique_ptr<SqliteBackend> open(const std::filesystem::path& path, OpenMode mode,
                                             const StoreOptions& options);
  // Creates `path` (which must not exist) holding `state` and its import row, with the case
  // content file mode; the file appears only complete (built under a temporary name, then
  // linked into place). Throws validation::FileError when the file exists or cannot be written.
  static void create_file(const std::filesystem::path& path, const CaseState& state,
                          const AuditRow& import_row);

  ~SqliteBackend() override;

  const std::filesystem::path& path() const { return path_; }

  const std::string& where() const override { return where_; }
  const std::string& account() const override { return account_; }
  bool prepare_for_editing() override;

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

  void begin_write() override;
  void commit_write() override;
  void rollback_write() noexcept override;
  bool changed_since_verified() override;
  void mark_verified() override;
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
  SqliteBackend() = default;
  void configure(bool writable);
  void record_upgrade(std::int64_t from, std::int64_t to);
  void write_session();
  std::string in_use_message() const;

  std::filesystem::path path_;
  std::string where_;
  std::string account_;
  StoreOptions options_;
  std::int64_t version_ = 0;  // the file's schema version (1 files have no account column)
  // Declared before the connection so that it is destroyed after it (see edit_lock.hpp).
  std::unique_ptr<EditLock> lock_;
  std::unique_ptr<Connection> db_;
  // PRAGMA data_version when the file last passed verify (-1: not yet).
  std::int64_t verified_data_version_ = -1;
  bool in_write_ = false;
};

}  // namespace counterpoise::store
