#include "core/store/postgres_schema.hpp"

#include <span>

#include "core/store/postgres_connection.hpp"

namespace counterpoise::store {

namespace {

// Version 0 -> 1. Never change what an existing table or column means: add new ones in a new
// step. Every policy names the role through current_user, so the database, not the program,
// decides who reads and writes a case.
constexpr const char* kVersion1 = R"sql(
DO $$ BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'counterpoise_users') THEN
    CREATE ROLE counterpoise_users NOLOGIN;
  END IF;
END $$;
CREATE SCHEMA counterpoise;
REVOKE ALL ON SCHEMA counterpoise FROM PUBLIC;
CREATE TABLE counterpoise.store_version(version integer NOT NULL);
CREATE TABLE counterpoise.cases(
  case_ref text PRIMARY KEY CHECK (octet_length(case_ref) BETWEEN 1 AND 200),
  created_by text NOT NULL DEFAULT current_user,
  chain_head text NOT NULL);
CREATE TABLE counterpoise.members(
  case_ref text NOT NULL REFERENCES counterpoise.cases(case_ref),
  member text NOT NULL,
  role text NOT NULL CHECK (role IN ('examiner', 'reviewer', 'reader')),
  PRIMARY KEY (case_ref, member));
CREATE TABLE counterpoise.sections(
  case_ref text NOT NULL REFERENCES counterpoise.cases(case_ref),
  name text NOT NULL,
  body text NOT NULL,
  PRIMARY KEY (case_ref, name));
CREATE TABLE counterpoise.items(
  case_ref text NOT NULL REFERENCES counterpoise.cases(case_ref),
  item_id text NOT NULL,
  position bigint NOT NULL,
  body text NOT NULL,
  PRIMARY KEY (case_ref, item_id));
CREATE TABLE counterpoise.revisions(
  case_ref text NOT NULL REFERENCES counterpoise.cases(case_ref),
  revision bigint NOT NULL,
  opened_seq bigint NOT NULL,
  sealed_seq bigint,
  sealed_at text,
  sealed_by text,
  state_json text,
  state_sha256 text,
  report_file_name text,
  report_bytes bytea,
  report_sha256 text,
  PRIMARY KEY (case_ref, revision));
CREATE TABLE counterpoise.audit(
  case_ref text NOT NULL,
  seq bigint NOT NULL CHECK (seq >= 1),
  revision bigint NOT NULL,
  at text NOT NULL,
  examiner text NOT NULL,
  account text NOT NULL,
  action text NOT NULL,
  entity text NOT NULL,
  entity_key text NOT NULL,
  field text NOT NULL,
  old_value text,
  new_value text,
  prev_hash text NOT NULL,
  hash text NOT NULL,
  PRIMARY KEY (case_ref, seq),
  FOREIGN KEY (case_ref, revision) REFERENCES counterpoise.revisions(case_ref, revision));

-- Audit rows and sealed revisions cannot be changed, not even by the tables' owner without
-- first dropping these triggers (verify then still finds the change).
CREATE FUNCTION counterpoise.refuse_change() RETURNS trigger LANGUAGE plpgsql AS $f$
BEGIN
  RAISE EXCEPTION USING ERRCODE = 'restrict_violation', MESSAGE = TG_ARGV[0];
END $f$;
CREATE TRIGGER audit_append_only BEFORE UPDATE OR DELETE ON counterpoise.audit
  FOR EACH ROW EXECUTE FUNCTION counterpoise.refuse_change('audit rows are append-only');
CREATE TRIGGER audit_no_truncate BEFORE TRUNCATE ON counterpoise.audit
  FOR EACH STATEMENT EXECUTE FUNCTION counterpoise.refuse_change('audit rows are append-only');
CREATE TRIGGER sealed_revision_read_only BEFORE UPDATE OR DELETE ON counterpoise.revisions
  FOR EACH ROW WHEN (OLD.sealed_seq IS NOT NULL)
  EXECUTE FUNCTION counterpoise.refuse_change('a sealed revision is read-only');

-- Whoever creates a case is its first examiner (the function runs as the tables' owner, who
-- alone writes the members table).
CREATE FUNCTION counterpoise.creator_is_examiner() RETURNS trigger LANGUAGE plpgsql
  SECURITY DEFINER SET search_path = pg_catalog AS $f$
BEGIN
  INSERT INTO counterpoise.members(case_ref, member, role)
    VALUES (NEW.case_ref, NEW.created_by, 'examiner');
  RETURN NEW;
END $f$;
REVOKE ALL ON FUNCTION counterpoise.creator_is_examiner() FROM PUBLIC;
CREATE TRIGGER case_creator_is_examiner AFTER INSERT ON counterpoise.cases
  FOR EACH ROW EXECUTE FUNCTION counterpoise.creator_is_examiner();

ALTER TABLE counterpoise.cases ENABLE ROW LEVEL SECURITY;
ALTER TABLE counterpoise.members ENABLE ROW LEVEL SECURITY;
ALTER TABLE counterpoise.sections ENABLE ROW LEVEL SECURITY;
ALTER TABLE counterpoise.items ENABLE ROW LEVEL SECURITY;
ALTER TABLE counterpoise.revisions ENABLE ROW LEVEL SECURITY;
ALTER TABLE counterpoise.audit ENABLE ROW LEVEL SECURITY;

-- A role sees its own memberships only.
CREATE POLICY own_membership ON counterpoise.members FOR SELECT
  USING (member = current_user);

CREATE POLICY members_read ON counterpoise.cases FOR SELECT USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = cases.case_ref AND m.member = current_user));
CREATE POLICY anyone_creates ON counterpoise.cases FOR INSERT
  WITH CHECK (created_by = current_user);
-- Moving the chain head: examiners (edits) and reviewers (review notes).
CREATE POLICY writers_extend ON counterpoise.cases FOR UPDATE USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = cases.case_ref AND m.member = current_user
    AND m.role IN ('examiner', 'reviewer')));

CREATE POLICY members_read ON counterpoise.sections FOR SELECT USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = sections.case_ref AND m.member = current_user));
CREATE POLICY examiners_write ON counterpoise.sections FOR ALL USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = sections.case_ref AND m.member = current_user AND m.role = 'examiner'));

CREATE POLICY members_read ON counterpoise.items FOR SELECT USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = items.case_ref AND m.member = current_user));
CREATE POLICY examiners_write ON counterpoise.items FOR ALL USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = items.case_ref AND m.member = current_user AND m.role = 'examiner'));

CREATE POLICY members_read ON counterpoise.revisions FOR SELECT USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = revisions.case_ref AND m.member = current_user));
CREATE POLICY examiners_open ON counterpoise.revisions FOR INSERT WITH CHECK (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = revisions.case_ref AND m.member = current_user AND m.role = 'examiner'));
CREATE POLICY examiners_seal ON counterpoise.revisions FOR UPDATE USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = revisions.case_ref AND m.member = current_user AND m.role = 'examiner'));

-- An audit row records the role that wrote it, and only examiners write rows other than
-- review notes.
CREATE POLICY members_read ON counterpoise.audit FOR SELECT USING (EXISTS (
  SELECT 1 FROM counterpoise.members m
  WHERE m.case_ref = audit.case_ref AND m.member = current_user));
CREATE POLICY writers_append ON counterpoise.audit FOR INSERT WITH CHECK (
  account = current_user AND EXISTS (
    SELECT 1 FROM counterpoise.members m
    WHERE m.case_ref = audit.case_ref AND m.member = current_user
      AND (m.role = 'examiner' OR (m.role = 'reviewer' AND audit.action = 'review'))));

GRANT USAGE ON SCHEMA counterpoise TO counterpoise_users;
GRANT SELECT ON counterpoise.store_version TO counterpoise_users;
GRANT SELECT, INSERT ON counterpoise.cases TO counterpoise_users;
GRANT UPDATE (chain_head) ON counterpoise.cases TO counterpoise_users;
GRANT SELECT ON counterpoise.members TO counterpoise_users;
GRANT SELECT, INSERT, UPDATE, DELETE ON counterpoise.sections, counterpoise.items
  TO counterpoise_users;
GRANT SELECT, INSERT ON counterpoise.revisions TO counterpoise_users;
GRANT UPDATE (sealed_seq, sealed_at, sealed_by, state_json, state_sha256, report_file_name,
              report_bytes, report_sha256) ON counterpoise.revisions TO counterpoise_users;
GRANT SELECT, INSERT ON counterpoise.audit TO counterpoise_users;
INSERT INTO counterpoise.store_version(version) VALUES (0);
)sql";

// Version 1 -> 2. Every policy asks one view which cases the connected role is a member of, and
// in which role, instead of repeating the same subquery; the view reads the members table as its
// owner and keeps the rows of current_user (which a view does not change). Memberships are set
// by the laboratory's store administrators: roles in the group counterpoise_administrators, who
// need not own the tables. They see every case's reference and membership (not its content),
// write the members table and grant counterpoise_users, which they hold with the admin option.
constexpr const char* kVersion2 = R"sql(
DO $$ BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'counterpoise_administrators') THEN
    CREATE ROLE counterpoise_administrators NOLOGIN;
  END IF;
END $$;
GRANT counterpoise_users TO counterpoise_administrators WITH ADMIN OPTION;

CREATE VIEW counterpoise.my_memberships AS
  SELECT m.case_ref, m.role FROM counterpoise.members m WHERE m.member = current_user;
GRANT SELECT ON counterpoise.my_memberships TO counterpoise_users;

DROP POLICY members_read ON counterpoise.cases;
DROP POLICY writers_extend ON counterpoise.cases;
DROP POLICY members_read ON counterpoise.sections;
DROP POLICY examiners_write ON counterpoise.sections;
DROP POLICY members_read ON counterpoise.items;
DROP POLICY examiners_write ON counterpoise.items;
DROP POLICY members_read ON counterpoise.revisions;
DROP POLICY examiners_open ON counterpoise.revisions;
DROP POLICY examiners_seal ON counterpoise.revisions;
DROP POLICY members_read ON counterpoise.audit;
DROP POLICY writers_append ON counterpoise.audit;

CREATE POLICY members_read ON counterpoise.cases FOR SELECT USING (
  cases.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v));
-- Moving the chain head: examiners (edits) and reviewers (review notes).
CREATE POLICY writers_extend ON counterpoise.cases FOR UPDATE USING (
  cases.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v
                     WHERE v.role IN ('examiner', 'reviewer')));
CREATE POLICY members_read ON counterpoise.sections FOR SELECT USING (
  sections.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v));
CREATE POLICY examiners_write ON counterpoise.sections FOR ALL USING (
  sections.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v
                        WHERE v.role = 'examiner'));
CREATE POLICY members_read ON counterpoise.items FOR SELECT USING (
  items.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v));
CREATE POLICY examiners_write ON counterpoise.items FOR ALL USING (
  items.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v
                     WHERE v.role = 'examiner'));
CREATE POLICY members_read ON counterpoise.revisions FOR SELECT USING (
  revisions.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v));
CREATE POLICY examiners_open ON counterpoise.revisions FOR INSERT WITH CHECK (
  revisions.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v
                         WHERE v.role = 'examiner'));
CREATE POLICY examiners_seal ON counterpoise.revisions FOR UPDATE USING (
  revisions.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v
                         WHERE v.role = 'examiner'));
-- An audit row records the role that wrote it, and only examiners write rows other than
-- review notes.
CREATE POLICY members_read ON counterpoise.audit FOR SELECT USING (
  audit.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v));
CREATE POLICY writers_append ON counterpoise.audit FOR INSERT WITH CHECK (
  audit.account = current_user AND audit.case_ref IN (
    SELECT v.case_ref FROM counterpoise.my_memberships v
    WHERE v.role = 'examiner' OR (v.role = 'reviewer' AND audit.action = 'review')));

CREATE POLICY administrators_list ON counterpoise.cases FOR SELECT
  TO counterpoise_administrators USING (true);
CREATE POLICY administrators_manage ON counterpoise.members FOR ALL
  TO counterpoise_administrators USING (true) WITH CHECK (true);
GRANT SELECT, INSERT, UPDATE, DELETE ON counterpoise.members TO counterpoise_administrators;
)sql";

constexpr const char* kSteps[] = {kVersion1, kVersion2};
static_assert(std::size(kSteps) == kPostgresSchemaVersion);

// The advisory lock key of installs: the ASCII bytes "CpCs", as the file's application_id.
constexpr const char* kLockInstall = "SELECT pg_advisory_xact_lock(1131430771)";

std::int64_t installed_version(PgConnection& connection) {
  PgResult exists = connection.run("SELECT to_regclass('counterpoise.store_version') IS NOT NULL");
  if (exists.text(0, 0) != "t") return 0;
  PgResult version = connection.run("SELECT version FROM counterpoise.store_version");
  return version.rows() == 1 ? version.integer(0, 0) : 0;
}

}  // namespace

std::int64_t install_postgres_store(PgConnection& connection, std::int64_t up_to_version) {
  if (up_to_version < 1 || up_to_version > kPostgresSchemaVersion)
    throw validation::InvalidValue({"store", "version"}, "there is no case store version " + std::to_string(up_to_version));
  connection.execute("BEGIN");
  try {
    connection.execute(kLockInstall);
    const std::int64_t before = installed_version(connection);
    if (before > up_to_version)
      throw validation::UnsupportedFormat(
          {}, connection.where() + ": the database holds a case store of version " +
                  std::to_string(before) + ", newer than this program's (" +
                  std::to_string(kPostgresSchemaVersion) + ")");
    for (std::int64_t step = before; step < up_to_version; ++step)
      connection.execute(kSteps[step]);
    connection.run("UPDATE counterpoise.store_version SET version = $1",
                   {PgParam::integer(up_to_version)});
    connection.execute("COMMIT");
    return before;
  } catch (...) {
    if (connection.alive()) connection.execute("ROLLBACK");
    throw;
  }
}

void check_postgres_store(PgConnection& connection) {
  PgResult exists =
      connection.run("SELECT EXISTS (SELECT 1 FROM pg_namespace WHERE nspname = 'counterpoise')");
  if (exists.text(0, 0) != "t")
    throw validation::UnsupportedFormat(
        {}, connection.where() +
                ": the database holds no Counterpoise case store; the store administrator "
                "creates one with `counterpoise-cli store init`");
  PgResult usable = connection.run("SELECT has_schema_privilege('counterpoise', 'USAGE')");
  if (usable.text(0, 0) != "t")
    throw StoreAccessDenied({}, connection.where() +
                                    ": this database role may not use the case store (the "
                                    "store administrator grants it the role " +
                                    std::string(kStoreUsersRole) + ")");
  const std::int64_t version = installed_version(connection);
  if (version != kPostgresSchemaVersion)
    throw validation::UnsupportedFormat(
        {}, connection.where() + ": the database holds a case store of version " +
                std::to_string(version) + "; this program reads version " +
                std::to_string(kPostgresSchemaVersion) +
                (version < kPostgresSchemaVersion
                     ? " (the store administrator upgrades it with `counterpoise-cli store init`)"
                     : ""));
}

namespace {

// Throws StoreAccessDenied unless the connected role may write the members table: the store's
// administrators (and the tables' owner); InvalidValue unless the case exists.
void require_membership_administrator(PgConnection& connection, const std::string& reference) {
  PgResult allowed =
      connection.run("SELECT has_table_privilege('counterpoise.members', 'INSERT')");
  if (allowed.text(0, 0) != "t")
    throw StoreAccessDenied({}, connection.where() +
                                    ": only the store's administrators (members of the role " +
                                    std::string(kStoreAdministratorsRole) +
                                    ") set who is a member of a case");
  PgResult known = connection.run("SELECT 1 FROM counterpoise.cases WHERE case_ref = $1",
                                  {PgParam::text(reference)});
  if (known.rows() != 1)
    throw validation::InvalidValue({"case", "reference"},
                                   "the store holds no case with this reference");
}

}  // namespace

void set_case_member(PgConnection& connection, const std::string& reference,
                     const std::string& member, const std::string& role) {
  if (role != member_role::examiner && role != member_role::reviewer && role != member_role::reader)
    throw validation::InvalidValue({"member", "role"},
                                   "a case member is an examiner, a reviewer or a reader");
  PgResult known =
      connection.run("SELECT 1 FROM pg_roles WHERE rolname = $1", {PgParam::text(member)});
  if (known.rows() != 1)
    throw validation::InvalidValue({"member", "name"}, "there is no database role with this name");
  connection.execute("BEGIN");
  try {
    require_membership_administrator(connection, reference);
    // GRANT takes no parameters: the name is quoted by the server's own quote_ident.
    PgResult quoted = connection.run("SELECT quote_ident($1)", {PgParam::text(member)});
    const std::string grant = std::string("GRANT ") + kStoreUsersRole + " TO " + quoted.text(0, 0);
    connection.execute(grant.c_str());
    connection.run(
        "INSERT INTO counterpoise.members(case_ref, member, role) VALUES ($1, $2, $3) "
        "ON CONFLICT (case_ref, member) DO UPDATE SET role = EXCLUDED.role",
        {PgParam::text(reference), PgParam::text(member), PgParam::text(role)});
    connection.execute("COMMIT");
  } catch (...) {
    if (connection.alive()) connection.execute("ROLLBACK");
    throw;
  }
}

bool remove_case_member(PgConnection& connection, const std::string& reference,
                        const std::string& member) {
  connection.execute("BEGIN");
  try {
    require_membership_administrator(connection, reference);
    PgResult removed = connection.run(
        "DELETE FROM counterpoise.members WHERE case_ref = $1 AND member = $2 RETURNING 1",
        {PgParam::text(reference), PgParam::text(member)});
    connection.execute("COMMIT");
    return removed.rows() == 1;
  } catch (...) {
    if (connection.alive()) connection.execute("ROLLBACK");
    throw;
  }
}

}  // namespace counterpoise::store
