// A case file written by the schema version 1 program (tests/data/store/version1.cpcase, made by
// that program: see tests/data/store/README.md) opens, verifies, and upgrades in place to the
// current schema with its hash chain intact.
#include <catch2/catch.hpp>

#include "core/store/audit_log.hpp"
#include "core/store/case_store.hpp"
#include "core/store/store_schema.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using nlohmann::json;
using store_test::kThwaite;
using store_test::TempDir;

namespace {
const std::filesystem::path kVersion1 =
    std::filesystem::path(COUNTERPOISE_TEST_DATA_DIR) / "store" / "version1.cpcase";
}  // namespace

TEST_CASE("a version 1 case file is read as it is: history and verify without an upgrade",
          "[store][upgrade]") {
  TempDir dir;
  const auto path = dir / "old.cpcase";
  std::filesystem::copy_file(kVersion1, path);
  const std::string before = store_test::file_digest(path);
  {
    CaseStore view = CaseStore::open(path, OpenMode::read_only);
    const auto rows = view.audit_rows();
    REQUIRE(rows.size() == 5);
    for (const AuditRow& row : rows) {
      CHECK_FALSE(row.account.has_value());
      CHECK(row.examiner == "Dr Imogen Thwaite");
    }
    CHECK(view.verify().ok());
    CHECK(view.revisions().at(0).sealed());
    CHECK(view.revisions().at(0).report_examiner.empty());  // version 1 seals did not name it
  }
  CHECK(store_test::raw_int(path, "PRAGMA user_version") == 1);
  CHECK(store_test::file_digest(path) == before);
}

TEST_CASE("opening a version 1 file for editing upgrades it in one recorded step",
          "[store][upgrade]") {
  TempDir dir;
  const auto path = dir / "old.cpcase";
  std::filesystem::copy_file(kVersion1, path);
  const auto old_rows = CaseStore::open(path, OpenMode::read_only).audit_rows();
  {
    CaseStore store = CaseStore::open(path, OpenMode::edit);
    const auto rows = store.audit_rows();
    REQUIRE(rows.size() == 6);
    for (std::size_t i = 0; i < old_rows.size(); ++i) {
      CHECK(rows[i].hash == old_rows[i].hash);  // old rows keep their hashes
      CHECK_FALSE(rows[i].account.has_value());
    }
    const AuditRow& upgrade = rows.back();
    CHECK(upgrade.action == "upgrade-format");
    CHECK(upgrade.old_value == "1");
    CHECK(upgrade.new_value == std::to_string(kSchemaVersion));
    CHECK(upgrade.account == operating_system_account());
    CHECK(upgrade.examiner.empty());
    CHECK(upgrade.revision == 2);
    CHECK(upgrade.prev_hash == old_rows.back().hash);
    // Edits after the upgrade record the account.
    store.set_field(kThwaite, EntityRef::item("E1"), "title", json("Glass in the jacket's seams"));
    CHECK(store.audit_rows().back().account == operating_system_account());
    CHECK(store.verify().ok());
  }
  CHECK(store_test::raw_int(path, "PRAGMA user_version") == kSchemaVersion);
  {
    // Opening again does not upgrade again.
    CaseStore store = CaseStore::open(path, OpenMode::edit);
    CHECK(store.audit_rows().size() == 7);
    CHECK(store.verify().ok());
    // The sealed revision made by the old program is still what it was.
    CHECK(store.sealed_report_bytes(1) == "%PDF-1.4 stand-in report bytes for revision 1\n");
  }
}

TEST_CASE("after the upgrade, a row stripped of its account does not verify",
          "[store][upgrade][verify]") {
  TempDir dir;
  const auto path = dir / "old.cpcase";
  std::filesystem::copy_file(kVersion1, path);
  { CaseStore::open(path, OpenMode::edit).set_field(kThwaite, EntityRef::item("E2"), "lr", json(25000)); }
  // Rewrite the last row as a version 1 row (no account) with a consistent hash and head, as
  // someone would to hide who made it.
  AuditRow last = CaseStore::open(path, OpenMode::read_only).audit_rows().back();
  last.account.reset();
  last.hash = audit_row_hash(last);
  store_test::raw_sql_behind_triggers(path, "UPDATE audit SET account = NULL, hash = '" +
                                last.hash + "' WHERE seq = " + std::to_string(last.seq) +
                                "; UPDATE meta SET value = '" + std::to_string(last.seq) + " " +
                                last.hash + "' WHERE key = 'chain_head'");
  const VerifyReport report = CaseStore::open(path, OpenMode::read_only).verify();
  REQUIRE_FALSE(report.ok());
  CHECK(report.problem->seq == last.seq);
  CHECK_THAT(report.problem->reason, Contains("records no operating-system account"));
}

TEST_CASE("a failed upgrade leaves the version 1 file as it was", "[store][upgrade]") {
  TempDir dir;
  const auto path = dir / "old.cpcase";
  std::filesystem::copy_file(kVersion1, path);
  // A column of that name already there makes the version 2 step fail inside the transaction.
  store_test::raw_sql(path, "ALTER TABLE audit ADD COLUMN account TEXT");
  const std::string before = store_test::file_digest(path);
  CHECK_THROWS(CaseStore::open(path, OpenMode::edit));
  CHECK(store_test::raw_int(path, "PRAGMA user_version") == 1);
  CHECK(store_test::raw_int(path, "SELECT COUNT(*) FROM audit") == 5);
  CHECK(store_test::file_digest(path) == before);
}
