// Every connection the store opens is hardened as SQLite's documentation advises for database
// files from elsewhere (sqlite.org/security.html, "Defense Against The Dark Arts", section
// "Untrusted SQLite Database Files": SQLITE_DBCONFIG_DEFENSIVE, trusted_schema off, limits on
// lengths and SQL complexity, no extension loading, no ATTACH). Checked on the connection itself,
// by asking SQLite for each setting and by statements the settings must refuse.
#include "core/store/sqlite_connection.hpp"

#include <string>

#include <catch2/catch.hpp>
#include <sqlite3.h>

#include "core/validation/input_error.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;

namespace {

// The current value of a boolean database option (sqlite3_db_config with -1 only reads it).
int db_config(sqlite3* db, int option) {
  int value = -1;
  REQUIRE(sqlite3_db_config(db, option, -1, &value) == SQLITE_OK);
  return value;
}

}  // namespace

TEST_CASE("a store connection turns off what no case file needs", "[store][sqlite]") {
  store_test::TempDir dir;
  const auto path = dir / "plain.db";
  store_test::raw_sql(path, "CREATE TABLE t(x)");
  for (const auto access : {Connection::Access::read_only, Connection::Access::read_write}) {
    Connection connection(path, access);
    sqlite3* db = connection.handle();
    CHECK(db_config(db, SQLITE_DBCONFIG_DEFENSIVE) == 1);
    CHECK(db_config(db, SQLITE_DBCONFIG_TRUSTED_SCHEMA) == 0);
    CHECK(db_config(db, SQLITE_DBCONFIG_ENABLE_LOAD_EXTENSION) == 0);
    CHECK(db_config(db, SQLITE_DBCONFIG_ENABLE_VIEW) == 0);
    CHECK(db_config(db, SQLITE_DBCONFIG_DQS_DDL) == 0);
    CHECK(db_config(db, SQLITE_DBCONFIG_DQS_DML) == 0);
    // sqlite3_limit with a negative value reads the limit without changing it.
    CHECK(sqlite3_limit(db, SQLITE_LIMIT_ATTACHED, -1) == 0);
    CHECK(sqlite3_limit(db, SQLITE_LIMIT_SQL_LENGTH, -1) == 100000);
    CHECK(sqlite3_limit(db, SQLITE_LIMIT_LENGTH, -1) == 256 * 1024 * 1024);
    CHECK(sqlite3_limit(db, SQLITE_LIMIT_EXPR_DEPTH, -1) == 100);
    CHECK(sqlite3_limit(db, SQLITE_LIMIT_VDBE_OP, -1) == 25000);
  }
}

TEST_CASE("a store connection refuses the statements a hostile file would need", "[store][sqlite]") {
  Connection connection(":memory:", Connection::Access::in_memory);
  // No other database can be attached (SQLITE_LIMIT_ATTACHED = 0).
  CHECK_THROWS_AS(connection.execute("ATTACH DATABASE ':memory:' AS other"), FileError);
  // No extension can be loaded from SQL.
  CHECK_THROWS_AS(connection.query_int("SELECT load_extension('libnothing')"), FileError);
  // A view can be created but never used.
  connection.execute("CREATE VIEW v AS SELECT 1 AS x");
  CHECK_THROWS_AS(connection.query_int("SELECT x FROM v"), FileError);
  // A double-quoted word is an identifier, never a string.
  CHECK_THROWS_AS(connection.query_text("SELECT \"not a column\""), FileError);
  // A value longer than SQLITE_LIMIT_LENGTH is refused, not built.
  CHECK_THROWS_AS(connection.query_int("SELECT length(zeroblob(300 * 1024 * 1024))"), FileError);
  // A statement longer than SQLITE_LIMIT_SQL_LENGTH is refused before it is parsed.
  const std::string long_sql = "SELECT 1" + std::string(100001, ' ');
  CHECK_THROWS_AS(connection.query_int(long_sql.c_str()), FileError);
  // Defensive mode: the schema cannot be written as a table.
  CHECK_THROWS_AS(connection.execute("PRAGMA writable_schema = ON; UPDATE sqlite_schema SET sql = ''"),
                  FileError);
}
