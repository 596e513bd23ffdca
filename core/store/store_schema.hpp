#pragma once
// The case file's SQLite schema and its migrations (docs/case-store.md, "Schema").
// Migrations are cumulative: step i takes a file from schema version i to i + 1; all pending
// steps run in one transaction that is rolled back if any fails, following SQLite's advice for
// application file formats (sqlite.org/appfileformat.html): application_id + user_version.

#include <cstdint>
#include <functional>
#include <span>

namespace counterpoise::store {

class Connection;

// PRAGMA application_id of every case file: the ASCII bytes "CpCs" read as a big-endian
// 32-bit integer (0x43704373).
inline constexpr std::int32_t kApplicationId = 0x43704373;
// PRAGMA user_version this program writes; files with a higher version are refused.
// Version 2 added the operating-system account to audit rows.
inline constexpr std::int64_t kSchemaVersion = 2;

// One migration step: constant SQL run by sqlite3_exec (several statements).
struct Migration {
  const char* sql;
};

// The steps of this program, step i taking version i to i + 1.
std::span<const Migration> schema_migrations();

// Throws validation::UnsupportedFormat unless the file's schema (every row of sqlite_schema:
// type, name, table and CREATE text) is exactly what steps[0 .. version) create: a table, column,
// index, trigger or view this program did not make, or one it made but changed, is named in the
// message. Runs before anything else reads the file's tables, so a trigger or view carried by a
// file from elsewhere never runs. `version` is the file's user_version (1 .. steps.size()).
void check_schema(Connection& connection, std::span<const Migration> steps, std::int64_t version);

// Called inside the migration's transaction, after the steps, when a file that already had a
// schema (version `from` > 0) was brought to version `to`: the store records the upgrade in its
// audit there, so the upgrade and its record commit or roll back together.
using UpgradeRecorder = std::function<void(std::int64_t from, std::int64_t to)>;

// Brings the file from its user_version to steps.size() inside one BEGIN IMMEDIATE transaction,
// setting application_id and user_version at the end. On any failure everything is rolled back
// and validation::FileError is thrown (or what `record_upgrade` threw). A file already at that
// version is left alone. Throws validation::UnsupportedFormat when the file's version is higher
// than steps.size().
void apply_migrations(Connection& connection, std::span<const Migration> steps,
                      const UpgradeRecorder& record_upgrade = {});

}  // namespace counterpoise::store
