// The shared store on PostgreSQL: who may read and write a case is decided by the database
// (row-level security keyed on the role), not only by the program; concurrent editors are
// serialised and an edit based on an older state is refused naming who changed what.
// Needs a server (scripts/pg-cluster); without one every case says it was skipped.

#include <catch2/catch.hpp>

#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"
#include "tests/core/store/store_backends.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;
using nlohmann::json;
using store_test::Backend;
using store_test::kPryce;
using store_test::kThwaite;

namespace {

// A plain connection as `role`, to try what the program would never do.
PgConnection connection_as(const std::string& role) {
  return PgConnection("user=" + role, "test database (" + role + ")");
}

std::int64_t visible_audit_rows(PgConnection& connection, const std::string& reference) {
  return connection
      .run("SELECT count(*) FROM counterpoise.audit WHERE case_ref = $1",
           {PgParam::text(reference)})
      .integer(0, 0);
}

void add_member(const std::string& reference, const std::string& role, const char* as) {
  store_test::add_case_member(reference, role, as);
}

}  // namespace

TEST_CASE("a role that is not a member of a case cannot read it", "[store][postgres][access]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  under_test->create(store_test::sample_case(), kThwaite);
  // Through the program: the case is not found for that role.
  CHECK_THROWS_WITH(
      CaseStore::open(under_test->address(store_test::kOutsiderRole), OpenMode::read_only),
      Contains("may read") && Contains(store_test::kOutsiderRole));
  // Through SQL of its own: the rows are there (the owner sees them) but not for the outsider.
  auto admin = store_test::administrator();
  CHECK(visible_audit_rows(admin, under_test->reference()) == 1);
  auto outsider = connection_as(store_test::kOutsiderRole);
  CHECK(visible_audit_rows(outsider, under_test->reference()) == 0);
  CHECK(outsider
            .run("SELECT count(*) FROM counterpoise.sections WHERE case_ref = $1",
                 {PgParam::text(under_test->reference())})
            .integer(0, 0) == 0);
  // Nor can it change the case behind the program's back: its UPDATE finds no row.
  CHECK(outsider
            .run("UPDATE counterpoise.sections SET body = '{}' WHERE case_ref = $1 RETURNING 1",
                 {PgParam::text(under_test->reference())})
            .rows() == 0);
  CHECK(under_test->open(OpenMode::read_only).verify().ok());
}

TEST_CASE("a reviewer adds review notes but cannot edit, a reader only reads",
          "[store][postgres][access]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  {
    CaseStore store = under_test->create(store_test::sample_case(), kThwaite);
    store.declare_reviewer(kThwaite, kPryce);
    store.seal_revision(kThwaite, "invented report", "report.pdf");
  }
  add_member(under_test->reference(), store_test::kReviewerRole, member_role::reviewer);
  add_member(under_test->reference(), store_test::kReaderRole, member_role::reader);

  CaseStore as_reviewer =
      CaseStore::open(under_test->address(store_test::kReviewerRole), OpenMode::edit);
  CHECK(as_reviewer.export_canonical() == canonical_text(store_test::sample_case()));
  CHECK_THROWS_AS(as_reviewer.set_field(kPryce, EntityRef::item("E1"), "p_given_hp", json(0.5)),
                  StoreAccessDenied);
  CHECK_THROWS_WITH(
      as_reviewer.set_field(kPryce, EntityRef::item("E1"), "p_given_hp", json(0.5)),
      Contains(store_test::kReviewerRole) && Contains("only the case's examiners edit"));
  const std::int64_t note = as_reviewer.add_review_note(kPryce, 1, ReviewVerdict::agree, "");
  // Behind the program's back the database refuses the same edit.
  auto reviewer_sql = connection_as(store_test::kReviewerRole);
  CHECK(reviewer_sql
            .run("UPDATE counterpoise.items SET body = '{}' WHERE case_ref = $1 RETURNING 1",
                 {PgParam::text(under_test->reference())})
            .rows() == 0);

  CaseStore as_reader =
      CaseStore::open(under_test->address(store_test::kReaderRole), OpenMode::edit);
  CHECK_THROWS_AS(as_reader.add_review_note(kPryce, 1, ReviewVerdict::comment, "a reader's note"),
                  StoreAccessDenied);

  CaseStore view = under_test->open(OpenMode::read_only);
  const auto rows = view.audit_rows();
  REQUIRE(rows.size() == static_cast<std::size_t>(note));
  // The audit row records the database role that wrote it, whatever name was declared.
  CHECK(rows.back().action == "review");
  CHECK(rows.back().account == std::string(store_test::kReviewerRole));
  CHECK(rows.front().account == std::string(store_test::kExaminerRole));
  CHECK(view.verify().ok());
}

TEST_CASE("an audit row naming another role than the writer's is refused by the database",
          "[store][postgres][access]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  CaseStore store = under_test->create(store_test::sample_case(), kThwaite);
  auto examiner_sql = connection_as(store_test::kExaminerRole);
  CHECK_THROWS_AS(
      examiner_sql.run(
          "INSERT INTO counterpoise.audit(case_ref, seq, revision, at, examiner, account, action, "
          "entity, entity_key, field, prev_hash, hash) VALUES ($1, 2, 1, 'now', 'x', "
          "'cp_test_reviewer', 'set', 'case', '', '', 'p', 'h')",
          {PgParam::text(under_test->reference())}),
      StoreAccessDenied);
}

TEST_CASE("the database keeps audit rows and sealed revisions unchanged, even for its owner",
          "[store][postgres]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  {
    CaseStore store = under_test->create(store_test::sample_case(), kThwaite);
    store.seal_revision(kThwaite, "invented report", "report.pdf");
  }
  auto admin = store_test::administrator();
  const std::vector<PgParam> reference{PgParam::text(under_test->reference())};
  CHECK_THROWS_WITH(
      admin.run("UPDATE counterpoise.audit SET examiner = 'x' WHERE case_ref = $1", reference),
      Contains("append-only"));
  CHECK_THROWS_WITH(admin.run("DELETE FROM counterpoise.audit WHERE case_ref = $1", reference),
                    Contains("append-only"));
  CHECK_THROWS_WITH(
      admin.run("UPDATE counterpoise.revisions SET report_bytes = '\\x00' WHERE case_ref = $1",
                reference),
      Contains("sealed revision is read-only"));
  // An entity row changed by the owner (who is not bound by the policies) is found by verify.
  admin.run(
      "UPDATE counterpoise.items SET body = '{\"id\":\"E1\"}' "
      "WHERE case_ref = $1 AND item_id = 'E1'",
      reference);
  const VerifyReport report = under_test->open(OpenMode::read_only).verify();
  REQUIRE_FALSE(report.ok());
  CHECK_THAT(report.problem->reason, Contains("item \"E1\" differs from the audit"));
  CHECK_THROWS_AS(under_test->open(OpenMode::edit), CaseFailsVerification);
}

TEST_CASE(
    "two examiners edit one case: an edit based on an older state is refused, naming "
    "who changed what",
    "[store][postgres][concurrency]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  under_test->create(store_test::sample_case(), kThwaite);
  add_member(under_test->reference(), store_test::kColleagueRole, member_role::examiner);
  CaseStore first = under_test->open(OpenMode::edit);
  CaseStore second =
      CaseStore::open(under_test->address(store_test::kColleagueRole), OpenMode::edit);
  first.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.9));
  CHECK_THROWS_AS(second.set_field(kPryce, EntityRef::item("E1"), "p_given_hp", json(0.8)),
                  CaseChanged);
  CHECK_THROWS_WITH(second.set_field(kPryce, EntityRef::item("E3"), "title", json("Fibres")),
                    Contains("Dr Imogen Thwaite (account cp_test_examiner)") &&
                        Contains("set item E1 field p_given_hp") &&
                        Contains("nothing was written"));
  // Nothing was lost: the first edit stands, the refused ones left no trace.
  CaseStore again =
      CaseStore::open(under_test->address(store_test::kColleagueRole), OpenMode::edit);
  CHECK(again.state().find_value(EntityRef::item("E1"), "p_given_hp")->get<double>() == 0.9);
  // Rows: the import, the colleague's membership, the first examiner's edit, then this one.
  CHECK(again.set_field(kPryce, EntityRef::item("E1"), "p_given_hp", json(0.8)) == 4);
  CHECK(again.audit_rows().size() == 4);
  CHECK(again.verify().ok());
}

TEST_CASE("a database without the store, or of a role outside the store, is refused clearly",
          "[store][postgres]") {
  auto under_test = store_test::store_for(Backend::database);
  if (!under_test) return;
  auto admin = store_test::administrator();
  if (admin.run("SELECT 1 FROM pg_roles WHERE rolname = 'cp_test_stranger'").rows() == 0)
    admin.execute("CREATE ROLE cp_test_stranger LOGIN");
  CHECK_THROWS_AS(
      CaseStore::open(store_test::case_as("cp_test_stranger", "HV-1"), OpenMode::read_only),
      StoreAccessDenied);
  CHECK_THROWS_WITH(CaseStore::open(DatabaseCase{"user=cp_test_examiner dbname=postgres", "HV-1"},
                                    OpenMode::read_only),
                    Contains("holds no Counterpoise case store"));
  CHECK_THROWS_WITH(
      CaseStore::open(DatabaseCase{"user=cp_test_examiner dbname=no_such_database", "HV-1"},
                      OpenMode::read_only),
      Contains("cannot connect"));
}
