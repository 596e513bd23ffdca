// A case file changed behind the program's back (here with raw SQL, as with the sqlite3 shell)
// is never written to again: opening it for editing and every write refuse it, naming the first
// audit row that does not fit, and leave the file byte for byte as it was.
#include <catch2/catch.hpp>

#include "core/store/case_store.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using nlohmann::json;
using store_test::kPryce;
using store_test::kThwaite;
using store_test::raw_sql;
using store_test::TempDir;

namespace {

constexpr const char* kTamper =
    R"(UPDATE items SET body = '{"id":"E1","model":"assigned","p_given_hp":0.999,"p_given_hd":0.001}' WHERE item_id = 'E1')";

std::filesystem::path sealed_case(const TempDir& dir) {
  const auto path = dir / "case.cpcase";
  CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
  store.declare_reviewer(kThwaite, kPryce);
  store.seal_revision(kThwaite, "report", "r1.pdf");
  store.set_field(kThwaite, EntityRef::item("E2"), "lr", json(1.5e4));
  return path;
}

}  // namespace

TEST_CASE("a tampered case file is refused for editing, with the row and the reason",
          "[store][tamper]") {
  TempDir dir;
  const auto path = sealed_case(dir);
  raw_sql(path, kTamper);
  const std::string tampered = store_test::file_digest(path);
  CHECK_THROWS_AS(CaseStore::open(path, OpenMode::edit), CaseFailsVerification);
  CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::edit),
                    Contains("fails verification (audit row 5: item \"E1\" differs") &&
                        Contains("nothing is written"));
  CHECK(store_test::file_digest(path) == tampered);
  // It can still be looked at.
  CaseStore view = CaseStore::open(path, OpenMode::read_only);
  CHECK_FALSE(view.verify().ok());
  CHECK(view.state().items()[0].second["p_given_hp"] == json(0.999));
}

TEST_CASE("a case file tampered with while open is refused at the next write of every kind",
          "[store][tamper]") {
  TempDir dir;
  const auto path = sealed_case(dir);
  CaseStore store = CaseStore::open(path, OpenMode::edit);
  const std::size_t rows = store.audit_rows().size();
  store.set_field(kThwaite, EntityRef::item("E2"), "lr", json(1.6e4));  // verified once: fine
  raw_sql(path, kTamper);
  const std::string tampered = store_test::file_digest(path);
  CHECK_THROWS_AS(store.set_field(kThwaite, EntityRef::item("E3"), "title", json("x")),
                  CaseFailsVerification);
  CHECK_THROWS_AS(store.add_item(kThwaite, json{{"id", "E9"}, {"model", "assigned"}}),
                  CaseFailsVerification);
  CHECK_THROWS_AS(store.remove_item(kThwaite, "E3"), CaseFailsVerification);
  CHECK_THROWS_AS(store.move_item(kThwaite, "E3", 0), CaseFailsVerification);
  CHECK_THROWS_AS(store.declare_reviewer(kThwaite, ExaminerName("Dr Ifan Morgan")),
                  CaseFailsVerification);
  CHECK_THROWS_AS(store.seal_revision(kThwaite, "report 2", "r2.pdf"), CaseFailsVerification);
  CHECK(store_test::file_digest(path) == tampered);
  CHECK(CaseStore::open(path, OpenMode::read_only).audit_rows().size() == rows + 1);
}

TEST_CASE("a version 1 file that fails verify is not upgraded", "[store][tamper][upgrade]") {
  TempDir dir;
  const auto path = dir / "old.cpcase";
  std::filesystem::copy_file(
      std::filesystem::path(COUNTERPOISE_TEST_DATA_DIR) / "store" / "version1.cpcase", path);
  raw_sql(path, R"(UPDATE sections SET body = '"Tampered"' WHERE name = 'format')");
  const std::string tampered = store_test::file_digest(path);
  CHECK_THROWS_AS(CaseStore::open(path, OpenMode::edit), CaseFailsVerification);
  CHECK(store_test::raw_int(path, "PRAGMA user_version") == 1);
  CHECK(store_test::file_digest(path) == tampered);
}
