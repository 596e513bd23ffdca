#pragma once
// A thin owner of a SQLite connection and its prepared statements (SQLite C API).
// Every statement text is a constant of the store; values are always bound, never spliced.
// SQLite failures become validation::FileError naming the case file and what SQLite said.

#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>

struct sqlite3;
struct sqlite3_stmt;

namespace counterpoise::store {

class Connection;

// One prepared statement; reset and re-bound for each use.
class Statement {
 public:
  Statement(Connection& connection, const char* sql);
  ~Statement();
  Statement(const Statement&) = delete;
  Statement& operator=(const Statement&) = delete;

  // Binders take 1-based parameter indexes, as SQLite does. Throw FileError on failure.
  Statement& bind(int index, std::int64_t value);
  Statement& bind(int index, std::string_view text);
  Statement& bind_blob(int index, std::string_view bytes);
  Statement& bind_null(int index);
  Statement& bind_optional(int index, const std::optional<std::string>& text);

  // Advances: true when a row is available, false when done. Throws FileError on an error.
  bool step();
  // Runs to completion (for statements without result rows) and resets.
  void run();
  void reset();

  std::int64_t column_int(int column) const;
  std::string column_text(int column) const;  // "" for NULL
  std::optional<std::string> column_optional_text(int column) const;
  std::string column_blob(int column) const;
  bool column_is_null(int column) const;

 private:
  Connection& connection_;
  sqlite3_stmt* statement_ = nullptr;
};

class Connection {
 public:
  enum class Access { read_only, read_write, in_memory };
  // Opens an existing file (never creates one), or with in_memory a new empty database in
  // memory (path ":memory:"). Every connection is hardened for untrusted files: no extension
  // loading, defensive mode, untrusted schema, no views, double-quoted strings off, and the
  // limits of kConnectionLimits. Throws FileError when SQLite cannot open it.
  Connection(const std::filesystem::path& path, Access access);
  ~Connection();
  Connection(const Connection&) = delete;
  Connection& operator=(const Connection&) = delete;

  // Runs constant SQL without parameters (pragmas, schema, BEGIN/COMMIT). Throws FileError.
  void execute(const char* sql);
  // The single integer an integer-valued pragma or query returns. Throws FileError.
  std::int64_t query_int(const char* sql);
  std::string query_text(const char* sql);

  // Waits up to `ms` milliseconds for another connection's lock before SQLITE_BUSY.
  void set_busy_timeout(int ms);
  // Rows changed by the last INSERT, UPDATE or DELETE.
  std::int64_t changes() const;

  // Throws FileError for SQLite result code `rc` with `what` in the message.
  [[noreturn]] void fail(int rc, const std::string& what) const;

  sqlite3* handle() const noexcept { return db_; }
  const std::filesystem::path& path() const noexcept { return path_; }

 private:
  std::filesystem::path path_;
  sqlite3* db_ = nullptr;
};

// A transaction opened with BEGIN IMMEDIATE (takes the write lock at once, waiting up to the
// busy timeout) and rolled back unless commit() is reached.
class WriteTransaction {
 public:
  explicit WriteTransaction(Connection& connection);
  ~WriteTransaction();
  WriteTransaction(const WriteTransaction&) = delete;
  WriteTransaction& operator=(const WriteTransaction&) = delete;
  void commit();

 private:
  Connection& connection_;
  bool open_ = true;
};

// A user-facing explanation of a SQLite result code ("the disk is full", "the file is damaged").
std::string explain_sqlite_code(int rc);

}  // namespace counterpoise::store
