#include "core/store/sqlite_connection.hpp"

#include <sqlite3.h>

#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using validation::FileError;

std::string explain_sqlite_code(int rc) {
  switch (rc & 0xff) {
    case SQLITE_FULL:
      return "the disk (or the case file's size limit) is full";
    case SQLITE_READONLY:
      return "the case file cannot be written (read-only file, folder or session)";
    case SQLITE_BUSY:
    case SQLITE_LOCKED:
      return "the case file is busy in another process (timed out waiting)";
    case SQLITE_CORRUPT:
      return "the case file is damaged";
    case SQLITE_NOTADB:
      return "the file is not a case file (not an SQLite database)";
    case SQLITE_IOERR:
      return "an input/output error occurred while accessing the case file";
    case SQLITE_CANTOPEN:
      return "the case file cannot be opened";
    case SQLITE_PERM:
      return "permission denied";
    case SQLITE_NOMEM:
      return "out of memory";
    case SQLITE_CONSTRAINT:
      return "a rule of the case file was violated";
    default:
      return "database error";
  }
}

namespace {

// Limits for a database file from elsewhere (sqlite.org/security.html, "Untrusted SQLite
// database files"). The program's own statements are short and shallow; the schema's CREATE
// texts are a few hundred bytes; the largest value is a sealed report (PDF bytes).
struct Limit {
  int id;
  int value;
};
constexpr Limit kConnectionLimits[] = {
    {SQLITE_LIMIT_LENGTH, 256 * 1024 * 1024},  // a value: sealed report bytes are the largest
    {SQLITE_LIMIT_SQL_LENGTH, 100000},         // a statement, schema texts included
    {SQLITE_LIMIT_COLUMN, 100},
    {SQLITE_LIMIT_EXPR_DEPTH, 100},
    {SQLITE_LIMIT_COMPOUND_SELECT, 4},
    {SQLITE_LIMIT_VDBE_OP, 25000},
    {SQLITE_LIMIT_FUNCTION_ARG, 8},
    {SQLITE_LIMIT_ATTACHED, 0},
    {SQLITE_LIMIT_LIKE_PATTERN_LENGTH, 100},
    {SQLITE_LIMIT_VARIABLE_NUMBER, 32},
    {SQLITE_LIMIT_TRIGGER_DEPTH, 2},
};

}  // namespace

Connection::Connection(const std::filesystem::path& path, Access access) : path_(path) {
  int flags = SQLITE_OPEN_NOMUTEX | SQLITE_OPEN_PRIVATECACHE;
  if (access == Access::read_only) flags |= SQLITE_OPEN_READONLY;
  if (access == Access::read_write) flags |= SQLITE_OPEN_READWRITE;
  if (access == Access::in_memory) flags |= SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE | SQLITE_OPEN_MEMORY;
  const int rc = sqlite3_open_v2(path.c_str(), &db_, flags, nullptr);
  if (rc != SQLITE_OK) {
    const std::string detail = db_ ? sqlite3_errmsg(db_) : "out of memory";
    sqlite3_close(db_);
    db_ = nullptr;
    throw FileError({}, "cannot open case file '" + path.string() +
                            "': " + explain_sqlite_code(rc) + " (" + detail + ")");
  }
  sqlite3_extended_result_codes(db_, 1);
  // Input never chooses SQL, but a case file from elsewhere chooses its schema: switch off what
  // no case file needs (sqlite.org/security.html). Views are never used by the program, so a
  // view in a file can never run; the schema check (store_schema.hpp) refuses them anyway.
  sqlite3_db_config(db_, SQLITE_DBCONFIG_ENABLE_LOAD_EXTENSION, 0, nullptr);
  sqlite3_db_config(db_, SQLITE_DBCONFIG_DEFENSIVE, 1, nullptr);
  sqlite3_db_config(db_, SQLITE_DBCONFIG_TRUSTED_SCHEMA, 0, nullptr);
  sqlite3_db_config(db_, SQLITE_DBCONFIG_ENABLE_VIEW, 0, nullptr);
  sqlite3_db_config(db_, SQLITE_DBCONFIG_DQS_DDL, 0, nullptr);
  sqlite3_db_config(db_, SQLITE_DBCONFIG_DQS_DML, 0, nullptr);
  for (const Limit& limit : kConnectionLimits) sqlite3_limit(db_, limit.id, limit.value);
}

Connection::~Connection() { sqlite3_close_v2(db_); }

void Connection::set_busy_timeout(int ms) { sqlite3_busy_timeout(db_, ms); }

std::int64_t Connection::changes() const { return sqlite3_changes64(db_); }

void Connection::fail(int rc, const std::string& what) const {
  throw FileError({}, "case file '" + path_.string() + "': " + what + ": " +
                          explain_sqlite_code(rc) + " (" + sqlite3_errmsg(db_) + ")");
}

void Connection::execute(const char* sql) {
  char* message = nullptr;
  const int rc = sqlite3_exec(db_, sql, nullptr, nullptr, &message);
  if (rc != SQLITE_OK) {
    std::string detail = message ? message : "";
    sqlite3_free(message);
    fail(rc, detail.empty() ? "statement failed" : detail);
  }
}

std::int64_t Connection::query_int(const char* sql) {
  Statement statement(*this, sql);
  if (!statement.step()) fail(SQLITE_ERROR, "query returned no row");
  return statement.column_int(0);
}

std::string Connection::query_text(const char* sql) {
  Statement statement(*this, sql);
  if (!statement.step()) fail(SQLITE_ERROR, "query returned no row");
  return statement.column_text(0);
}

Statement::Statement(Connection& connection, const char* sql) : connection_(connection) {
  const int rc = sqlite3_prepare_v3(connection.handle(), sql, -1, SQLITE_PREPARE_PERSISTENT,
                                    &statement_, nullptr);
  if (rc != SQLITE_OK) connection.fail(rc, "preparing a statement");
}

Statement::~Statement() { sqlite3_finalize(statement_); }

namespace {
void check_bind(Connection& c, int rc) {
  if (rc != SQLITE_OK) c.fail(rc, "binding a value");
}
}  // namespace

Statement& Statement::bind(int index, std::int64_t value) {
  check_bind(connection_, sqlite3_bind_int64(statement_, index, value));
  return *this;
}

Statement& Statement::bind(int index, std::string_view text) {
  check_bind(connection_, sqlite3_bind_text64(statement_, index, text.data(), text.size(),
                                              SQLITE_TRANSIENT, SQLITE_UTF8));
  return *this;
}

Statement& Statement::bind_blob(int index, std::string_view bytes) {
  // A zero-length blob must still be a blob, not NULL: SQLite wants a non-null pointer.
  static const char kEmpty = 0;
  check_bind(connection_,
             sqlite3_bind_blob64(statement_, index, bytes.empty() ? &kEmpty : bytes.data(),
                                 bytes.size(), SQLITE_TRANSIENT));
  return *this;
}

Statement& Statement::bind_null(int index) {
  check_bind(connection_, sqlite3_bind_null(statement_, index));
  return *this;
}

Statement& Statement::bind_optional(int index, const std::optional<std::string>& text) {
  return text ? bind(index, *text) : bind_null(index);
}

bool Statement::step() {
  const int rc = sqlite3_step(statement_);
  if (rc == SQLITE_ROW) return true;
  if (rc == SQLITE_DONE) return false;
  sqlite3_reset(statement_);
  connection_.fail(rc, "executing a statement");
}

void Statement::run() {
  while (step()) {
  }
  reset();
}

void Statement::reset() {
  sqlite3_reset(statement_);
  sqlite3_clear_bindings(statement_);
}

std::int64_t Statement::column_int(int column) const {
  return sqlite3_column_int64(statement_, column);
}

std::string Statement::column_text(int column) const {
  const auto* text = reinterpret_cast<const char*>(sqlite3_column_text(statement_, column));
  const int length = sqlite3_column_bytes(statement_, column);
  return text ? std::string(text, static_cast<std::size_t>(length)) : std::string();
}

std::optional<std::string> Statement::column_optional_text(int column) const {
  if (column_is_null(column)) return std::nullopt;
  return column_text(column);
}

std::string Statement::column_blob(int column) const {
  const auto* bytes = static_cast<const char*>(sqlite3_column_blob(statement_, column));
  const int length = sqlite3_column_bytes(statement_, column);
  return bytes ? std::string(bytes, static_cast<std::size_t>(length)) : std::string();
}

bool Statement::column_is_null(int column) const {
  return sqlite3_column_type(statement_, column) == SQLITE_NULL;
}

WriteTransaction::WriteTransaction(Connection& connection) : connection_(connection) {
  connection_.execute("BEGIN IMMEDIATE");
}

WriteTransaction::~WriteTransaction() {
  if (open_) sqlite3_exec(connection_.handle(), "ROLLBACK", nullptr, nullptr, nullptr);
}

void WriteTransaction::commit() {
  connection_.execute("COMMIT");
  open_ = false;
}

}  // namespace counterpoise::store
