// Bad files and failed writes: each must give a clear error, never a crash, and leave the file
// as it was (SQLite's own testing habits: corrupt files, full disk, read-only media).
#include <random>

#include <catch2/catch.hpp>

#include "core/store/case_store.hpp"
#include "core/store/sqlite_connection.hpp"
#include "core/store/store_schema.hpp"
#include "tests/core/store/store_test_support.hpp"

using store_test::kThwaite;
using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::Error;
using counterpoise::validation::FileError;
using counterpoise::validation::UnsupportedFormat;
using nlohmann::json;
using store_test::file_digest;
using store_test::TempDir;

namespace {

// Opening must throw `E` with `text` in the message and leave the file's bytes as they were.
template <typename E>
void check_refused(const std::filesystem::path& path, const std::string& text) {
  const std::string before = file_digest(path);
  for (OpenMode mode : {OpenMode::read_only, OpenMode::edit}) {
    CHECK_THROWS_AS(CaseStore::open(path, mode), E);
    CHECK_THROWS_WITH(CaseStore::open(path, mode), Contains(text));
  }
  CHECK(file_digest(path) == before);
  CHECK_FALSE(std::filesystem::exists(path.string() + "-journal"));
}

std::filesystem::path make_case(const TempDir& dir, const std::string& name = "case.cpcase") {
  CaseStore store = CaseStore::create(dir / name, store_test::sample_case(), kThwaite);
  for (int i = 0; i < 20; ++i)
    store.set_field(kThwaite, EntityRef::item("E1"), "note", json("edit " + std::to_string(i)));
  return dir / name;
}

}  // namespace

TEST_CASE("a file that is not SQLite is refused untouched", "[store][faults]") {
  TempDir dir;
  store_test::write_bytes(dir / "text.cpcase", "{\"format\": \"counterpoise.case\"}");
  check_refused<UnsupportedFormat>(dir / "text.cpcase", "not a case file");
  store_test::write_bytes(dir / "empty.cpcase", "");
  check_refused<UnsupportedFormat>(dir / "empty.cpcase", "empty");
  CHECK_THROWS_AS(CaseStore::open(dir / "missing.cpcase", OpenMode::read_only), FileError);
  CHECK_FALSE(std::filesystem::exists(dir / "missing.cpcase"));
}

TEST_CASE("an SQLite file of another application is refused untouched", "[store][faults]") {
  TempDir dir;
  store_test::raw_sql(dir / "other.db",
                      "CREATE TABLE notes(x TEXT); INSERT INTO notes VALUES ('x');");
  check_refused<UnsupportedFormat>(dir / "other.db", "application_id 0x00000000");
  store_test::raw_sql(dir / "other2.db", "PRAGMA application_id = 1179207760; CREATE TABLE t(x);");
  check_refused<UnsupportedFormat>(dir / "other2.db", "another application");
}

TEST_CASE("a case file from a newer program is refused untouched", "[store][faults]") {
  TempDir dir;
  const auto path = make_case(dir);
  store_test::raw_sql(path, "PRAGMA user_version = " + std::to_string(kSchemaVersion + 1));
  check_refused<UnsupportedFormat>(path, "newer program");
}

TEST_CASE("a truncated case file is refused untouched", "[store][faults]") {
  TempDir dir;
  const auto path = make_case(dir);
  const std::string bytes = store_test::file_bytes(path);
  for (std::size_t keep : {std::size_t{50}, std::size_t{4096}, bytes.size() / 2,
                           bytes.size() - 4096, bytes.size() - 1}) {
    INFO("kept " << keep << " of " << bytes.size() << " bytes");
    store_test::write_bytes(path, bytes.substr(0, keep));
    const std::string before = file_digest(path);
    CHECK_THROWS_AS(CaseStore::open(path, OpenMode::edit), Error);
    CHECK(file_digest(path) == before);
  }
}

TEST_CASE("a byte-flipped case file gives a clean error or a failed verify, never a crash",
          "[store][faults]") {
  TempDir dir;
  const auto pristine_path = make_case(dir, "pristine.cpcase");
  const std::string pristine = store_test::file_bytes(pristine_path);
  const auto path = dir / "flipped.cpcase";

  SECTION("a b-tree page header") {
    // Page 2 starts at 4096 (page size 4096): its first byte is the b-tree page type.
    std::string bytes = pristine;
    bytes[4096] = static_cast<char>(bytes[4096] ^ 0x5a);
    store_test::write_bytes(path, bytes);
    check_refused<FileError>(path, "damaged");
  }
  SECTION("seeded random flips anywhere after the header") {
    std::mt19937_64 random(20261201);  // fixed seed: the same flips on every run
    int refused = 0, detected = 0, harmless = 0;
    for (int trial = 0; trial < 60; ++trial) {
      std::string bytes = pristine;
      std::uniform_int_distribution<std::size_t> offset(100, bytes.size() - 1);
      for (int k = 0; k < 4; ++k) bytes[offset(random)] ^= static_cast<char>(1 + random() % 255);
      store_test::write_bytes(path, bytes);
      const std::string before = file_digest(path);
      try {
        CaseStore store = CaseStore::open(path, OpenMode::read_only);
        const VerifyReport report = store.verify();
        (report.ok() ? harmless : detected) += 1;
      } catch (const Error& e) {
        ++refused;
        CHECK(std::string(e.what()).size() > 10);
      }
      CHECK(file_digest(path) == before);
    }
    INFO("refused " << refused << ", verify failed " << detected << ", harmless " << harmless);
    CHECK(refused + detected > 0);
    CHECK(refused + detected + harmless == 60);
  }
}

TEST_CASE("a full disk during an edit leaves the last committed state", "[store][faults]") {
  TempDir dir;
  const auto path = make_case(dir);
  std::string before_state;
  {
    // max_page_count at the current size: the file cannot grow, as on a full disk.
    StoreOptions full;
    full.testing_max_page_count = store_test::raw_int(path, "PRAGMA page_count");
    CaseStore store = CaseStore::open(path, OpenMode::edit, full);
    before_state = store.export_canonical();
    const json big_item = {
        {"id", "E9"}, {"model", "assigned"}, {"notes", std::string(200'000, 'x')}};
    CHECK_THROWS_AS(store.add_item(kThwaite, big_item), FileError);
    CHECK_THROWS_WITH(store.add_item(kThwaite, big_item), Contains("full"));
    CHECK(store.export_canonical() == before_state);
    CHECK(store.audit_rows().size() == 21);
  }
  CaseStore reopened = CaseStore::open(path, OpenMode::read_only);
  CHECK(reopened.export_canonical() == before_state);
  CHECK(reopened.verify().ok());
  // Opening for editing writes the session row only; the case content is unchanged.
  CHECK(reopened.audit_rows().size() == 21);
}

TEST_CASE("a medium that refuses writes fails the edit clearly and keeps the file",
          "[store][faults]") {
  // Tests run as root, so a chmod'ed folder would not stop them: the connection is made to
  // refuse every write instead (PRAGMA query_only), which fails the edit inside its transaction.
  TempDir dir;
  const auto path = make_case(dir);
  StoreOptions read_only_medium;
  read_only_medium.testing_refuse_writes = true;
  CaseStore store = CaseStore::open(path, OpenMode::edit, read_only_medium);
  const std::string digest = file_digest(path);
  const std::string state = store.export_canonical();
  CHECK_THROWS_WITH(store.set_field(kThwaite, EntityRef::item("E1"), "note", json("lost")),
                    Contains("cannot be written"));
  CHECK_THROWS_AS(store.seal_revision(kThwaite, "report", "r.pdf"), FileError);
  CHECK(file_digest(path) == digest);
  CHECK(store.export_canonical() == state);
  CHECK(store.current_revision() == 1);
}

TEST_CASE("migrations run in one transaction and roll back on failure", "[store][faults]") {
  TempDir dir;
  const auto path = dir / "plain.db";
  store_test::raw_sql(path, "CREATE TABLE keep(x)");
  const Migration steps[] = {{"CREATE TABLE first_step(x);"}, {"CREATE TABLE broken(;"}};
  {
    Connection db(path, Connection::Access::read_write);
    CHECK_THROWS_AS(apply_migrations(db, steps), FileError);
  }
  CHECK(store_test::raw_int(path, "PRAGMA user_version") == 0);
  CHECK(store_test::raw_int(path, "SELECT count(*) FROM sqlite_master WHERE name = 'first_step'") ==
        0);
  {
    Connection db(path, Connection::Access::read_write);
    apply_migrations(db, std::span(steps, 1));
  }
  CHECK(store_test::raw_int(path, "PRAGMA user_version") == 1);
  CHECK(store_test::raw_int(path, "PRAGMA application_id") == kApplicationId);
  // A file newer than the steps is refused.
  Connection db(path, Connection::Access::read_write);
  CHECK_THROWS_AS(apply_migrations(db, std::span(steps, 0)), UnsupportedFormat);
}
