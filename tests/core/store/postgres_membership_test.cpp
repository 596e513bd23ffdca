// Who sets a case's members in the shared store, and how it is recorded: an examiner of the
// case, through one `member` audit row in the case's chain, which is what changes the members
// table (a trigger); a reviewer, reader, outsider or store administrator cannot, not through the
// program nor with SQL of its own; the chain's membership rows are told in words and checked by
// verify. And stores made at versions 1 and 2 keep their cases and their access when upgraded.
// Needs a server (scripts/pg-cluster); without one every case says it was skipped.

#include <unistd.h>

#include <catch2/catch.hpp>

#include "core/store/audit_row_words.hpp"
#include "core/store/case_store.hpp"
#include "core/store/membership_change.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"
#include "tests/core/store/store_backends.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using nlohmann::json;
using store_test::Backend;
using store_test::kPryce;
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

std::optional<std::string> role_in_table(const std::string& reference, const std::string& member) {
  auto owner = store_test::administrator();
  const PgResult r = owner.run(
      "SELECT role FROM counterpoise.members WHERE case_ref = $1 AND member = $2",
      {PgParam::text(reference), PgParam::text(member)});
  if (r.rows() == 0) return std::nullopt;
  return r.text(0, 0);
}

// A membership row as the program would write it, inserted with a role's own SQL on top of the
// case's chain (its hash need not be right: the database's checks come first).
void insert_membership_row(PgConnection& connection, const std::string& reference,
                           const std::string& account, const std::string& old_value,
                           const std::string& new_value) {
  connection.run(
      "INSERT INTO counterpoise.audit(case_ref, seq, revision, at, examiner, account, action, "
      "entity, entity_key, field, old_value, new_value, prev_hash, hash) "
      "VALUES ($1, 99, 1, '2026-12-04T00:00:00.000Z', 'Mr Ned Pollard', $2, 'member', 'case', '', "
      "'member', $3, $4, '', '')",
      {PgParam::text(reference), PgParam::text(account), PgParam::text(old_value),
       PgParam::text(new_value)});
}

}  // namespace

TEST_CASE("an examiner of a case adds, changes and ends memberships, each an audit row",
          "[store][postgres][access]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  CaseStore store = under_test->create(store_test::sample_case(), kThwaite);
  const auto reader = under_test->address(store_test::kReaderRole);
  REQUIRE_FALSE(can_read(reader));

  CHECK(store.change_membership(kThwaite, store_test::kReaderRole, member_role::reader) == 2);
  CHECK(can_read(reader));
  // Opened for editing, the store says at once that the reader's edits would be refused.
  CHECK_THAT(CaseStore::open(reader, OpenMode::edit).edit_refusal().value_or(""),
             Contains("is a reader of this case"));
  CHECK(store.change_membership(kThwaite, store_test::kReaderRole, member_role::reviewer) == 3);
  CHECK(role_in_table(under_test->reference(), store_test::kReaderRole) == member_role::reviewer);
  CHECK(store.change_membership(kThwaite, store_test::kReaderRole, std::nullopt) == 4);
  CHECK_FALSE(can_read(reader));
  CHECK_FALSE(role_in_table(under_test->reference(), store_test::kReaderRole));

  // Each row names who made the change (declared name, database role, operating-system
  // account) and what changed (member, old and new role).
  const std::vector<AuditRow> rows = under_test->open(OpenMode::read_only).audit_rows();
  REQUIRE(rows.size() == 4);
  const MembershipChange added = membership_change_of(rows[1]);
  CHECK(rows[1].action == action::change_member);
  CHECK(rows[1].examiner == kThwaite.text());
  CHECK(rows[1].account == std::string(store_test::kExaminerRole));
  CHECK(added.os_account == operating_system_account());
  CHECK(added.member == store_test::kReaderRole);
  CHECK_FALSE(added.old_role);
  CHECK(added.new_role == member_role::reader);
  CHECK(membership_change_of(rows[2]).old_role == member_role::reader);
  CHECK(membership_change_of(rows[2]).new_role == member_role::reviewer);
  CHECK_FALSE(membership_change_of(rows[3]).new_role);

  const AuditRowWords words = audit_row_words(rows[2]);
  CHECK(words.who == kThwaite.text());
  CHECK(words.action == "changed a member's role");
  CHECK(words.place == std::string("member ") + store_test::kReaderRole);
  CHECK(words.old_value == "reader");
  CHECK(words.new_value == "reviewer (operating-system account " + operating_system_account() + ")");
  CHECK(audit_row_words(rows[1]).action == "added a member");
  CHECK(audit_row_words(rows[1]).old_value == "not a member");
  CHECK(audit_row_words(rows[3]).action == "ended a membership");
  CHECK(store.verify().ok());

  // Changes that change nothing, and words that are not roles, are refused before anything
  // is written.
  CHECK_THROWS_WITH(store.change_membership(kThwaite, store_test::kReaderRole, std::nullopt),
                    Contains("is not a member of this case"));
  CHECK_THROWS_WITH(
      store.change_membership(kThwaite, store_test::kExaminerRole, member_role::examiner),
      Contains("already has the role examiner"));
  CHECK_THROWS_WITH(store.change_membership(kThwaite, store_test::kReaderRole, "editor"),
                    Contains("an examiner, a reviewer or a reader"));
  CHECK_THROWS_WITH(
      store.change_membership(kThwaite, "cp_test_nobody_of_that_name", member_role::reader),
      Contains("no database role with this name"));
  // The database keeps an examiner on every case.
  CHECK_THROWS_WITH(store.change_membership(kThwaite, store_test::kExaminerRole, member_role::reader),
                    Contains("at least one examiner"));
  CHECK(under_test->open(OpenMode::read_only).audit_rows().size() == 4);
}

TEST_CASE("a case file has no members to change", "[store][access]") {
  store_test::TempDir dir;
  CaseStore store = CaseStore::create(dir / "case.cpcase", store_test::sample_case(), kThwaite);
  CHECK_THROWS_WITH(store.change_membership(kThwaite, "someone", member_role::reader),
                    Contains("a case file has no members"));
  CHECK(store.audit_rows().size() == 1);
}

TEST_CASE("no one but an examiner of the case changes its members, through the program or SQL",
          "[store][postgres][access]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  under_test->create(store_test::sample_case(), kThwaite)
      .change_membership(kThwaite, store_test::kReviewerRole, member_role::reviewer);
  const std::string& reference = under_test->reference();
  const std::string old_value = R"({"member":"cp_test_outsider","role":null})";
  const std::string new_value = R"({"member":"cp_test_outsider","os_account":"x","role":"examiner"})";

  // A reviewer of the case: the program's row and its own are refused by the database.
  CaseStore as_reviewer = CaseStore::open(under_test->address(store_test::kReviewerRole), OpenMode::edit);
  CHECK_THROWS_AS(as_reviewer.change_membership(kPryce, store_test::kOutsiderRole, member_role::examiner),
                  StoreAccessDenied);
  auto reviewer_sql = connection_as(store_test::kReviewerRole);
  CHECK_THROWS_AS(insert_membership_row(reviewer_sql, reference, store_test::kReviewerRole, old_value, new_value),
                  StoreAccessDenied);
  CHECK_THROWS_AS(reviewer_sql.run("INSERT INTO counterpoise.members(case_ref, member, role) VALUES "
                                   "($1, 'cp_test_outsider', 'examiner')",
                                   {PgParam::text(reference)}),
                  StoreAccessDenied);
  CHECK_THROWS_AS(reviewer_sql.run("UPDATE counterpoise.members SET role = 'examiner' WHERE "
                                   "case_ref = $1",
                                   {PgParam::text(reference)}),
                  StoreAccessDenied);

  // A store administrator sees the case's members but no longer writes them.
  auto administrator = connection_as(store_test::kAdministratorRole);
  CHECK(administrator.run("SELECT count(*) FROM counterpoise.members WHERE case_ref = $1",
                          {PgParam::text(reference)})
            .integer(0, 0) == 2);
  CHECK_FALSE(can_read(under_test->address(store_test::kAdministratorRole)));
  CHECK_THROWS_AS(administrator.run("INSERT INTO counterpoise.members(case_ref, member, role) "
                                    "VALUES ($1, 'cp_test_outsider', 'reader')",
                                    {PgParam::text(reference)}),
                  StoreAccessDenied);
  CHECK_THROWS_AS(
      administrator.run("DELETE FROM counterpoise.members WHERE case_ref = $1", {PgParam::text(reference)}),
      StoreAccessDenied);
  // An outsider: neither.
  auto outsider_sql = connection_as(store_test::kOutsiderRole);
  CHECK_THROWS_AS(insert_membership_row(outsider_sql, reference, store_test::kOutsiderRole, old_value, new_value),
                  StoreAccessDenied);

  // Even the case's examiner cannot write the members table but through a membership row, and a
  // row whose old role is not the one in the table is refused.
  auto examiner_sql = connection_as(store_test::kExaminerRole);
  CHECK_THROWS_AS(examiner_sql.run("INSERT INTO counterpoise.members(case_ref, member, role) "
                                   "VALUES ($1, 'cp_test_outsider', 'reader')",
                                   {PgParam::text(reference)}),
                  StoreAccessDenied);
  CHECK_THROWS_WITH(
      insert_membership_row(examiner_sql, reference, store_test::kExaminerRole,
                            R"({"member":"cp_test_reviewer","role":"reader"})",
                            R"({"member":"cp_test_reviewer","os_account":"x","role":"examiner"})"),
      Contains("it is reviewer"));

  CHECK_FALSE(can_read(under_test->address(store_test::kOutsiderRole)));
  CHECK(role_in_table(reference, store_test::kReviewerRole) == member_role::reviewer);
  CHECK(under_test->open(OpenMode::read_only).verify().ok());
}

TEST_CASE("verify names a membership row that contradicts an earlier one", "[store][access]") {
  // Replayed directly: the rows as they would be after someone rewrote one and its hashes.
  store_test::TempDir dir;
  const std::vector<AuditRow> rows =
      CaseStore::create(dir / "case.cpcase", store_test::sample_case(), kThwaite).audit_rows();
  AuditReplay replay;
  replay.apply(rows.at(0));
  const auto membership = [&](std::int64_t seq, const char* old_role, const char* new_role) {
    AuditRow row = rows.at(0);
    row.seq = seq;
    row.action = action::change_member;
    row.field = "member";
    const auto role = [](const char* r) { return r ? json(r) : json(nullptr); };
    row.old_value = json({{"member", "cp_x"}, {"role", role(old_role)}}).dump();
    row.new_value = json({{"member", "cp_x"}, {"os_account", "tester"}, {"role", role(new_role)}}).dump();
    return row;
  };
  replay.apply(membership(2, nullptr, "reader"));
  replay.apply(membership(3, "reader", "reviewer"));
  CHECK(replay.recorded_roles().at("cp_x") == std::optional<std::string>("reviewer"));
  CHECK_THROWS_WITH(replay.apply(membership(4, "reader", "examiner")),
                    Contains("old role reader") && Contains("last membership row gave it reviewer"));
  CHECK_THROWS_WITH(replay.apply(membership(4, "reviewer", "reviewer")), Contains("does not change"));
  AuditRow extra_member = membership(4, "reviewer", "reader");
  extra_member.new_value = R"({"member":"cp_x","os_account":"tester","role":"reader","x":1})";
  CHECK_THROWS_WITH(replay.apply(extra_member), Contains("malformed membership row"));
}

TEST_CASE("stores of versions 1 and 2 are upgraded with their cases, members and chains intact",
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
    // Versions 2 and 3 changed no table: the rows a program of version 1 wrote are the rows
    // this one writes. To write them under the version 1 policies, the store is labelled as
    // this program's version for the moment, then labelled back. Memberships were then written
    // into the members table directly, as the administrators did.
    owner.execute("UPDATE counterpoise.store_version SET version = 3");
    CaseStore::create(as(store_test::kExaminerRole), store_test::sample_case(), kThwaite)
        .set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.9));
    owner.run("INSERT INTO counterpoise.members(case_ref, member, role) VALUES ($1, $2, 'reader')",
              {PgParam::text(reference), PgParam::text(store_test::kReaderRole)});
    owner.execute("UPDATE counterpoise.store_version SET version = 1");
    CHECK_THROWS_WITH(CaseStore::open(as(store_test::kExaminerRole), OpenMode::read_only),
                      Contains("version 1"));
    CHECK(install_postgres_store(owner, 2) == 1);
    CHECK_THROWS_WITH(CaseStore::open(as(store_test::kExaminerRole), OpenMode::read_only),
                      Contains("version 2"));
    CHECK(install_postgres_store(owner) == 2);
    CHECK(install_postgres_store(owner) == kPostgresSchemaVersion);
  }
  CHECK(can_read(as(store_test::kReaderRole)));
  CHECK_FALSE(can_read(as(store_test::kOutsiderRole)));
  {
    CaseStore store = CaseStore::open(as(store_test::kExaminerRole), OpenMode::edit);
    CHECK(store.state().find_value(EntityRef::item("E1"), "p_given_hp")->get<double>() == 0.9);
    CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.8)) == 3);
    // A membership set before version 3 is the old role of the first row about it.
    CHECK(store.change_membership(kThwaite, store_test::kReaderRole, member_role::reviewer) == 4);
    CHECK(membership_change_of(store.audit_rows().back()).old_role == member_role::reader);
    CHECK(store.verify().ok());
  }
  auto superuser = store_test::administrator();
  superuser.execute(("DROP DATABASE " + database).c_str());
}
