#include "core/store/sqlite_backend.hpp"

#include <cerrno>
#include <cstring>

#include <sqlite3.h>
#include <unistd.h>

#include "core/platform/private_file.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_file_header.hpp"
#include "core/store/edit_lock.hpp"
#include "core/store/sqlite_connection.hpp"
#include "core/store/store_schema.hpp"

namespace counterpoise::store {

using validation::FileError;

namespace {

std::string host_name() {
  char buffer[256] = {};
  if (::gethostname(buffer, sizeof buffer - 1) != 0) return "unknown host";
  return buffer;
}

FileError file_error(const std::filesystem::path& path, const std::string& message) {
  return FileError({}, path.string() + ": " + message);
}

void remove_quietly(const std::filesystem::path& path) {
  std::error_code ec;
  std::filesystem::remove(path, ec);
  std::filesystem::remove(path.string() + "-journal", ec);
}

std::filesystem::path journal_of(const std::filesystem::path& path) {
  return path.string() + "-journal";
}

// Version 1 files have no account column: their queries read NULL there, so an old file can
// still be viewed and verified without being upgraded.
constexpr const char* kSelectAuditVersion2 =
    "SELECT seq, revision, at, examiner, action, entity, entity_key, field, old_value, new_value, "
    "prev_hash, hash, account FROM audit";
constexpr const char* kSelectAuditVersion1 =
    "SELECT seq, revision, at, examiner, action, entity, entity_key, field, old_value, new_value, "
    "prev_hash, hash, NULL FROM audit";

constexpr const char* kInsertAudit =
    "INSERT INTO audit(seq, revision, at, examiner, account, action, entity, entity_key, field, "
    "old_value, new_value, prev_hash, hash) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)";

void insert_audit(Connection& db, const AuditRow& row) {
  Statement insert(db, kInsertAudit);
  insert.bind(1, row.seq).bind(2, row.revision).bind(3, row.at).bind(4, row.examiner);
  insert.bind_optional(5, row.account).bind(6, row.action).bind(7, row.entity).bind(8, row.key);
  insert.bind(9, row.field).bind_optional(10, row.old_value).bind_optional(11, row.new_value);
  insert.bind(12, row.prev_hash).bind(13, row.hash);
  insert.run();
}

void write_head(Connection& db, std::int64_t seq, const std::string& hash) {
  Statement s(db, "INSERT OR REPLACE INTO meta(key, value) VALUES ('chain_head', ?)");
  s.bind(1, std::to_string(seq) + " " + hash).run();
}

AuditRow read_audit_row(const Statement& s) {
  AuditRow row;
  row.seq = s.column_int(0);
  row.revision = s.column_int(1);
  row.at = s.column_text(2);
  row.examiner = s.column_text(3);
  row.action = s.column_text(4);
  row.entity = s.column_text(5);
  row.key = s.column_text(6);
  row.field = s.column_text(7);
  row.old_value = s.column_optional_text(8);
  row.new_value = s.column_optional_text(9);
  row.prev_hash = s.column_text(10);
  row.hash = s.column_text(11);
  row.account = s.column_optional_text(12);
  return row;
}

}  // namespace

SqliteBackend::~SqliteBackend() {
  // The connection must close before the lock's descriptor (see edit_lock.hpp).
  db_.reset();
}

std::unique_ptr<SqliteBackend> SqliteBackend::open(const std::filesystem::path& path, OpenMode mode,
                                                   const StoreOptions& options) {
  check_case_file_header(path, kSchemaVersion);
  std::unique_ptr<SqliteBackend> backend(new SqliteBackend());
  backend->path_ = path;
  backend->where_ = path.string();
  backend->account_ = operating_system_account();
  backend->options_ = options;
  if (mode == OpenMode::edit) {
    backend->lock_ = std::make_unique<EditLock>(path);
    if (!backend->lock_->held())
      throw CaseInUse({}, path.string() + ": " + backend->in_use_message());
  }
  // A read-only view still needs write access when a crashed program left a journal to roll back.
  std::error_code ec;
  const bool journal = std::filesystem::file_size(journal_of(path), ec) > 0 && !ec;
  const bool writable = mode == OpenMode::edit;
  backend->db_ = std::make_unique<Connection>(
      path, writable || journal ? Connection::Access::read_write : Connection::Access::read_only);
  Connection& db = *backend->db_;
  db.set_busy_timeout(options.busy_timeout_ms);
  if (db.query_int("PRAGMA application_id") != kApplicationId)
    throw validation::UnsupportedFormat({},
                                        path.string() + ": not a case file (wrong application_id)");
  backend->version_ = db.query_int("PRAGMA user_version");
  if (backend->version_ < 1 || backend->version_ > kSchemaVersion)
    throw validation::UnsupportedFormat({}, path.string() + ": the case file has schema version " +
                                                std::to_string(backend->version_) +
                                                ", which this program does not read");
  // Before anything else touches the tables (even the pragmas that may write): the file's
  // structure must be exactly the program's own for its version.
  try {
    check_schema(db, schema_migrations(), backend->version_);
  } catch (const validation::UnsupportedFormat& e) {
    throw validation::UnsupportedFormat({}, path.string() + ": " + e.bare_message());
  }
  backend->configure(writable);
  const std::string check = db.query_text("PRAGMA integrity_check(5)");
  if (check != "ok")
    throw file_error(path, "the case file is damaged (integrity check: " + check + ")");
  return backend;
}

void SqliteBackend::configure(bool writable) {
  db_->set_busy_timeout(options_.busy_timeout_ms);
  db_->execute("PRAGMA foreign_keys = ON");
  if (writable) {
    // Rollback journal: the case stays one file at rest, and copying a closed case copies it
    // all. FULL: the journal and the file are synced at each commit (docs/case-store.md).
    db_->execute("PRAGMA journal_mode = DELETE");
    db_->execute("PRAGMA synchronous = FULL");
  } else {
    db_->execute("PRAGMA query_only = ON");
  }
}

bool SqliteBackend::prepare_for_editing() {
  bool upgraded = false;
  if (version_ < kSchemaVersion) {
    apply_migrations(*db_, schema_migrations(),
                     [this](std::int64_t from, std::int64_t to) { record_upgrade(from, to); });
    version_ = kSchemaVersion;
    upgraded = true;
  }
  write_session();
  if (options_.testing_max_page_count) {
    const std::string pragma =
        "PRAGMA max_page_count = " + std::to_string(*options_.testing_max_page_count);
    db_->execute(pragma.c_str());
  }
  if (options_.testing_refuse_writes) db_->execute("PRAGMA query_only = ON");
  return upgraded;
}

void SqliteBackend::record_upgrade(std::int64_t from, std::int64_t to) {
  // Runs inside the migration's transaction: the upgraded file and its record commit together.
  AuditRow row;
  {
    Statement s(*db_, "SELECT seq, hash FROM audit ORDER BY seq DESC LIMIT 1");
    if (!s.step()) throw file_error(path_, "the case file has no audit log (damaged)");
    row.seq = s.column_int(0) + 1;
    row.prev_hash = s.column_text(1);
  }
  row.revision = db_->query_int("SELECT COALESCE(MAX(revision), 0) FROM revisions");
  row.at = utc_timestamp_now();
  row.account = account_;  // the program upgraded the file; no examiner declared anything
  row.action = action::upgrade_format;
  row.entity = "case";
  row.field = "format";
  row.old_value = std::to_string(from);
  row.new_value = std::to_string(to);
  row.hash = audit_row_hash(row);
  insert_audit(*db_, row);
  write_head(*db_, row.seq, row.hash);
}

void SqliteBackend::write_session() {
  WriteTransaction transaction(*db_);
  Statement s(
      *db_,
      "INSERT OR REPLACE INTO session(id, examiner, pid, host, since) VALUES (1, ?, ?, ?, ?)");
  s.bind(1, "account " + account_)
      .bind(2, static_cast<std::int64_t>(::getpid()))
      .bind(3, host_name())
      .bind(4, utc_timestamp_now());
  s.run();
  transaction.commit();
}

std::string SqliteBackend::in_use_message() const {
  std::string who = "another process";  // the session row names an account, not a person
  try {
    Connection reader(path_, Connection::Access::read_only);
    reader.set_busy_timeout(options_.busy_timeout_ms);
    Statement s(reader, "SELECT examiner, pid, host, since FROM session WHERE id = 1");
    if (s.step())
      who = s.column_text(0) + " (process " + std::to_string(s.column_int(1)) + " on " +
            s.column_text(2) + ", since " + s.column_text(3) + ")";
  } catch (const validation::Error&) {
    // The holder is named when it can be read; the refusal stands either way.
  }
  return "the case is in use by " + who + "; open it read-only to view it";
}

void SqliteBackend::create_file(const std::filesystem::path& path, const CaseState& state,
                                const AuditRow& import_row) {
  std::error_code ec;
  if (std::filesystem::exists(path, ec) || std::filesystem::is_symlink(path, ec))
    throw file_error(path,
                     "already exists; choose another name (an existing case is never replaced)");
  // Built under a temporary name beside the target (a killed import's leftover is removed by the
  // next import of the same name), then linked into place.
  platform::remove_stale_temporaries(path);
  const std::filesystem::path temporary = platform::temporary_name_for(path);
  platform::create_private_file(temporary, platform::case_content_file_mode());
  try {
    {
      Connection db(temporary, Connection::Access::read_write);
      db.execute("PRAGMA journal_mode = DELETE");
      db.execute("PRAGMA synchronous = FULL");
      db.execute("PRAGMA foreign_keys = ON");
      apply_migrations(db, schema_migrations());
      WriteTransaction transaction(db);
      Statement(db, "INSERT INTO revisions(revision, opened_seq) VALUES (1, 1)").run();
      insert_audit(db, import_row);
      for (const auto& [name, value] : state.sections()) {
        Statement s(db, "INSERT INTO sections(name, body) VALUES (?, ?)");
        s.bind(1, name).bind(2, canonical_text(value)).run();
      }
      for (std::size_t i = 0; i < state.items().size(); ++i) {
        Statement s(db, "INSERT INTO items(item_id, position, body) VALUES (?, ?, ?)");
        s.bind(1, state.items()[i].first).bind(2, static_cast<std::int64_t>(i));
        s.bind(3, canonical_text(state.items()[i].second)).run();
      }
      write_head(db, import_row.seq, import_row.hash);
      transaction.commit();
    }
    // link() refuses an existing target, so a file that appeared meanwhile is never replaced.
    if (::link(temporary.c_str(), path.c_str()) != 0)
      throw file_error(path, std::string("cannot create: ") + std::strerror(errno));
    remove_quietly(temporary);
    platform::sync_folder(path.parent_path());
  } catch (...) {
    remove_quietly(temporary);
    throw;
  }
}

std::map<std::string, std::string> SqliteBackend::sections() {
  std::map<std::string, std::string> out;
  Statement s(*db_, "SELECT name, body FROM sections ORDER BY name");
  while (s.step()) out[s.column_text(0)] = s.column_text(1);
  return out;
}

std::vector<StoredItem> SqliteBackend::items() {
  std::vector<StoredItem> out;
  Statement s(*db_, "SELECT item_id, position, body FROM items ORDER BY position, item_id");
  while (s.step()) out.push_back({s.column_text(0), s.column_int(1), s.column_text(2)});
  return out;
}

std::optional<AuditRow> SqliteBackend::last_audit_row() {
  const std::string sql = std::string(version_ == 1 ? kSelectAuditVersion1 : kSelectAuditVersion2) +
                          " ORDER BY seq DESC LIMIT 1";
  Statement s(*db_, sql.c_str());
  if (!s.step()) return std::nullopt;
  return read_audit_row(s);
}

void SqliteBackend::each_audit_row(const std::function<void(const AuditRow&)>& visit) {
  const std::string sql =
      std::string(version_ == 1 ? kSelectAuditVersion1 : kSelectAuditVersion2) + " ORDER BY seq";
  Statement s(*db_, sql.c_str());
  while (s.step()) visit(read_audit_row(s));
}

std::optional<AuditRow> SqliteBackend::audit_row(std::int64_t seq) {
  const std::string sql =
      std::string(version_ == 1 ? kSelectAuditVersion1 : kSelectAuditVersion2) + " WHERE seq = ?";
  Statement s(*db_, sql.c_str());
  s.bind(1, seq);
  if (!s.step()) return std::nullopt;
  return read_audit_row(s);
}

std::vector<std::string> SqliteBackend::new_values_of(const char* action) {
  std::vector<std::string> out;
  Statement s(*db_, "SELECT new_value FROM audit WHERE action = ? ORDER BY seq");
  s.bind(1, std::string_view(action));
  while (s.step()) out.push_back(s.column_text(0));
  return out;
}

std::vector<StoredRevision> SqliteBackend::revisions(bool with_content) {
  std::vector<StoredRevision> out;
  Statement s(*db_, with_content ? "SELECT revision, opened_seq, sealed_seq, sealed_at, sealed_by, "
                                   "state_sha256, report_file_name, report_sha256, state_json, "
                                   "report_bytes FROM revisions ORDER BY revision"
                                 : "SELECT revision, opened_seq, sealed_seq, sealed_at, sealed_by, "
                                   "state_sha256, report_file_name, report_sha256, NULL, NULL "
                                   "FROM revisions ORDER BY revision");
  while (s.step()) {
    StoredRevision r;
    r.revision = s.column_int(0);
    r.opened_seq = s.column_int(1);
    if (!s.column_is_null(2)) r.sealed_seq = s.column_int(2);
    r.sealed_at = s.column_text(3);
    r.sealed_by = s.column_text(4);
    r.state_sha256 = s.column_text(5);
    r.report_file_name = s.column_text(6);
    r.report_sha256 = s.column_text(7);
    r.state_json = s.column_text(8);
    r.report_bytes = s.column_blob(9);
    out.push_back(std::move(r));
  }
  return out;
}

std::optional<std::string> SqliteBackend::sealed_state_json(std::int64_t revision) {
  Statement s(*db_,
              "SELECT state_json FROM revisions WHERE revision = ? AND sealed_seq IS NOT NULL");
  s.bind(1, revision);
  if (!s.step()) return std::nullopt;
  return s.column_text(0);
}

std::optional<std::string> SqliteBackend::sealed_report_bytes(std::int64_t revision) {
  Statement s(*db_,
              "SELECT report_bytes FROM revisions WHERE revision = ? AND sealed_seq IS NOT NULL");
  s.bind(1, revision);
  if (!s.step()) return std::nullopt;
  return s.column_blob(0);
}

std::string SqliteBackend::chain_head() {
  Statement s(*db_, "SELECT value FROM meta WHERE key = 'chain_head'");
  return s.step() ? s.column_text(0) : std::string();
}

void SqliteBackend::begin_write() {
  db_->execute("BEGIN IMMEDIATE");
  in_write_ = true;
}

void SqliteBackend::commit_write() {
  db_->execute("COMMIT");
  in_write_ = false;
}

void SqliteBackend::rollback_write() noexcept {
  if (in_write_) sqlite3_exec(db_->handle(), "ROLLBACK", nullptr, nullptr, nullptr);
  in_write_ = false;
}

bool SqliteBackend::changed_since_verified() {
  // PRAGMA data_version changes only when another connection commits: the store's own commits
  // keep the file verified, so the walk runs once per open unless the file is changed behind it.
  return db_->query_int("PRAGMA data_version") != verified_data_version_;
}

void SqliteBackend::mark_verified() {
  verified_data_version_ = db_->query_int("PRAGMA data_version");
}

void SqliteBackend::insert_audit_row(const AuditRow& row) { insert_audit(*db_, row); }

void SqliteBackend::insert_revision(std::int64_t revision, std::int64_t opened_seq) {
  Statement s(*db_, "INSERT INTO revisions(revision, opened_seq) VALUES (?, ?)");
  s.bind(1, revision).bind(2, opened_seq).run();
}

void SqliteBackend::put_section(const std::string& name, const std::string& body) {
  Statement s(*db_, "INSERT OR REPLACE INTO sections(name, body) VALUES (?, ?)");
  s.bind(1, name).bind(2, body).run();
}

void SqliteBackend::delete_section(const std::string& name) {
  Statement s(*db_, "DELETE FROM sections WHERE name = ?");
  s.bind(1, name).run();
}

void SqliteBackend::insert_item(const StoredItem& item) {
  Statement s(*db_, "INSERT INTO items(item_id, position, body) VALUES (?, ?, ?)");
  s.bind(1, item.id).bind(2, item.position).bind(3, item.body).run();
}

void SqliteBackend::update_item(const StoredItem& item) {
  Statement s(*db_, "UPDATE items SET position = ?, body = ? WHERE item_id = ?");
  s.bind(1, item.position).bind(2, item.body).bind(3, item.id).run();
}

void SqliteBackend::delete_item(const std::string& id) {
  Statement s(*db_, "DELETE FROM items WHERE item_id = ?");
  s.bind(1, id).run();
}

void SqliteBackend::seal_revision(const SealedRevisionRecord& record) {
  Statement s(*db_,
              "UPDATE revisions SET sealed_seq = ?, sealed_at = ?, sealed_by = ?, state_json = ?, "
              "state_sha256 = ?, report_file_name = ?, report_bytes = ?, report_sha256 = ? "
              "WHERE revision = ? AND sealed_seq IS NULL");
  s.bind(1, record.sealed_seq)
      .bind(2, record.sealed_at)
      .bind(3, record.sealed_by)
      .bind(4, record.state_json)
      .bind(5, record.state_sha256);
  s.bind(6, record.report_file_name)
      .bind_blob(7, record.report_bytes)
      .bind(8, record.report_sha256)
      .bind(9, record.revision);
  s.run();
  if (db_->changes() != 1)
    throw file_error(path_, "the revision to seal is missing or already sealed");
}

void SqliteBackend::write_chain_head(std::int64_t seq, const std::string& hash) {
  write_head(*db_, seq, hash);
}

}  // namespace counterpoise::store
