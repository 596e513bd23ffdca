#pragma once
// The shared case store's schema in a PostgreSQL database (docs/case-store.md, "The shared
// store"): every case's sections, items, revisions and audit rows in one set of tables keyed by
// the case reference, in the schema `counterpoise`, with row-level security keyed on the
// database role (the members table: examiner, reviewer or reader of a case). Migrations are
// cumulative steps, as for the file (store_schema.hpp); the version is kept in
// counterpoise.store_version.

#include <cstdint>
#include <string>

namespace counterpoise::store {

class PgConnection;

// The version this program writes and reads.
inline constexpr std::int64_t kPostgresSchemaVersion = 3;
// The group role whose members may use the store at all (made by install_postgres_store).
inline constexpr const char* kStoreUsersRole = "counterpoise_users";
// The group role whose members see every case's reference and members, not its content, and
// grant store use (from version 2; from version 3 a case's examiners set its members:
// CaseStore::change_membership).
inline constexpr const char* kStoreAdministratorsRole = "counterpoise_administrators";
// A case member's role, as the members table and its policies spell it.
namespace member_role {
inline constexpr const char* examiner = "examiner";  // reads and edits, seals
inline constexpr const char* reviewer = "reviewer";  // reads, adds review notes
inline constexpr const char* reader = "reader";      // reads
}  // namespace member_role

// Creates the store in the connected database, or brings an older one to
// kPostgresSchemaVersion, in one transaction under an advisory lock (two installers at once are
// serialised). Run by the laboratory's store administrator: a role that may create schemas and
// roles and that then owns the tables (owners are not bound by row-level security). Returns the
// version found before (0: none). Throws validation::UnsupportedFormat for a newer store and
// validation::FileError when the server refuses.
// `up_to_version` stops at an older version (for the tests of the upgrade path); throws
// validation::InvalidValue for a version that does not exist.
std::int64_t install_postgres_store(PgConnection& connection,
                                    std::int64_t up_to_version = kPostgresSchemaVersion);

// Throws validation::UnsupportedFormat unless the database holds a store of this program's
// version that the connected role may use (the message says what to do), FileError otherwise.
void check_postgres_store(PgConnection& connection);

}  // namespace counterpoise::store
