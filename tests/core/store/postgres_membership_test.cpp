// Who sets a case's members in the shared store: the laboratory's store administrators (members
// of counterpoise_administrators), who need not own the tables and do not read the cases they
// administer; an examiner of a case cannot add members to it, not even with SQL of its own. And
// a store made at version 1 keeps its cases and their access when it is upgraded.
// Needs a server (scripts/pg-cluster); without one every case says it was skipped.

#include <unistd.h>

#include <catch2/catch.hpp>

#include "core/store/case_store.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"
#include "tests/core/store/store_backends.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using nlohmann::json;
using store_test::Backend;
using store_test::kThwaite;

namespace {

PgConnection connection_as(const std::string& role, const std::string& database = "") {
  return PgConnection("user=" + role + (database.empty() ? "" : " dbname=" + database),
                      "test database (" + role + ")");
}

bool can_read(const DatabaseCase& address) {
  try {
    CaseStore::open(address, OpenMode::read_only);
    return true;
  } catch (const counterpoise::validation::FileError&) {  // not found for the role, or denied
    return false;
  }
}

}  // namespace

TEST_CASE("a store administrator sets and ends memberships without reading the case",
          "[store][postgres][access]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  under_test->create(store_test::sample_case(), kThwaite);
  const auto reader = under_test->address(store_test::kReaderRole);
  REQUIRE_FALSE(can_read(reader));

  auto administrator = connection_as(store_test::kAdministratorRole);
  set_case_member(administrator, under_test->reference(), store_test::kReaderRole,
                  member_role::reader);
  CHECK(can_read(reader));
  // Opened for editing, the store says at once that the reader's edits would be refused.
  CHECK_THAT(CaseStore::open(reader, OpenMode::edit).edit_refusal().value_or(""),
             Contains("is a reader of this case"));
  CHECK_FALSE(under_test->open(OpenMode::edit).edit_refusal());
  // The administrator sees that the case exists and who its members are, not its content.
  CHECK_FALSE(can_read(under_test->address(store_test::kAdministratorRole)));
  const std::vector<PgParam> reference{PgParam::text(under_test->reference())};
  CHECK(administrator.run("SELECT count(*) FROM counterpoise.members WHERE case_ref = $1", reference)
            .integer(0, 0) == 2);
  CHECK(administrator.run("SELECT count(*) FROM counterpoise.items WHERE case_ref = $1", reference)
            .integer(0, 0) == 0);

  CHECK(remove_case_member(administrator, under_test->reference(), store_test::kReaderRole));
  CHECK_FALSE(remove_case_member(administrator, under_test->reference(), store_test::kReaderRole));
  CHECK_FALSE(can_read(reader));

  CHECK_THROWS_WITH(set_case_member(administrator, "HV-no-such-case", store_test::kReaderRole,
                                    member_role::reader),
                    Contains("no case with this reference"));
}

TEST_CASE("an examiner cannot add members to its own case, through the program or its own SQL",
          "[store][postgres][access]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  under_test->create(store_test::sample_case(), kThwaite);
  auto examiner = connection_as(store_test::kExaminerRole);
  CHECK_THROWS_WITH(set_case_member(examiner, under_test->reference(), store_test::kOutsiderRole,
                                    member_role::reader),
                    Contains("only the store's administrators") &&
                        Contains(kStoreAdministratorsRole));
  CHECK_THROWS_AS(
      examiner.run("INSERT INTO counterpoise.members(case_ref, member, role) VALUES ($1, $2, "
                   "'reader')",
                   {PgParam::text(under_test->reference()),
                    PgParam::text(store_test::kOutsiderRole)}),
      StoreAccessDenied);
  CHECK_THROWS_AS(remove_case_member(examiner, under_test->reference(), store_test::kExaminerRole),
                  StoreAccessDenied);
  CHECK_FALSE(can_read(under_test->address(store_test::kOutsiderRole)));
}

TEST_CASE("a store of version 1 is upgraded with its cases, members and chains intact",
          "[store][postgres]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  const std::string database = "cp_upgrade_" + std::to_string(::getpid());
  {
    auto superuser = store_test::administrator();
    superuser.execute(("DROP DATABASE IF EXISTS " + database).c_str());
    superuser.execute(("CREATE DATABASE " + database).c_str());
  }
  const std::string reference = under_test->reference();
  const auto as = [&](const char* role) {
    return DatabaseCase{"user=" + std::string(role) + " dbname=" + database, reference};
  };
  {
    PgConnection owner("dbname=" + database, "upgrade test database (owner)");
    CHECK(install_postgres_store(owner, 1) == 0);
    // Version 2 changed policies and roles only, no table: the rows a program of version 1
    // wrote are the rows this one writes. To write them under the version 1 policies, the store
    // is labelled version 2 for the moment, then labelled back.
    owner.execute("UPDATE counterpoise.store_version SET version = 2");
    CaseStore::create(as(store_test::kExaminerRole), store_test::sample_case(), kThwaite)
        .set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.9));
    set_case_member(owner, reference, store_test::kReaderRole, member_role::reader);
    owner.execute("UPDATE counterpoise.store_version SET version = 1");
    CHECK_THROWS_WITH(CaseStore::open(as(store_test::kExaminerRole), OpenMode::read_only),
                      Contains("version 1"));
    CHECK(install_postgres_store(owner) == 1);
    CHECK(install_postgres_store(owner) == kPostgresSchemaVersion);
  }
  CHECK(can_read(as(store_test::kReaderRole)));
  CHECK_FALSE(can_read(as(store_test::kOutsiderRole)));
  {
    CaseStore store = CaseStore::open(as(store_test::kExaminerRole), OpenMode::edit);
    CHECK(store.state().find_value(EntityRef::item("E1"), "p_given_hp")->get<double>() == 0.9);
    CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.8)) == 3);
    CHECK(store.verify().ok());
  }
  auto superuser = store_test::administrator();
  superuser.execute(("DROP DATABASE " + database).c_str());
}
