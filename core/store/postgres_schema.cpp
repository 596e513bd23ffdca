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

// Version 2 -> 3. A change of membership is an audit row in the case's chain (action `member`,
// membership_change.hpp): inserting that row is what changes the members table, through the
// trigger below, which runs as the tables' owner. Nobody else writes the members table any
// more, not the administrators either, so no membership changes without its row; and only an
// examiner of the case may insert the row (the audit's writers_append policy). The trigger
// checks the row's old role against the table (the program read it outside the write lock),
// keeps an examiner on every case, and grants store use to a new member, as the administrators
// did. Members of a case see its members (the program reads the old role); administrators
// still see every case's members.
constexpr const char* kVersion3 = R"sql(
CREATE FUNCTION counterpoise.apply_membership_row() RETURNS trigger LANGUAGE plpgsql
  SECURITY DEFINER SET search_path = pg_catalog AS $f$
DECLARE
  before jsonb := NEW.old_value::jsonb;
  after jsonb := NEW.new_value::jsonb;
  target text := after->>'member';
  old_role text := before->>'role';
  new_role text := after->>'role';
  held text;
BEGIN
  IF target IS NULL OR target IS DISTINCT FROM before->>'member' THEN
    RAISE EXCEPTION USING ERRCODE = 'check_violation',
      MESSAGE = 'a membership row names no member, or two';
  END IF;
  IF new_role IS NOT NULL AND NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = target) THEN
    RAISE EXCEPTION USING ERRCODE = 'check_violation',
      MESSAGE = format('there is no database role %s', quote_ident(target));
  END IF;
  SELECT m.role INTO held FROM counterpoise.members m
    WHERE m.case_ref = NEW.case_ref AND m.member = target FOR UPDATE;
  IF held IS DISTINCT FROM old_role THEN
    RAISE EXCEPTION USING ERRCODE = 'check_violation',
      MESSAGE = format('the membership row says %s was %s of the case, but it is %s',
                       quote_ident(target), coalesce(old_role, 'no member'),
                       coalesce(held, 'no member'));
  END IF;
  IF new_role IS NULL THEN
    DELETE FROM counterpoise.members WHERE case_ref = NEW.case_ref AND member = target;
  ELSE
    INSERT INTO counterpoise.members(case_ref, member, role)
      VALUES (NEW.case_ref, target, new_role)
      ON CONFLICT (case_ref, member) DO UPDATE SET role = EXCLUDED.role;
    IF NOT pg_has_role(target, 'counterpoise_users', 'MEMBER') THEN
      EXECUTE format('GRANT counterpoise_users TO %I', target);
    END IF;
  END IF;
  IF NOT EXISTS (SELECT 1 FROM counterpoise.members m
                 WHERE m.case_ref = NEW.case_ref AND m.role = 'examiner') THEN
    RAISE EXCEPTION USING ERRCODE = 'check_violation',
      MESSAGE = 'a case keeps at least one examiner';
  END IF;
  RETURN NULL;
END $f$;
REVOKE ALL ON FUNCTION counterpoise.apply_membership_row() FROM PUBLIC;
-- AFTER: the row has passed the audit's policies (who may write it) before it changes anything.
CREATE TRIGGER membership_from_audit AFTER INSERT ON counterpoise.audit
  FOR EACH ROW WHEN (NEW.action = 'member')
  EXECUTE FUNCTION counterpoise.apply_membership_row();

DROP POLICY administrators_manage ON counterpoise.members;
REVOKE INSERT, UPDATE, DELETE ON counterpoise.members FROM counterpoise_administrators;
CREATE POLICY administrators_read ON counterpoise.members FOR SELECT
  TO counterpoise_administrators USING (true);
CREATE POLICY case_members_read ON counterpoise.members FOR SELECT USING (
  members.case_ref IN (SELECT v.case_ref FROM counterpoise.my_memberships v));
)sql";

constexpr const char* kSteps[] = {kVersion1, kVersion2, kVersion3};
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

}  // namespace counterpoise::store
