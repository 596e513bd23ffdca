#include "core/store/store_schema.hpp"

#include <map>
#include <string>
#include <tuple>

#include "core/store/sqlite_connection.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

namespace {

// Version 0 -> 1. Never change what an existing table or column means: add new ones in a new step.
constexpr const char* kVersion1 = R"sql(
CREATE TABLE meta(
  key   TEXT PRIMARY KEY,
  value TEXT NOT NULL
) STRICT;
CREATE TABLE sections(
  name TEXT PRIMARY KEY,
  body TEXT NOT NULL
) STRICT;
CREATE TABLE items(
  item_id  TEXT PRIMARY KEY,
  position INTEGER NOT NULL,
  body     TEXT NOT NULL
) STRICT;
CREATE TABLE revisions(
  revision         INTEGER PRIMARY KEY,
  opened_seq       INTEGER NOT NULL,
  sealed_seq       INTEGER,
  sealed_at        TEXT,
  sealed_by        TEXT,
  state_json       TEXT,
  state_sha256     TEXT,
  report_file_name TEXT,
  report_bytes     BLOB,
  report_sha256    TEXT
) STRICT;
CREATE TABLE audit(
  seq        INTEGER PRIMARY KEY,
  revision   INTEGER NOT NULL REFERENCES revisions(revision),
  at         TEXT NOT NULL,
  examiner   TEXT NOT NULL,
  action     TEXT NOT NULL,
  entity     TEXT NOT NULL,
  entity_key TEXT NOT NULL,
  field      TEXT NOT NULL,
  old_value  TEXT,
  new_value  TEXT,
  prev_hash  TEXT NOT NULL,
  hash       TEXT NOT NULL
) STRICT;
CREATE TABLE session(
  id       INTEGER PRIMARY KEY CHECK (id = 1),
  examiner TEXT NOT NULL,
  pid      INTEGER NOT NULL,
  host     TEXT NOT NULL,
  since    TEXT NOT NULL
) STRICT;
CREATE TRIGGER audit_append_only_update BEFORE UPDATE ON audit
BEGIN SELECT RAISE(ABORT, 'audit rows are append-only'); END;
CREATE TRIGGER audit_append_only_delete BEFORE DELETE ON audit
BEGIN SELECT RAISE(ABORT, 'audit rows are append-only'); END;
CREATE TRIGGER sealed_revision_no_update BEFORE UPDATE ON revisions WHEN OLD.sealed_seq IS NOT NULL
BEGIN SELECT RAISE(ABORT, 'a sealed revision is read-only'); END;
CREATE TRIGGER sealed_revision_no_delete BEFORE DELETE ON revisions WHEN OLD.sealed_seq IS NOT NULL
BEGIN SELECT RAISE(ABORT, 'a sealed revision is read-only'); END;
)sql";

// Version 1 -> 2: audit rows record the operating-system account beside the declared examiner.
// Rows written before keep NULL there (and their hashes: audit_log.hpp).
constexpr const char* kVersion2 = R"sql(
ALTER TABLE audit ADD COLUMN account TEXT;
)sql";

constexpr Migration kSteps[] = {{kVersion1}, {kVersion2}};

}  // namespace

std::span<const Migration> schema_migrations() { return kSteps; }

namespace {

struct SchemaObject {
  std::string type, table, sql;
  bool operator==(const SchemaObject&) const = default;
};

// Every object of the schema by name. Reading sqlite_schema runs no code of the file's: it is a
// plain table, and views (switched off on every connection) and triggers fire only when used.
std::map<std::string, SchemaObject> schema_objects(Connection& connection) {
  std::map<std::string, SchemaObject> objects;
  Statement s(connection, "SELECT name, type, tbl_name, sql FROM sqlite_schema");
  while (s.step())
    objects[s.column_text(0)] = SchemaObject{s.column_text(1), s.column_text(2), s.column_text(3)};
  return objects;
}

std::string describe_object(const std::string& name, const SchemaObject& object) {
  return object.type + " \"" + name + "\"" +
         (object.type == "table" ? "" : " (on table \"" + object.table + "\")");
}

}  // namespace

void check_schema(Connection& connection, std::span<const Migration> steps, std::int64_t version) {
  // The expected schema is built the one way the program builds it: by its own steps, in memory.
  Connection expected_db(":memory:", Connection::Access::in_memory);
  for (std::int64_t v = 0; v < version && v < static_cast<std::int64_t>(steps.size()); ++v)
    expected_db.execute(steps[static_cast<std::size_t>(v)].sql);
  const auto expected = schema_objects(expected_db);
  const auto actual = schema_objects(connection);
  const std::string refused =
      "; a case file is refused when its structure is not exactly the one this program creates, "
      "since a file from elsewhere could carry code that runs when it is used";
  for (const auto& [name, object] : actual) {
    const auto it = expected.find(name);
    if (it == expected.end())
      throw validation::UnsupportedFormat(
          {}, "the case file holds a " + describe_object(name, object) +
                  " that this program did not create" + refused);
    if (!(it->second == object))
      throw validation::UnsupportedFormat(
          {}, "the case file's " + describe_object(name, object) +
                  " differs from the one this program creates" + refused);
  }
  for (const auto& [name, object] : expected)
    if (!actual.count(name))
      throw validation::UnsupportedFormat(
          {}, "the case file lacks the " + describe_object(name, object) +
                  " this program creates" + refused);
}

void apply_migrations(Connection& connection, std::span<const Migration> steps,
                      const UpgradeRecorder& record_upgrade) {
  const auto target = static_cast<std::int64_t>(steps.size());
  WriteTransaction transaction(connection);
  // Read inside the write transaction so two processes cannot both migrate.
  const std::int64_t version = connection.query_int("PRAGMA user_version");
  if (version > target)
    throw validation::UnsupportedFormat(
        {}, "the case file has schema version " + std::to_string(version) +
                "; this program reads up to version " + std::to_string(target) +
                " (made by a newer program)");
  if (version == target) return;  // rolled back: nothing was written
  for (auto v = version; v < target; ++v)
    connection.execute(steps[static_cast<std::size_t>(v)].sql);
  // Pragmas take no bound parameters; both values are compile-time numbers, not input.
  const std::string set_id = "PRAGMA application_id = " + std::to_string(kApplicationId);
  const std::string set_version = "PRAGMA user_version = " + std::to_string(target);
  connection.execute(set_id.c_str());
  connection.execute(set_version.c_str());
  if (version > 0 && record_upgrade) record_upgrade(version, target);
  transaction.commit();
}

}  // namespace counterpoise::store
