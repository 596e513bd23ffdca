#pragma once
// The throwaway PostgreSQL server of the tests (scripts/pg-cluster sets the PG environment and
// COUNTERPOISE_TEST_POSTGRES=1): the roles tests connect as, and the store installed once per
// test program. Free of any test framework, so Catch tests and the editor's Qt tests share it.

#include <cstdlib>
#include <string>

#include "core/store/case_store.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"

namespace store_test {

// Database roles the tests connect as (invented names); none is the tables' owner, so
// row-level security applies to every one of them.
inline constexpr const char* kExaminerRole = "cp_test_examiner";
inline constexpr const char* kColleagueRole = "cp_test_colleague";
inline constexpr const char* kReviewerRole = "cp_test_reviewer";
inline constexpr const char* kReaderRole = "cp_test_reader";
inline constexpr const char* kOutsiderRole = "cp_test_outsider";
// A laboratory's store administrator: sees every case's members, owns nothing, is no case's
// member (and, from store version 3, sets no memberships).
inline constexpr const char* kAdministratorRole = "cp_test_administrator";

// True when a test server is configured (the tests must then reach it).
inline bool postgres_configured() {
  const char* flag = std::getenv("COUNTERPOISE_TEST_POSTGRES");
  return flag && std::string(flag) == "1";
}

// A connection as the PG environment's user (the cluster's superuser under scripts/pg-cluster),
// who installs the store and administers memberships.
inline counterpoise::store::PgConnection administrator() {
  return counterpoise::store::PgConnection("", "test database (administrator)");
}

// Makes the login role `role` unless it exists, and makes it a member of `group`.
inline void ensure_role_in(counterpoise::store::PgConnection& admin, const char* role,
                           const char* group) {
  if (admin
          .run("SELECT 1 FROM pg_roles WHERE rolname = $1",
               {counterpoise::store::PgParam::text(role)})
          .rows() == 0) {
    const std::string create = std::string("CREATE ROLE ") + role + " LOGIN";
    admin.execute(create.c_str());
  }
  const std::string grant = std::string("GRANT ") + group + " TO " + role;
  admin.execute(grant.c_str());
}

// Makes `role` a member of case `reference` in `as`, as the case's examiner (kExaminerRole, who
// created it) does: one membership row in the case's chain.
inline void add_case_member(const std::string& reference, const std::string& role, const char* as) {
  using namespace counterpoise::store;
  CaseStore store = CaseStore::open(DatabaseCase{std::string("user=") + kExaminerRole, reference}, OpenMode::edit);
  store.change_membership(ExaminerName("Dr Imogen Thwaite"), role, std::string(as));
}

// Installs the store and makes the test roles, once per test program (serialised between
// programs by an advisory lock).
inline void prepare_postgres() {
  static bool prepared = false;
  if (prepared) return;
  auto admin = administrator();
  counterpoise::store::install_postgres_store(admin);
  admin.execute("BEGIN");
  admin.execute("SELECT pg_advisory_xact_lock(1131430772)");
  for (const char* role :
       {kExaminerRole, kColleagueRole, kReviewerRole, kReaderRole, kOutsiderRole})
    ensure_role_in(admin, role, counterpoise::store::kStoreUsersRole);
  ensure_role_in(admin, kAdministratorRole, counterpoise::store::kStoreAdministratorsRole);
  admin.execute("COMMIT");
  prepared = true;
}

}  // namespace store_test
