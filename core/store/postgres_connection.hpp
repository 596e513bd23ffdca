#pragma once
// A thin owner of a libpq connection (PostgreSQL's C client library) for the shared case store.
// Every statement text is a constant of the store; values are always passed as parameters,
// never spliced into SQL. Failures become validation::FileError (or a subclass) whose message
// starts with where the case is and says what the server said; a password never appears, since
// the program never holds one (libpq reads it from the password or service file).

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/validation/input_error.hpp"

struct pg_conn;
struct pg_result;

namespace counterpoise::store {

// Raised when the database refuses a change or a read because of the role's rights (row-level
// security, privileges): the role is not a member of the case, or a reviewer or reader tried
// to edit.
class StoreAccessDenied : public validation::FileError {
 public:
  using validation::FileError::FileError;
};

// One statement parameter: text (or NULL), or bytes sent in binary (bytea).
struct PgParam {
  std::optional<std::string> value;
  bool binary = false;

  static PgParam text(std::string value) { return {std::move(value), false}; }
  static PgParam integer(std::int64_t value) { return {std::to_string(value), false}; }
  static PgParam bytes(std::string value) { return {std::move(value), true}; }
  static PgParam optional(const std::optional<std::string>& value) { return {value, false}; }
};

// The rows a statement returned (text format).
class PgResult {
 public:
  explicit PgResult(pg_result* result) : result_(result) {}
  ~PgResult();
  PgResult(PgResult&& other) noexcept : result_(other.result_) { other.result_ = nullptr; }
  PgResult& operator=(PgResult&&) = delete;
  PgResult(const PgResult&) = delete;
  PgResult& operator=(const PgResult&) = delete;

  int rows() const;
  bool is_null(int row, int column) const;
  std::string text(int row, int column) const;  // "" for NULL
  std::optional<std::string> optional_text(int row, int column) const;
  std::int64_t integer(int row, int column) const;
  std::string bytes(int row, int column) const;  // a bytea column, decoded

 private:
  pg_result* result_;
};

class PgConnection {
 public:
  // Connects with `connection` (a URI or key=value string; "" for the environment alone) and
  // the usual PG environment variables, service file and password file. `where` starts every
  // message. Throws validation::FileError naming what the server or libpq said.
  PgConnection(const std::string& connection, std::string where);
  ~PgConnection();
  PgConnection(const PgConnection&) = delete;
  PgConnection& operator=(const PgConnection&) = delete;

  // Runs one statement with parameters. Throws StoreAccessDenied for a refusal on the role's
  // rights, validation::FileError otherwise (the connection lost, the server's refusal).
  PgResult run(const char* sql, const std::vector<PgParam>& params = {});
  // Runs constant SQL without parameters (several statements allowed).
  void execute(const char* sql);
  // True when the connection to the server is still up.
  bool alive() const;
  // The SQLSTATE of the last failure ("" when none): lets callers name a specific refusal.
  const std::string& last_sqlstate() const { return last_sqlstate_; }
  const std::string& where() const { return where_; }

 private:
  PgResult checked(pg_result* result, const char* sql);
  [[noreturn]] void fail(pg_result* result);

  pg_conn* connection_ = nullptr;
  std::string where_;
  std::string last_sqlstate_;
};

}  // namespace counterpoise::store
