#include "core/store/case_store.hpp"

#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <map>
#include <set>
#include <stdexcept>

#include <unistd.h>

#include "core/platform/private_file.hpp"
#include "core/platform/sha256.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_file_header.hpp"
#include "core/store/edit_lock.hpp"
#include "core/store/sqlite_connection.hpp"
#include "core/store/store_schema.hpp"

namespace counterpoise::store {

using nlohmann::json;
using validation::FileError;
using validation::InvalidValue;

namespace {

std::string host_name() {
  char buffer[256] = {};
  if (::gethostname(buffer, sizeof buffer - 1) != 0) return "unknown host";
  return buffer;
}

// Messages about a file start with its path.
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

// Each query in two forms: version 1 files have no account column (read as NULL), so an old
// file can still be viewed and verified without being upgraded.
struct Queries {
  const char* select_audit;
  const char* select_revisions;
};
constexpr Queries kQueriesVersion2 = {
    "SELECT seq, revision, at, examiner, action, entity, entity_key, field, old_value, new_value, "
    "prev_hash, hash, account FROM audit ORDER BY seq",
    "SELECT r.revision, r.opened_seq, r.sealed_seq, r.sealed_at, r.sealed_by, r.state_sha256, "
    "r.report_sha256, r.report_file_name, a.account, a.new_value "
    "FROM revisions r LEFT JOIN audit a ON a.seq = r.sealed_seq ORDER BY r.revision"};
constexpr Queries kQueriesVersion1 = {
    "SELECT seq, revision, at, examiner, action, entity, entity_key, field, old_value, new_value, "
    "prev_hash, hash, NULL FROM audit ORDER BY seq",
    "SELECT r.revision, r.opened_seq, r.sealed_seq, r.sealed_at, r.sealed_by, r.state_sha256, "
    "r.report_sha256, r.report_file_name, NULL, a.new_value "
    "FROM revisions r LEFT JOIN audit a ON a.seq = r.sealed_seq ORDER BY r.revision"};

constexpr const char* kInsertAudit =
    "INSERT INTO audit(seq, revision, at, examiner, account, action, entity, entity_key, field, "
    "old_value, new_value, prev_hash, hash) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)";

void insert_audit_row(Statement& insert, const AuditRow& row) {
  insert.bind(1, row.seq).bind(2, row.revision).bind(3, row.at).bind(4, row.examiner);
  insert.bind_optional(5, row.account).bind(6, row.action).bind(7, row.entity).bind(8, row.key);
  insert.bind(9, row.field).bind_optional(10, row.old_value).bind_optional(11, row.new_value);
  insert.bind(12, row.prev_hash).bind(13, row.hash);
  insert.run();
}

void write_chain_head(Connection& db, const AuditRow& last) {
  Statement s(db, "INSERT OR REPLACE INTO meta(key, value) VALUES ('chain_head', ?)");
  s.bind(1, std::to_string(last.seq) + " " + last.hash).run();
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

RevisionInfo read_revision(const Statement& s) {
  RevisionInfo info;
  info.revision = s.column_int(0);
  info.opened_seq = s.column_int(1);
  if (!s.column_is_null(2)) info.sealed_seq = s.column_int(2);
  info.sealed_at = s.column_text(3);
  info.sealed_by = s.column_text(4);
  info.state_sha256 = s.column_text(5);
  info.report_sha256 = s.column_text(6);
  info.report_file_name = s.column_text(7);
  info.sealed_by_account = s.column_text(8);
  if (info.sealed() && !s.column_is_null(9)) {
    // The seal row's own record of who: parsed leniently, since verify, not this listing,
    // judges a damaged row.
    const json seal = json::parse(s.column_text(9), nullptr, false);
    if (seal.is_object()) {
      info.report_examiner = seal.value("report_examiner", "");
      info.sealer_role = seal.value("sealer_role", "");
    }
  }
  return info;
}

std::optional<std::string> optional_text(const std::optional<json>& value) {
  if (!value) return std::nullopt;
  return canonical_text(*value);
}

}  // namespace

struct CaseStore::Impl {
  std::filesystem::path path;
  StoreOptions options;
  std::string account = operating_system_account();
  OpenMode mode = OpenMode::read_only;
  Queries queries = kQueriesVersion2;
  // Declared before the connection so that it is destroyed after it (see edit_lock.hpp).
  std::unique_ptr<EditLock> lock;
  std::unique_ptr<Connection> db;
  // The replay position at the last committed row: state, revision, reviewers, ...
  AuditReplay head;
  std::string last_hash = kGenesisHash;
  // PRAGMA data_version when the file last passed verify (-1: not yet).
  std::int64_t verified_data_version = -1;

  void configure(bool writable);
  VerifyReport verify() const;
  // Runs verify unless nothing but this connection changed the file since it last passed;
  // throws CaseFailsVerification when it fails.
  void require_verified();
  void load();
  void write_session();
  void record_upgrade(std::int64_t from, std::int64_t to);
  std::string in_use_message() const;

  // Builds the rows of one change by `who` (with an open-revision row first when needed and the
  // change is not an annotation), checks them by replay, asks options.validate, then writes
  // rows, entity tables and chain head in one transaction. `extra` writes more in the same
  // transaction (the seal's revision row).
  std::int64_t commit(
      const ExaminerName& who,
      const std::function<AuditRow(const CaseState&, std::int64_t revision)>& make_row,
      bool validate_result,
      const std::function<void(const AuditRow&, const CaseState&)>& extra = {},
      bool annotation = false);
  AuditRow new_row(const ExaminerName& who, std::string action, std::string entity,
                   std::string key, std::string field) const;
  void write_state_difference(const CaseState& before, const CaseState& after);
  void require_editable() const {
    if (mode != OpenMode::edit) throw std::logic_error("the case store was opened read-only");
  }
};

void CaseStore::Impl::configure(bool writable) {
  db->set_busy_timeout(options.busy_timeout_ms);
  db->execute("PRAGMA foreign_keys = ON");
  if (writable) {
    // Rollback journal: the case stays one file at rest, and copying a closed case copies it
    // all. FULL: the journal and the file are synced at each commit (docs/case-store.md).
    db->execute("PRAGMA journal_mode = DELETE");
    db->execute("PRAGMA synchronous = FULL");
  } else {
    db->execute("PRAGMA query_only = ON");
  }
}

void CaseStore::Impl::load() {
  json document = json::object();
  {
    Statement s(*db, "SELECT name, body FROM sections ORDER BY name");
    while (s.step())
      document[s.column_text(0)] = reading::parse_json_text(s.column_text(1), "section " + s.column_text(0));
  }
  json items = json::array();
  {
    Statement s(*db, "SELECT item_id, body FROM items ORDER BY position, item_id");
    while (s.step()) items.push_back(reading::parse_json_text(s.column_text(1), "item " + s.column_text(0)));
  }
  document["items"] = std::move(items);
  CaseState state;
  try {
    state = CaseState::from_document(document);
  } catch (const validation::Error& e) {
    throw file_error(
        path,
        std::string("the case tables are damaged (changed outside the program?): ") + e.what());
  }
  std::int64_t last_seq = 0;
  bool records_accounts = false;
  {
    // The last row tells whether rows record accounts; version 1 queries read NULL there.
    Statement s(*db, queries.select_audit == kQueriesVersion1.select_audit
                         ? "SELECT seq, hash, NULL FROM audit ORDER BY seq DESC LIMIT 1"
                         : "SELECT seq, hash, account FROM audit ORDER BY seq DESC LIMIT 1");
    if (!s.step()) throw file_error(path, "the case file has no audit log (damaged)");
    last_seq = s.column_int(0);
    last_hash = s.column_text(1);
    records_accounts = !s.column_is_null(2);
  }
  std::int64_t revision = 0;
  bool sealed = false;
  {
    Statement s(
        *db,
        "SELECT revision, sealed_seq IS NOT NULL FROM revisions ORDER BY revision DESC LIMIT 1");
    if (!s.step()) throw file_error(path, "the case file has no revision (damaged)");
    revision = s.column_int(0);
    sealed = s.column_int(1) != 0;
  }
  std::set<std::string> reviewers;
  {
    Statement s(*db, "SELECT new_value FROM audit WHERE action = 'declare-reviewer'");
    while (s.step()) {
      const json name = json::parse(s.column_text(0), nullptr, false);
      if (name.is_string()) reviewers.insert(name.get<std::string>());
    }
  }
  head = AuditReplay(std::move(state), revision, sealed, last_seq, records_accounts,
                     std::move(reviewers));
}

void CaseStore::Impl::record_upgrade(std::int64_t from, std::int64_t to) {
  // Runs inside the migration's transaction: the upgraded file and its record commit together.
  AuditRow row;
  {
    Statement s(*db, "SELECT seq, hash FROM audit ORDER BY seq DESC LIMIT 1");
    if (!s.step()) throw file_error(path, "the case file has no audit log (damaged)");
    row.seq = s.column_int(0) + 1;
    row.prev_hash = s.column_text(1);
  }
  row.revision = db->query_int("SELECT COALESCE(MAX(revision), 0) FROM revisions");
  row.at = utc_timestamp_now();
  row.account = account;  // the program upgraded the file; no examiner declared anything
  row.action = action::upgrade_format;
  row.entity = "case";
  row.field = "format";
  row.old_value = std::to_string(from);
  row.new_value = std::to_string(to);
  row.hash = audit_row_hash(row);
  Statement insert(*db, kInsertAudit);
  insert_audit_row(insert, row);
  write_chain_head(*db, row);
}

void CaseStore::Impl::write_session() {
  WriteTransaction transaction(*db);
  Statement s(
      *db, "INSERT OR REPLACE INTO session(id, examiner, pid, host, since) VALUES (1, ?, ?, ?, ?)");
  s.bind(1, "account " + account)
      .bind(2, static_cast<std::int64_t>(::getpid()))
      .bind(3, host_name())
      .bind(4, utc_timestamp_now());
  s.run();
  transaction.commit();
}

AuditRow CaseStore::Impl::new_row(const ExaminerName& who, std::string action,
                                  std::string entity, std::string key, std::string field) const {
  AuditRow row;
  row.at = utc_timestamp_now();
  row.examiner = who.text();
  row.account = account;
  row.action = std::move(action);
  row.entity = std::move(entity);
  row.key = std::move(key);
  row.field = std::move(field);
  return row;
}

void CaseStore::Impl::write_state_difference(const CaseState& before, const CaseState& after) {
  for (const auto& [name, value] : after.sections()) {
    auto old = before.sections().find(name);
    const std::string text = canonical_text(value);
    if (old != before.sections().end() && canonical_text(old->second) == text) continue;
    Statement s(*db, "INSERT OR REPLACE INTO sections(name, body) VALUES (?, ?)");
    s.bind(1, name).bind(2, text).run();
  }
  for (const auto& [name, value] : before.sections()) {
    if (after.sections().count(name)) continue;
    Statement s(*db, "DELETE FROM sections WHERE name = ?");
    s.bind(1, name).run();
  }
  std::map<std::string, std::pair<std::size_t, const json*>> old_items;
  for (std::size_t i = 0; i < before.items().size(); ++i)
    old_items[before.items()[i].first] = {i, &before.items()[i].second};
  for (std::size_t i = 0; i < after.items().size(); ++i) {
    const auto& [id, body] = after.items()[i];
    auto old = old_items.find(id);
    const std::string text = canonical_text(body);
    if (old == old_items.end()) {
      Statement s(*db, "INSERT INTO items(item_id, position, body) VALUES (?, ?, ?)");
      s.bind(1, id).bind(2, static_cast<std::int64_t>(i)).bind(3, text).run();
      continue;
    }
    const bool same = old->second.first == i && canonical_text(*old->second.second) == text;
    old_items.erase(old);
    if (same) continue;
    Statement s(*db, "UPDATE items SET position = ?, body = ? WHERE item_id = ?");
    s.bind(1, static_cast<std::int64_t>(i)).bind(2, text).bind(3, id).run();
  }
  for (const auto& [id, unused] : old_items) {
    Statement s(*db, "DELETE FROM items WHERE item_id = ?");
    s.bind(1, id).run();
  }
}

std::int64_t CaseStore::Impl::commit(
    const ExaminerName& who,
    const std::function<AuditRow(const CaseState&, std::int64_t)>& make_row, bool validate_result,
    const std::function<void(const AuditRow&, const CaseState&)>& extra, bool annotation) {
  require_editable();
  AuditReplay replay = head;
  const std::int64_t last_seq = head.rows();
  std::vector<AuditRow> rows;
  std::string prev = last_hash;
  const auto append = [&](AuditRow row) {
    row.seq = last_seq + static_cast<std::int64_t>(rows.size()) + 1;
    row.prev_hash = prev;
    row.hash = audit_row_hash(row);
    replay.apply(row);  // the same check verify makes: a row that would not fit is never written
    prev = row.hash;
    rows.push_back(std::move(row));
  };
  if (head.sealed() && !annotation) {
    AuditRow open = new_row(who, action::open_revision, "case", "", "revision");
    open.revision = head.revision() + 1;
    open.old_value = std::to_string(head.revision());
    open.new_value = std::to_string(head.revision() + 1);
    append(std::move(open));
  }
  AuditRow change = make_row(replay.state(), replay.revision());
  change.revision = replay.revision();
  append(std::move(change));
  if (validate_result && options.validate) options.validate(replay.state().to_document());

  WriteTransaction transaction(*db);
  require_verified();  // inside the write lock: nobody changes the file between check and write
  {
    Statement tail(*db, "SELECT seq, hash FROM audit ORDER BY seq DESC LIMIT 1");
    if (!tail.step() || tail.column_int(0) != last_seq || tail.column_text(1) != last_hash)
      throw file_error(path, "the case file was changed by another program since it was opened");
  }
  Statement insert(*db, kInsertAudit);
  for (const AuditRow& row : rows) {
    if (row.action == action::open_revision) {
      Statement s(*db, "INSERT INTO revisions(revision, opened_seq) VALUES (?, ?)");
      s.bind(1, row.revision).bind(2, row.seq).run();
    }
    insert_audit_row(insert, row);
  }
  write_state_difference(head.state(), replay.state());
  if (extra) extra(rows.back(), replay.state());
  write_chain_head(*db, rows.back());
  transaction.commit();

  head = std::move(replay);
  last_hash = rows.back().hash;
  return rows.back().seq;
}

std::string CaseStore::Impl::in_use_message() const {
  std::string who = "another process";  // the session row names an account, not a person
  try {
    Connection reader(path, Connection::Access::read_only);
    reader.set_busy_timeout(options.busy_timeout_ms);
    Statement s(reader, "SELECT examiner, pid, host, since FROM session WHERE id = 1");
    if (s.step())
      who = s.column_text(0) + " (process " + std::to_string(s.column_int(1)) + " on " +
            s.column_text(2) + ", since " + s.column_text(3) + ")";
  } catch (const validation::Error&) {
    // The holder is named when it can be read; the refusal stands either way.
  }
  return "the case is in use by " + who + "; open it read-only to view it";
}

CaseStore::CaseStore(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
CaseStore::CaseStore(CaseStore&&) noexcept = default;
CaseStore& CaseStore::operator=(CaseStore&&) noexcept = default;
CaseStore::~CaseStore() {
  // The connection must close before the lock's descriptor (see edit_lock.hpp).
  if (impl_) impl_->db.reset();
}

CaseStore CaseStore::open(const std::filesystem::path& path, OpenMode mode,
                          const StoreOptions& options) {
  check_case_file_header(path, kSchemaVersion);
  auto impl = std::make_unique<Impl>();
  impl->path = path;
  impl->options = options;
  impl->mode = mode;
  if (mode == OpenMode::edit) {
    impl->lock = std::make_unique<EditLock>(path);
    if (!impl->lock->held()) throw CaseInUse({}, path.string() + ": " + impl->in_use_message());
  }
  // A read-only view still needs write access when a crashed program left a journal to roll back.
  std::error_code ec;
  const bool journal = std::filesystem::file_size(journal_of(path), ec) > 0 && !ec;
  const bool writable = mode == OpenMode::edit;
  impl->db = std::make_unique<Connection>(
      path, writable || journal ? Connection::Access::read_write : Connection::Access::read_only);
  impl->db->set_busy_timeout(options.busy_timeout_ms);
  if (impl->db->query_int("PRAGMA application_id") != kApplicationId)
    throw validation::UnsupportedFormat({},
                                        path.string() + ": not a case file (wrong application_id)");
  const std::int64_t version = impl->db->query_int("PRAGMA user_version");
  if (version < 1 || version > kSchemaVersion)
    throw validation::UnsupportedFormat(
        {}, path.string() + ": the case file has schema version " + std::to_string(version) +
                ", which this program does not read");
  // Before anything else touches the tables (even the pragmas that may write): the file's
  // structure must be exactly the program's own for its version.
  try {
    check_schema(*impl->db, schema_migrations(), version);
  } catch (const validation::UnsupportedFormat& e) {
    throw validation::UnsupportedFormat({}, path.string() + ": " + e.bare_message());
  }
  impl->configure(writable);
  const std::string check = impl->db->query_text("PRAGMA integrity_check(5)");
  if (check != "ok")
    throw file_error(path, "the case file is damaged (integrity check: " + check + ")");
  if (version == 1) impl->queries = kQueriesVersion1;
  impl->load();
  if (writable) {
    // A file that fails verify is never written to, not even by an upgrade or the session row.
    impl->require_verified();
    if (version < kSchemaVersion) {
      Impl& store = *impl;
      apply_migrations(*impl->db, schema_migrations(), [&store](std::int64_t from, std::int64_t to) {
        store.record_upgrade(from, to);
      });
      impl->queries = kQueriesVersion2;
      impl->load();
    }
  }
  if (writable) {
    impl->write_session();
    if (options.testing_max_page_count) {
      const std::string pragma =
          "PRAGMA max_page_count = " + std::to_string(*options.testing_max_page_count);
      impl->db->execute(pragma.c_str());
    }
    if (options.testing_refuse_writes) impl->db->execute("PRAGMA query_only = ON");
  }
  return CaseStore(std::move(impl));
}

CaseStore CaseStore::create(const std::filesystem::path& path, const json& document,
                            const ExaminerName& examiner, const StoreOptions& options) {
  CaseState state = CaseState::from_document(document);
  const std::string text = state_text(state);
  if (options.validate) options.validate(document);
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
      AuditRow row;
      row.seq = 1;
      row.revision = 1;
      row.at = utc_timestamp_now();
      row.examiner = examiner.text();
      row.account = operating_system_account();
      row.action = action::import_case;
      row.entity = "case";
      row.field = "import";
      row.new_value = text;
      row.prev_hash = kGenesisHash;
      row.hash = audit_row_hash(row);
      AuditReplay().apply(row);
      WriteTransaction transaction(db);
      Statement(db, "INSERT INTO revisions(revision, opened_seq) VALUES (1, 1)").run();
      Statement insert(db, kInsertAudit);
      insert_audit_row(insert, row);
      for (const auto& [name, value] : state.sections()) {
        Statement s(db, "INSERT INTO sections(name, body) VALUES (?, ?)");
        s.bind(1, name).bind(2, canonical_text(value)).run();
      }
      for (std::size_t i = 0; i < state.items().size(); ++i) {
        Statement s(db, "INSERT INTO items(item_id, position, body) VALUES (?, ?, ?)");
        s.bind(1, state.items()[i].first).bind(2, static_cast<std::int64_t>(i));
        s.bind(3, canonical_text(state.items()[i].second)).run();
      }
      write_chain_head(db, row);
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
  return open(path, OpenMode::edit, options);
}

json CaseStore::document() const { return impl_->head.state().to_document(); }
std::string CaseStore::export_canonical() const { return state_text(impl_->head.state()); }
const CaseState& CaseStore::state() const { return impl_->head.state(); }
std::int64_t CaseStore::current_revision() const { return impl_->head.revision(); }
const std::string& CaseStore::account() const { return impl_->account; }
const std::filesystem::path& CaseStore::path() const { return impl_->path; }

std::int64_t CaseStore::set_field(const ExaminerName& examiner, const EntityRef& entity,
                                  const std::string& field, const std::optional<json>& value) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        AuditRow row = impl_->new_row(examiner, action::set_field, entity_kind_name(entity.kind),
                                      entity.key, field);
        if (entity.kind == EntityKind::item && !current.item_position(entity.key))
          throw InvalidValue({entity.key, field}, "there is no item with this id");
        row.old_value = optional_text(current.value_at(entity, field));
        row.new_value = optional_text(value);
        CaseState probe = current;  // the state's own checks give the precise message
        probe.set_value(entity, field, value);
        return row;
      },
      true);
}

std::int64_t CaseStore::add_item(const ExaminerName& examiner, const json& item,
                                 std::optional<std::size_t> position) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        const std::string id = item_id_of(item, "new item");
        const std::size_t at = position.value_or(current.items().size());
        CaseState probe = current;
        probe.add_item(item, at);
        AuditRow row = impl_->new_row(examiner, action::add_item, "item", id, "");
        row.new_value = canonical_text(json{{"item", item}, {"position", at}});
        return row;
      },
      true);
}

std::int64_t CaseStore::remove_item(const ExaminerName& examiner, const std::string& id) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        const auto at = current.item_position(id);
        if (!at) throw InvalidValue({id, {}}, "there is no item with this id");
        AuditRow row = impl_->new_row(examiner, action::remove_item, "item", id, "");
        row.old_value =
            canonical_text(json{{"item", current.items()[*at].second}, {"position", *at}});
        return row;
      },
      true);
}

std::int64_t CaseStore::move_item(const ExaminerName& examiner, const std::string& id,
                                  std::size_t position) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        const auto at = current.item_position(id);
        if (!at) throw InvalidValue({id, {}}, "there is no item with this id");
        CaseState probe = current;
        probe.move_item(id, position);
        AuditRow row = impl_->new_row(examiner, action::move_item, "item", id, "position");
        row.old_value = std::to_string(*at);
        row.new_value = std::to_string(position);
        return row;
      },
      true);
}

namespace {

// The report's examiner of `state`, or InvalidValue naming case.examiner.
std::string required_case_examiner(const CaseState& state, const char* for_what) {
  const auto examiner = case_examiner(state);
  if (!examiner)
    throw InvalidValue({"case", "examiner"},
                       std::string("the case names no examiner; ") + for_what +
                           " needs the report's examiner named in the case");
  return *examiner;
}

}  // namespace

std::int64_t CaseStore::declare_reviewer(const ExaminerName& examiner,
                                         const ExaminerName& reviewer) {
  const std::string report_examiner =
      required_case_examiner(impl_->head.state(), "declaring a reviewer");
  if (examiner.text() != report_examiner)
    throw InvalidValue({"examiner", "name"},
                       examiner.text() + " is not the case's examiner (" + report_examiner +
                           "); only the case's examiner declares its reviewers");
  if (reviewer.text() == report_examiner)
    throw InvalidValue({"reviewer", "name"},
                       "the case's examiner cannot be declared a reviewer of the same case");
  if (impl_->head.reviewers().count(reviewer.text()))
    throw InvalidValue({"reviewer", "name"}, reviewer.text() + " is already a declared reviewer");
  return impl_->commit(
      examiner,
      [&](const CaseState&, std::int64_t) {
        AuditRow row = impl_->new_row(examiner, action::declare_reviewer, "case", "", "reviewer");
        row.new_value = canonical_text(json(reviewer.text()));
        return row;
      },
      false, {}, true);
}

std::int64_t CaseStore::add_review_note(const ExaminerName& reviewer, std::int64_t revision,
                                        ReviewVerdict verdict, const std::string& note) {
  if (!impl_->head.reviewers().count(reviewer.text()))
    throw InvalidValue({"examiner", "name"},
                       reviewer.text() + " is not a declared reviewer of this case; the case's "
                                         "examiner declares reviewers");
  const bool sealed = revision >= 1 && (revision < impl_->head.revision() ||
                                        (revision == impl_->head.revision() && impl_->head.sealed()));
  if (!sealed)
    throw InvalidValue({"review", "revision"}, "revision " + std::to_string(revision) +
                                                   " is not a sealed revision of this case");
  check_review_note(verdict, note);
  return impl_->commit(
      reviewer,
      [&](const CaseState&, std::int64_t) {
        AuditRow row = impl_->new_row(reviewer, action::review, "case", "", "review");
        row.new_value = canonical_text(review_value(revision, verdict, note));
        return row;
      },
      false, {}, true);
}

std::vector<ReviewNote> CaseStore::review_notes() const {
  std::vector<ReviewNote> notes;
  for (const AuditRow& row : audit_rows())
    if (row.action == action::review) {
      try {
        notes.push_back(review_note_of(row));
      } catch (const validation::Error&) {
        // A malformed row is verify's to report; the listing shows the notes that read.
      }
    }
  return notes;
}

std::vector<std::string> CaseStore::reviewers() const {
  return {impl_->head.reviewers().begin(), impl_->head.reviewers().end()};
}

std::string CaseStore::sealer_role(const ExaminerName& sealer) const {
  const std::string report_examiner =
      required_case_examiner(impl_->head.state(), "sealing a revision");
  if (sealer.text() == report_examiner) return kSealerIsExaminer;
  if (impl_->head.reviewers().count(sealer.text())) return kSealerIsReviewer;
  throw InvalidValue({"examiner", "name"},
                     sealer.text() + " is neither the report's examiner (" + report_examiner +
                         ") nor a declared reviewer of this case, and cannot seal its report");
}

RevisionInfo CaseStore::seal_revision(const ExaminerName& sealer, std::string_view report_bytes,
                                      const std::string& report_file_name) {
  const std::string role = sealer_role(sealer);
  const std::string report_examiner = *case_examiner(impl_->head.state());
  const std::string report_sha256 = platform::sha256_hex(report_bytes);
  RevisionInfo sealed;
  impl_->commit(
      sealer,
      [&](const CaseState& current, std::int64_t revision) {
        AuditRow row = impl_->new_row(sealer, action::seal, "case", "", "seal");
        row.new_value = canonical_text(
            json{{"report_examiner", report_examiner},
                 {"report_file_name", report_file_name},
                 {"report_sha256", report_sha256},
                 {"revision", revision},
                 {"sealer_role", role},
                 {"state_sha256", platform::sha256_hex(state_text(current))}});
        return row;
      },
      false,
      [&](const AuditRow& row, const CaseState& current) {
        const std::string text = state_text(current);
        Statement s(
            *impl_->db,
            "UPDATE revisions SET sealed_seq = ?, sealed_at = ?, sealed_by = ?, state_json = ?, "
            "state_sha256 = ?, report_file_name = ?, report_bytes = ?, report_sha256 = ? "
            "WHERE revision = ? AND sealed_seq IS NULL");
        s.bind(1, row.seq)
            .bind(2, row.at)
            .bind(3, row.examiner)
            .bind(4, text)
            .bind(5, platform::sha256_hex(text));
        s.bind(6, report_file_name)
            .bind_blob(7, report_bytes)
            .bind(8, report_sha256)
            .bind(9, row.revision);
        s.run();
        if (impl_->db->changes() != 1)
          throw file_error(impl_->path, "the revision to seal is missing or already sealed");
        sealed.revision = row.revision;
        sealed.sealed_seq = row.seq;
        sealed.sealed_at = row.at;
        sealed.sealed_by = row.examiner;
        sealed.state_sha256 = platform::sha256_hex(text);
        sealed.report_sha256 = report_sha256;
        sealed.report_file_name = report_file_name;
      });
  for (const RevisionInfo& info : revisions())
    if (info.revision == sealed.revision) return info;
  return sealed;
}

std::vector<RevisionInfo> CaseStore::revisions() const {
  std::vector<RevisionInfo> out;
  Statement s(*impl_->db, impl_->queries.select_revisions);
  while (s.step()) out.push_back(read_revision(s));
  return out;
}

std::optional<RevisionInfo> CaseStore::latest_seal() const {
  std::optional<RevisionInfo> latest;
  for (RevisionInfo& info : revisions())
    if (info.sealed()) latest = std::move(info);
  return latest;
}

namespace {
std::string sealed_column(Connection& db, const char* sql, std::int64_t revision) {
  Statement s(db, sql);
  s.bind(1, revision);
  if (!s.step())
    throw InvalidValue({"revision " + std::to_string(revision), {}},
                       "there is no sealed revision with this number");
  return s.column_blob(0);
}
}  // namespace

std::string CaseStore::sealed_report_bytes(std::int64_t revision) const {
  return sealed_column(
      *impl_->db,
      "SELECT report_bytes FROM revisions WHERE revision = ? AND sealed_seq IS NOT NULL", revision);
}

std::string CaseStore::sealed_state_text(std::int64_t revision) const {
  return sealed_column(
      *impl_->db, "SELECT state_json FROM revisions WHERE revision = ? AND sealed_seq IS NOT NULL",
      revision);
}

std::vector<AuditRow> CaseStore::audit_rows() const {
  std::vector<AuditRow> out;
  Statement s(*impl_->db, impl_->queries.select_audit);
  while (s.step()) out.push_back(read_audit_row(s));
  return out;
}

VerifyReport CaseStore::verify() const { return impl_->verify(); }

void CaseStore::Impl::require_verified() {
  // PRAGMA data_version changes only when another connection commits: the store's own commits
  // keep the file verified, so the walk runs once per open unless the file is changed behind it.
  const std::int64_t version = db->query_int("PRAGMA data_version");
  if (version == verified_data_version) return;
  const VerifyReport report = verify();
  if (!report.ok())
    throw CaseFailsVerification(
        {}, path.string() + ": the case file fails verification (audit row " +
                std::to_string(report.problem->seq) + ": " + report.problem->reason +
                "), so nothing is written to it: it was changed outside the program. It can "
                "still be read; go back to a copy you trust.");
  verified_data_version = version;
}

VerifyReport CaseStore::Impl::verify() const {
  VerifyReport report;
  const auto fail = [&](std::int64_t seq, std::string reason) {
    if (!report.problem) report.problem = VerifyProblem{seq, std::move(reason)};
    return report;
  };
  AuditReplay replay;
  std::map<std::int64_t, AuditRow> seals, openings;  // by revision
  std::string prev = kGenesisHash;
  std::int64_t expected = 1;
  {
    Statement s(*db, queries.select_audit);
    while (s.step()) {
      const AuditRow row = read_audit_row(s);
      if (row.seq != expected)
        return fail(expected, "audit row " + std::to_string(expected) +
                                  " is missing (the next row is " + std::to_string(row.seq) + ")");
      if (row.prev_hash != prev)
        return fail(row.seq, "its link to the previous row does not match that row's hash");
      if (audit_row_hash(row) != row.hash)
        return fail(row.seq, "its hash does not match its content (the row was changed)");
      try {
        replay.apply(row);
      } catch (const validation::Error& e) {
        return fail(row.seq,
                    "it does not fit the case replayed up to it: " + std::string(e.what()));
      }
      if (row.action == action::seal) seals[row.revision] = row;
      if (row.action == action::import_case || row.action == action::open_revision)
        openings[row.revision] = row;
      prev = row.hash;
      ++expected;
      ++report.rows_checked;
    }
  }
  const std::int64_t last = expected - 1;
  if (last == 0) return fail(0, "the audit log is empty");
  {
    Statement s(*db, "SELECT value FROM meta WHERE key = 'chain_head'");
    const std::string head = s.step() ? s.column_text(0) : std::string();
    if (head != std::to_string(last) + " " + prev)
      return fail(last, "the audit log ends at row " + std::to_string(last) +
                            " but the file recorded a different last row (" + head +
                            "): rows were removed or added");
  }
  {
    Statement s(*db,
                "SELECT revision, opened_seq, sealed_seq, state_json, state_sha256, report_bytes, "
                "report_sha256, "
                "report_file_name, sealed_at, sealed_by FROM revisions ORDER BY revision");
    std::int64_t count = 0;
    while (s.step()) {
      ++count;
      const std::int64_t revision = s.column_int(0);
      auto opening = openings.find(revision);
      if (revision != count || opening == openings.end() || opening->second.seq != s.column_int(1))
        return fail(opening == openings.end() ? last : opening->second.seq,
                    "revision " + std::to_string(revision) +
                        " in the revisions table does not match the audit");
      auto seal = seals.find(revision);
      if ((seal != seals.end()) != !s.column_is_null(2))
        return fail(seal != seals.end() ? seal->second.seq : last,
                    "revision " + std::to_string(revision) +
                        " is sealed in one place but not in the other");
      if (seal == seals.end()) continue;
      const json recorded = json::parse(*seal->second.new_value);
      const std::string state_json = s.column_text(3), report = s.column_blob(5);
      if (s.column_int(2) != seal->second.seq ||
          platform::sha256_hex(state_json) != recorded.value("state_sha256", "") ||
          s.column_text(4) != recorded.value("state_sha256", "") ||
          platform::sha256_hex(report) != recorded.value("report_sha256", "") ||
          s.column_text(6) != recorded.value("report_sha256", "") ||
          s.column_text(7) != recorded.value("report_file_name", "") ||
          s.column_text(8) != seal->second.at || s.column_text(9) != seal->second.examiner)
        return fail(seal->second.seq, "the stored content of sealed revision " +
                                          std::to_string(revision) +
                                          " does not match its seal (state or report changed)");
    }
    if (count != replay.revision())
      return fail(last, "the revisions table has " + std::to_string(count) +
                            " revisions, the audit " + std::to_string(replay.revision()));
    report.revisions = count;
  }
  // The entity tables must hold exactly the replayed state: compare "position body" rows by key.
  const CaseState& expected_state = replay.state();
  const auto compare_table = [&](const char* sql, const char* kind,
                                 std::map<std::string, std::string> expected) {
    std::map<std::string, std::string> actual;
    Statement s(*db, sql);
    while (s.step()) actual[s.column_text(0)] = s.column_text(1);
    for (const auto& [key, row] : expected) {
      auto it = actual.find(key);
      if (it == actual.end() || it->second != row)
        return fail(last, std::string(kind) + " \"" + key +
                              "\" differs from the audit (changed outside the program after row " +
                              std::to_string(last) + ")");
      actual.erase(it);
    }
    if (!actual.empty())
      return fail(last, std::string(kind) + " \"" + actual.begin()->first +
                            "\" is not in the audit (added outside the program)");
    return report;
  };
  std::map<std::string, std::string> sections, items;
  for (const auto& [name, value] : expected_state.sections())
    sections[name] = canonical_text(value);
  for (std::size_t i = 0; i < expected_state.items().size(); ++i)
    items[expected_state.items()[i].first] =
        std::to_string(i) + " " + canonical_text(expected_state.items()[i].second);
  compare_table("SELECT name, body FROM sections", "section", std::move(sections));
  if (report.problem) return report;
  compare_table("SELECT item_id, position || ' ' || body FROM items", "item", std::move(items));
  return report;
}

bool is_case_file(const std::filesystem::path& path) {
  try {
    return read_case_file_header(path).kind == FileKind::case_file;
  } catch (const validation::Error&) {
    return false;
  }
}

}  // namespace counterpoise::store
