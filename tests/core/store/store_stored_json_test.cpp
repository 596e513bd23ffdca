// JSON stored inside a case file is as untrusted as an imported case: an entity body, an audit
// value or a review note planted through the SQLite C API (as with the sqlite3 shell) is read
// with the bounds of an imported case (docs/case-store.md, "Limits for imported JSON") and the
// refusal names the row and the column. The limits are the program's own (common practice: a
// bound on what an untrusted file can make a program hold).
#include <catch2/catch.hpp>

#include <string>

#include "core/store/audit_log.hpp"
#include "core/store/case_store.hpp"
#include "core/store/review_note.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using nlohmann::json;
using store_test::kPryce;
using store_test::kThwaite;
using store_test::TempDir;

namespace {

// Valid JSON nested `depth` arrays deep: far past the limit of 64, tiny to store.
std::string nested_arrays(std::size_t depth) { return std::string(depth, '[') + std::string(depth, ']'); }

// SQL text literal of `text` (quotes doubled).
std::string sql_literal(const std::string& text) {
  std::string out = "'";
  for (char c : text) out += c == '\'' ? std::string("''") : std::string(1, c);
  return out + "'";
}

// A sealed case with a review note as its last audit row.
std::filesystem::path reviewed_case(const TempDir& dir) {
  const auto path = dir / "case.cpcase";
  CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
  store.declare_reviewer(kThwaite, kPryce);
  store.seal_revision(kThwaite, "report", "r1.pdf");
  store.add_review_note(kPryce, 1, ReviewVerdict::agree, "");
  return path;
}

// Replaces the last audit row's new value with `value`, recomputing its hash and the chain head
// as someone who knows the chain's definition (docs/case-store.md) can, so only the value is wrong.
std::int64_t plant_last_value(const std::filesystem::path& path, const std::string& value) {
  AuditRow row = CaseStore::open(path, OpenMode::read_only).audit_rows().back();
  row.new_value = value;
  row.hash = audit_row_hash(row);
  const std::string seq = std::to_string(row.seq);
  store_test::raw_sql_behind_triggers(
      path, "UPDATE audit SET new_value = " + sql_literal(value) + ", hash = '" + row.hash + "' WHERE seq = " + seq +
                "; UPDATE meta SET value = '" + seq + " " + row.hash + "' WHERE key = 'chain_head'");
  return row.seq;
}

}  // namespace

TEST_CASE("an item body nested past the limit is refused as damage, naming the item and column",
          "[store][tamper][limits]") {
  TempDir dir;
  const auto path = reviewed_case(dir);
  store_test::raw_sql(path, "UPDATE items SET body = " +
                                sql_literal(R"({"id":"E1","model":"assigned","extra":)" + nested_arrays(100000) + "}") +
                                " WHERE item_id = 'E1'");
  const std::string planted = store_test::file_digest(path);
  for (OpenMode mode : {OpenMode::read_only, OpenMode::edit}) {
    CHECK_THROWS_AS(CaseStore::open(path, mode), FileError);
    CHECK_THROWS_WITH(CaseStore::open(path, mode),
                      Contains(path.string() + ": the case tables are damaged (changed outside the program?)") &&
                          Contains("item \"E1\" (table items, column body)") &&
                          Contains("nested more than 64 levels deep"));
  }
  CHECK(store_test::file_digest(path) == planted);
}

TEST_CASE("a section body over the size limit is refused before it is parsed", "[store][tamper][limits]") {
  TempDir dir;
  const auto path = reviewed_case(dir);
  // 17 MiB of one JSON string: over the 16 MiB a case may hold, under SQLite's own value limit.
  const std::string body = "\"" + std::string(17u << 20, 'a') + "\"";
  store_test::raw_sql(path, "UPDATE sections SET body = " + sql_literal(body) + " WHERE name = 'case'");
  CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::read_only),
                    Contains("section \"case\" (table sections, column body): the JSON text is " +
                             std::to_string(body.size()) + " bytes, more than the limit of 16777216"));
}

TEST_CASE("a review note nested past the limit fails verify at its row, listings skip it",
          "[store][tamper][limits][review]") {
  TempDir dir;
  const auto path = reviewed_case(dir);
  const std::string deep = R"({"note":)" + nested_arrays(100000) + R"(,"revision":1,"verdict":"agree"})";
  const std::int64_t seq = plant_last_value(path, deep);
  const std::string planted = store_test::file_digest(path);

  // Read-only opens still work, so verify can name the row.
  CaseStore view = CaseStore::open(path, OpenMode::read_only);
  CHECK(view.review_notes().empty());
  const VerifyReport report = view.verify();
  REQUIRE_FALSE(report.ok());
  CHECK(report.problem->seq == seq);
  CHECK_THAT(report.problem->reason, Contains("not valid JSON") && Contains("nested more than 64 levels deep"));
  // Editing is refused, naming the row, and nothing is written.
  CHECK_THROWS_AS(CaseStore::open(path, OpenMode::edit), CaseFailsVerification);
  CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::edit), Contains("audit row " + std::to_string(seq)));
  CHECK(store_test::file_digest(path) == planted);

  // Read on its own, the row's refusal names the row and the field.
  const AuditRow row = view.audit_rows().back();
  CHECK_THROWS_AS(review_note_of(row), InvalidValue);
  CHECK_THROWS_WITH(review_note_of(row), Contains("malformed review row: audit row " + std::to_string(seq) +
                                                  ", field new_value: nested more than 64 levels deep"));
}

TEST_CASE("a declared reviewer's name planted past the limits is not read, verify names the row",
          "[store][tamper][limits]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  {
    CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
    store.declare_reviewer(kThwaite, kPryce);
  }
  const std::int64_t seq = plant_last_value(path, nested_arrays(100000));
  CaseStore view = CaseStore::open(path, OpenMode::read_only);
  CHECK(view.reviewers().empty());
  const VerifyReport report = view.verify();
  REQUIRE_FALSE(report.ok());
  CHECK(report.problem->seq == seq);
  CHECK_THAT(report.problem->reason, Contains("nested more than 64 levels deep"));
}
