#include "core/store/postgres_backend.hpp"

#include "core/store/canonical_json.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"

namespace counterpoise::store {

using validation::FileError;

namespace {

constexpr const char* kSelectAudit =
    "SELECT seq, revision, at, examiner, action, entity, entity_key, field, old_value, new_value, "
    "prev_hash, hash, account FROM counterpoise.audit WHERE case_ref = $1";

// verify reads the audit in pages of this many rows: bounded memory for a long chain.
constexpr std::int64_t kAuditPage = 5000;

AuditRow audit_row_at(const PgResult& r, int i) {
  AuditRow row;
  row.seq = r.integer(i, 0);
  row.revision = r.integer(i, 1);
  row.at = r.text(i, 2);
  row.examiner = r.text(i, 3);
  row.action = r.text(i, 4);
  row.entity = r.text(i, 5);
  row.key = r.text(i, 6);
  row.field = r.text(i, 7);
  row.old_value = r.optional_text(i, 8);
  row.new_value = r.optional_text(i, 9);
  row.prev_hash = r.text(i, 10);
  row.hash = r.text(i, 11);
  row.account = r.optional_text(i, 12);
  return row;
}

}  // namespace

PgResult PostgresBackend::write(const char* sql, const std::vector<PgParam>& params) {
  try {
    return db_->run(sql, params);
  } catch (const StoreAccessDenied&) {
    throw StoreAccessDenied(
        {}, where_ + ": the database refused this change for the database role " + role_ +
                ": only the case's examiners edit it and seal it; its reviewers add review "
                "notes; its readers only read");
  }
}

PostgresBackend::PostgresBackend(const DatabaseCase& address, const StoreOptions& options)
    : reference_(address.reference), where_(address.label()) {
  db_ = std::make_unique<PgConnection>(address.connection, where_);
  check_postgres_store(*db_);
  role_ = db_->run("SELECT current_user").text(0, 0);
  // An edit waiting for another's row lock gives up after the store's busy timeout.
  db_->run("SELECT set_config('lock_timeout', $1, false)",
           {PgParam::text(std::to_string(options.busy_timeout_ms) + "ms")});
}

PostgresBackend::~PostgresBackend() = default;

std::unique_ptr<PostgresBackend> PostgresBackend::open(const DatabaseCase& address, OpenMode mode,
                                                       const StoreOptions& options) {
  std::unique_ptr<PostgresBackend> backend(new PostgresBackend(address, options));
  PgConnection& db = *backend->db_;
  if (db.run("SELECT 1 FROM counterpoise.cases WHERE case_ref = $1",
             {PgParam::text(backend->reference_)})
          .rows() != 1)
    throw FileError({}, backend->where_ +
                            ": there is no case with this reference that the "
                            "database role " +
                            backend->role_ +
                            " may read (the reference is wrong, or the role is not a member of "
                            "the case)");
  if (mode == OpenMode::read_only) db.execute("SET default_transaction_read_only = on");
  return backend;
}

std::optional<std::string> PostgresBackend::edit_refusal() {
  // A role sees its own memberships (the members table's own_membership policy).
  PgResult own = db_->run(
      "SELECT role FROM counterpoise.members WHERE case_ref = $1 AND member = current_user",
      {PgParam::text(reference_)});
  const std::string role = own.rows() == 1 ? own.text(0, 0) : std::string();
  if (role == member_role::examiner) return std::nullopt;
  return "the database role " + role_ + " is " +
         (role.empty() ? std::string("not a member") : "a " + role) +
         " of this case: only its examiners edit it and seal it";
}

std::optional<std::string> PostgresBackend::member_role(const std::string& member) {
  // A member of a case reads its members (the members table's case_members_read policy).
  PgResult r = db_->run(
      "SELECT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = $2), (SELECT role FROM "
      "counterpoise.members WHERE case_ref = $1 AND member = $2)",
      {PgParam::text(reference_), PgParam::text(member)});
  if (!r.is_null(0, 1)) return r.text(0, 1);  // a member, even if its role was dropped since
  if (r.text(0, 0) != "t")
    throw validation::InvalidValue({"member", "name"}, "there is no database role with this name");
  return std::nullopt;
}

std::unique_ptr<PostgresBackend> PostgresBackend::open_new(const DatabaseCase& address,
                                                           const StoreOptions& options) {
  return std::unique_ptr<PostgresBackend>(new PostgresBackend(address, options));
}

void PostgresBackend::create_case(const CaseState& state, const AuditRow& import_row) {
  in_write_ = true;
  db_->execute("BEGIN");
  try {
    const std::string head = std::to_string(import_row.seq) + " " + import_row.hash;
    try {
      // A plain INSERT: with ON CONFLICT the new row would have to pass the members' read
      // policy before the trigger has made its creator a member.
      db_->run("INSERT INTO counterpoise.cases(case_ref, chain_head) VALUES ($1, $2)",
               {PgParam::text(reference_), PgParam::text(head)});
    } catch (const FileError&) {
      if (db_->last_sqlstate() != "23505") throw;  // unique_violation: the reference is taken
      throw FileError({}, where_ +
                              ": a case with this reference already exists in the "
                              "database; choose another reference (an existing case is "
                              "never replaced)");
    }
    insert_revision(1, 1);
    insert_audit_row(import_row);
    for (const auto& [name, value] : state.sections()) put_section(name, canonical_text(value));
    for (std::size_t i = 0; i < state.items().size(); ++i)
      insert_item({state.items()[i].first, static_cast<std::int64_t>(i),
                   canonical_text(state.items()[i].second)});
    commit_write();
  } catch (...) {
    rollback_write();
    throw;
  }
}

std::map<std::string, std::string> PostgresBackend::sections() {
  std::map<std::string, std::string> out;
  const PgResult r = db_->run("SELECT name, body FROM counterpoise.sections WHERE case_ref = $1",
                              {PgParam::text(reference_)});
  for (int i = 0; i < r.rows(); ++i) out[r.text(i, 0)] = r.text(i, 1);
  return out;
}

std::vector<StoredItem> PostgresBackend::items() {
  std::vector<StoredItem> out;
  const PgResult r = db_->run(
      "SELECT item_id, position, body FROM counterpoise.items WHERE case_ref = $1 "
      "ORDER BY position, item_id COLLATE \"C\"",
      {PgParam::text(reference_)});
  for (int i = 0; i < r.rows(); ++i) out.push_back({r.text(i, 0), r.integer(i, 1), r.text(i, 2)});
  return out;
}

std::optional<AuditRow> PostgresBackend::last_audit_row() {
  const std::string sql = std::string(kSelectAudit) + " ORDER BY seq DESC LIMIT 1";
  const PgResult r = db_->run(sql.c_str(), {PgParam::text(reference_)});
  if (r.rows() == 0) return std::nullopt;
  return audit_row_at(r, 0);
}

void PostgresBackend::each_audit_row(const std::function<void(const AuditRow&)>& visit) {
  const std::string sql = std::string(kSelectAudit) + " AND seq > $2 ORDER BY seq LIMIT $3";
  std::int64_t after = 0;
  while (true) {
    const PgResult r = db_->run(sql.c_str(), {PgParam::text(reference_), PgParam::integer(after),
                                              PgParam::integer(kAuditPage)});
    for (int i = 0; i < r.rows(); ++i) {
      const AuditRow row = audit_row_at(r, i);
      after = row.seq;
      visit(row);
    }
    if (r.rows() < kAuditPage) return;
  }
}

std::optional<AuditRow> PostgresBackend::audit_row(std::int64_t seq) {
  const std::string sql = std::string(kSelectAudit) + " AND seq = $2";
  const PgResult r = db_->run(sql.c_str(), {PgParam::text(reference_), PgParam::integer(seq)});
  if (r.rows() == 0) return std::nullopt;
  return audit_row_at(r, 0);
}

std::vector<std::string> PostgresBackend::new_values_of(const char* action) {
  std::vector<std::string> out;
  const PgResult r = db_->run(
      "SELECT new_value FROM counterpoise.audit WHERE case_ref = $1 AND action = $2 ORDER BY seq",
      {PgParam::text(reference_), PgParam::text(action)});
  for (int i = 0; i < r.rows(); ++i) out.push_back(r.text(i, 0));
  return out;
}

std::vector<StoredRevision> PostgresBackend::revisions(bool with_content) {
  std::vector<StoredRevision> out;
  const PgResult r = db_->run(
      with_content ? "SELECT revision, opened_seq, sealed_seq, sealed_at, sealed_by, state_sha256, "
                     "report_file_name, report_sha256, state_json, report_bytes "
                     "FROM counterpoise.revisions WHERE case_ref = $1 ORDER BY revision"
                   : "SELECT revision, opened_seq, sealed_seq, sealed_at, sealed_by, state_sha256, "
                     "report_file_name, report_sha256, NULL, NULL "
                     "FROM counterpoise.revisions WHERE case_ref = $1 ORDER BY revision",
      {PgParam::text(reference_)});
  for (int i = 0; i < r.rows(); ++i) {
    StoredRevision s;
    s.revision = r.integer(i, 0);
    s.opened_seq = r.integer(i, 1);
    if (!r.is_null(i, 2)) s.sealed_seq = r.integer(i, 2);
    s.sealed_at = r.text(i, 3);
    s.sealed_by = r.text(i, 4);
    s.state_sha256 = r.text(i, 5);
    s.report_file_name = r.text(i, 6);
    s.report_sha256 = r.text(i, 7);
    s.state_json = r.text(i, 8);
    if (with_content) s.report_bytes = r.bytes(i, 9);
    out.push_back(std::move(s));
  }
  return out;
}

std::optional<std::string> PostgresBackend::sealed_state_json(std::int64_t revision) {
  const PgResult r = db_->run(
      "SELECT state_json FROM counterpoise.revisions WHERE case_ref = $1 AND revision = $2 "
      "AND sealed_seq IS NOT NULL",
      {PgParam::text(reference_), PgParam::integer(revision)});
  if (r.rows() == 0) return std::nullopt;
  return r.text(0, 0);
}

std::optional<std::string> PostgresBackend::sealed_report_bytes(std::int64_t revision) {
  const PgResult r = db_->run(
      "SELECT report_bytes FROM counterpoise.revisions WHERE case_ref = $1 AND revision = $2 "
      "AND sealed_seq IS NOT NULL",
      {PgParam::text(reference_), PgParam::integer(revision)});
  if (r.rows() == 0) return std::nullopt;
  return r.bytes(0, 0);
}

std::string PostgresBackend::chain_head() {
  const PgResult r = db_->run("SELECT chain_head FROM counterpoise.cases WHERE case_ref = $1",
                              {PgParam::text(reference_)});
  return r.rows() == 1 ? r.text(0, 0) : std::string();
}

void PostgresBackend::begin_snapshot() {
  if (in_write_ || snapshot_depth_++ > 0) return;
  db_->execute("BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY");
}

void PostgresBackend::end_snapshot() noexcept {
  if (in_write_ || snapshot_depth_ == 0 || --snapshot_depth_ > 0) return;
  try {
    if (db_->alive()) db_->execute("COMMIT");
  } catch (const std::exception&) {
    // A read-only snapshot has nothing to keep; a failure here is the next statement's to report.
  }
}

void PostgresBackend::begin_write() {
  db_->execute("BEGIN");
  in_write_ = true;
  // The case's row lock serialises writers: a second edit waits here until the first commits,
  // then sees its rows (and is refused as based on an older state).
  if (db_->run("SELECT 1 FROM counterpoise.cases WHERE case_ref = $1 FOR UPDATE",
               {PgParam::text(reference_)})
          .rows() != 1)
    throw StoreAccessDenied(
        {}, where_ + ": the database role " + role_ +
                " may not change this case (examiners edit it, reviewers add review notes, "
                "readers only read)");
}

void PostgresBackend::commit_write() {
  try {
    db_->execute("COMMIT");
  } catch (const FileError&) {
    in_write_ = false;
    // The server refused the COMMIT (it said why, with an SQLSTATE): nothing was committed.
    // Otherwise the connection failed around it and the outcome is unknown.
    if (db_->alive() && !db_->last_sqlstate().empty()) throw;
    throw FileError({}, where_ +
                            ": the connection to the database was lost while the change "
                            "was being committed; whether it was committed is not known. "
                            "Open the case again and look at its history before repeating "
                            "it.");
  }
  in_write_ = false;
}

void PostgresBackend::rollback_write() noexcept {
  if (!in_write_) return;
  in_write_ = false;
  try {
    if (db_->alive()) db_->execute("ROLLBACK");
  } catch (const std::exception&) {
    // Nothing was committed; a broken connection rolls back by itself on the server.
  }
}

void PostgresBackend::insert_audit_row(const AuditRow& row) {
  write(
      "INSERT INTO counterpoise.audit(case_ref, seq, revision, at, examiner, account, action, "
      "entity, entity_key, field, old_value, new_value, prev_hash, hash) "
      "VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14)",
      {PgParam::text(reference_), PgParam::integer(row.seq), PgParam::integer(row.revision),
       PgParam::text(row.at), PgParam::text(row.examiner), PgParam::optional(row.account),
       PgParam::text(row.action), PgParam::text(row.entity), PgParam::text(row.key),
       PgParam::text(row.field), PgParam::optional(row.old_value), PgParam::optional(row.new_value),
       PgParam::text(row.prev_hash), PgParam::text(row.hash)});
}

void PostgresBackend::insert_revision(std::int64_t revision, std::int64_t opened_seq) {
  write("INSERT INTO counterpoise.revisions(case_ref, revision, opened_seq) VALUES ($1, $2, $3)",
        {PgParam::text(reference_), PgParam::integer(revision), PgParam::integer(opened_seq)});
}

void PostgresBackend::put_section(const std::string& name, const std::string& body) {
  write(
      "INSERT INTO counterpoise.sections(case_ref, name, body) VALUES ($1, $2, $3) "
      "ON CONFLICT (case_ref, name) DO UPDATE SET body = EXCLUDED.body",
      {PgParam::text(reference_), PgParam::text(name), PgParam::text(body)});
}

void PostgresBackend::delete_section(const std::string& name) {
  write("DELETE FROM counterpoise.sections WHERE case_ref = $1 AND name = $2",
        {PgParam::text(reference_), PgParam::text(name)});
}

void PostgresBackend::insert_item(const StoredItem& item) {
  write("INSERT INTO counterpoise.items(case_ref, item_id, position, body) VALUES ($1, $2, $3, $4)",
        {PgParam::text(reference_), PgParam::text(item.id), PgParam::integer(item.position),
         PgParam::text(item.body)});
}

void PostgresBackend::update_item(const StoredItem& item) {
  write(
      "UPDATE counterpoise.items SET position = $3, body = $4 WHERE case_ref = $1 AND item_id = $2",
      {PgParam::text(reference_), PgParam::text(item.id), PgParam::integer(item.position),
       PgParam::text(item.body)});
}

void PostgresBackend::delete_item(const std::string& id) {
  write("DELETE FROM counterpoise.items WHERE case_ref = $1 AND item_id = $2",
        {PgParam::text(reference_), PgParam::text(id)});
}

void PostgresBackend::seal_revision(const SealedRevisionRecord& record) {
  const PgResult r = write(
      "UPDATE counterpoise.revisions SET sealed_seq = $3, sealed_at = $4, sealed_by = $5, "
      "state_json = $6, state_sha256 = $7, report_file_name = $8, report_bytes = $9, "
      "report_sha256 = $10 WHERE case_ref = $1 AND revision = $2 AND sealed_seq IS NULL "
      "RETURNING revision",
      {PgParam::text(reference_), PgParam::integer(record.revision),
       PgParam::integer(record.sealed_seq), PgParam::text(record.sealed_at),
       PgParam::text(record.sealed_by), PgParam::text(record.state_json),
       PgParam::text(record.state_sha256), PgParam::text(record.report_file_name),
       PgParam::bytes(record.report_bytes), PgParam::text(record.report_sha256)});
  if (r.rows() != 1)
    throw FileError({}, where_ + ": the revision to seal is missing or already sealed");
}

void PostgresBackend::write_chain_head(std::int64_t seq, const std::string& hash) {
  write("UPDATE counterpoise.cases SET chain_head = $2 WHERE case_ref = $1",
        {PgParam::text(reference_), PgParam::text(std::to_string(seq) + " " + hash)});
}

}  // namespace counterpoise::store
