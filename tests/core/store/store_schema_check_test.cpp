// A case file from elsewhere may carry its own triggers, views, indexes or tables, which SQLite
// would run or use when the program touches the file. The store compares the file's schema with
// its own before using it and refuses anything else with a message naming the object
// (sqlite.org/security.html, "Untrusted SQLite database files": defensive mode, untrusted schema,
// limits; the schema check is ours).
#include <catch2/catch.hpp>

#include "core/store/case_store.hpp"
#include "core/store/document_loader.hpp"
#include "core/store/store_schema.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::UnsupportedFormat;
using store_test::kThwaite;
using store_test::raw_sql;
using store_test::TempDir;

namespace {

std::filesystem::path plain_case(const TempDir& dir) {
  const auto path = dir / "case.cpcase";
  CaseStore::create(path, store_test::sample_case(), kThwaite);
  return path;
}

// A recursive query that would count to 10^12 if it ever ran.
constexpr const char* kEndless =
    "WITH RECURSIVE c(x) AS (SELECT 1 UNION ALL SELECT x + 1 FROM c WHERE x < 1000000000000) "
    "SELECT count(*) FROM c";

}  // namespace

TEST_CASE("a case file carrying an object the program did not create is refused, naming it",
          "[store][schema]") {
  TempDir dir;
  const auto path = plain_case(dir);
  const auto [sql, expected] = GENERATE(table<std::string, std::string>({
      {std::string("CREATE TRIGGER spy AFTER INSERT ON session BEGIN ") + kEndless + "; END",
       "trigger \"spy\" (on table \"session\") that this program did not create"},
      {std::string("CREATE TRIGGER on_read BEFORE UPDATE ON items BEGIN ") + kEndless + "; END",
       "trigger \"on_read\""},
      {std::string("CREATE VIEW slow AS ") + kEndless, "view \"slow\""},
      {"CREATE INDEX by_length ON items(length(body))", "index \"by_length\" (on table \"items\")"},
      {"CREATE TABLE extra(x)", "table \"extra\" that this program did not create"},
  }));
  INFO(sql);
  raw_sql(path, sql);
  const std::string before = store_test::file_digest(path);
  for (const OpenMode mode : {OpenMode::edit, OpenMode::read_only}) {
    CHECK_THROWS_AS(CaseStore::open(path, mode), UnsupportedFormat);
    CHECK_THROWS_WITH(CaseStore::open(path, mode),
                      Contains(expected) && Contains(path.string()) &&
                          Contains("could carry code that runs"));
  }
  CHECK_THROWS_AS(load_case_document(path), UnsupportedFormat);  // evaluate, validate, report
  CHECK(store_test::file_digest(path) == before);
}

TEST_CASE("a dropped or redefined object of the program's own is refused too", "[store][schema]") {
  TempDir dir;
  const auto path = plain_case(dir);
  SECTION("a protective trigger dropped") {
    raw_sql(path, "DROP TRIGGER audit_append_only_update");
    CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::read_only),
                      Contains("lacks the trigger \"audit_append_only_update\""));
  }
  SECTION("a protective trigger replaced by one that does something else") {
    raw_sql(path,
            "DROP TRIGGER audit_append_only_delete; CREATE TRIGGER audit_append_only_delete "
            "BEFORE DELETE ON audit BEGIN SELECT 1; END");
    CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::read_only),
                      Contains("trigger \"audit_append_only_delete\" (on table \"audit\") differs"));
  }
  SECTION("a table rebuilt with a CHECK that makes 900 MB of random bytes for every row checked") {
    // The rows are copied over with the check switched off, as the one who made the file would.
    raw_sql(path, "PRAGMA foreign_keys = OFF; PRAGMA ignore_check_constraints = ON; ALTER TABLE items RENAME TO old_items; "
                  "CREATE TABLE items(item_id TEXT PRIMARY KEY, position INTEGER NOT NULL, "
                  "body TEXT NOT NULL CHECK (length(randomblob(900000000)) > 0)) STRICT; "
                  "INSERT INTO items SELECT * FROM old_items; DROP TABLE old_items");
    CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::edit), Contains("table \"items\" differs"));
  }
  SECTION("a column added") {
    raw_sql(path, "ALTER TABLE items ADD COLUMN extra TEXT");
    CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::read_only),
                      Contains("table \"items\" differs"));
  }
}

TEST_CASE("the program's own files, new and upgraded, pass the schema check", "[store][schema]") {
  TempDir dir;
  const auto path = plain_case(dir);
  CHECK_NOTHROW(CaseStore::open(path, OpenMode::read_only));
  const auto old = dir / "old.cpcase";
  std::filesystem::copy_file(
      std::filesystem::path(COUNTERPOISE_TEST_DATA_DIR) / "store" / "version1.cpcase", old);
  CHECK_NOTHROW(CaseStore::open(old, OpenMode::read_only));  // version 1 as it is
  { CaseStore upgraded = CaseStore::open(old, OpenMode::edit); }
  CHECK_NOTHROW(CaseStore::open(old, OpenMode::read_only));  // version 1 + the version 2 step
}

TEST_CASE("a case file switched to write-ahead-log mode is refused before SQLite opens it",
          "[store][schema]") {
  TempDir dir;
  const auto path = plain_case(dir);
  raw_sql(path, "PRAGMA journal_mode = WAL");
  CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::read_only), Contains("write-ahead-log"));
}
