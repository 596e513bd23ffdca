// Signed seals and checking a store against a sealed report, on both back ends: a signed seal
// verifies with the key it records; a forged signature fails verify; a store rewritten as a
// whole, one that lost its trailing edits before a seal, and one that lost a sealed revision each
// pass verify on their own (the limit of any chain kept inside the store) but fail the check
// against the report (docs/case-store.md, "Signed seals" and "Checking a store against a report").
#include <catch2/catch.hpp>

#include "core/platform/ed25519.hpp"
#include "core/store/anchor_check.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/report_anchor.hpp"
#include "tests/core/store/store_backends.hpp"

using namespace counterpoise;
using Catch::Matchers::Contains;
using store_test::Backend;

namespace {

std::shared_ptr<const platform::Ed25519PrivateKey> key_of(char fill) {
  // Fixed invented seeds, so a failure reproduces; the values are not from any publication.
  return std::make_shared<const platform::Ed25519PrivateKey>(
      platform::Ed25519PrivateKey::from_seed(std::string(32, fill)));
}

struct IssuedReport {
  store::SealAnchor anchor;
  std::string bytes;  // stands for the PDF: only its digest is sealed
};

// Seals the current revision as the report command does: prepare (fix and sign), "render" a
// report carrying the anchor, seal with the report's bytes.
IssuedReport issue(store::CaseStore& case_store, std::shared_ptr<const platform::Ed25519PrivateKey> key,
                   const std::string& name) {
  const store::PreparedSeal prepared = case_store.prepare_seal(store_test::kThwaite, std::move(key));
  IssuedReport report{prepared.anchor,
                      "%PDF-1.4 " + name + " <cpseal:anchor>" + store::anchor_element_text(prepared.anchor) +
                          "</cpseal:anchor>"};
  case_store.seal_revision(prepared, report.bytes, name);
  return report;
}

std::int64_t set_lr(store::CaseStore& case_store, double lr) {
  return case_store.set_field(store_test::kThwaite, store::EntityRef::item("E2"), "lr", nlohmann::json(lr));
}

std::string sql_text(const std::string& text) {
  std::string quoted = "'";
  for (char c : text) quoted += c == '\'' ? std::string("''") : std::string(1, c);
  return quoted + "'";
}

// Changes made behind the program's back, alike on both back ends: SQL on the file with its
// protective triggers dropped and put back, or as the database's superuser with triggers off
// for the transaction (session_replication_role = replica).
class BehindTheProgram {
 public:
  BehindTheProgram(Backend backend, std::filesystem::path file, std::string reference)
      : backend_(backend), file_(std::move(file)), reference_(std::move(reference)) {}

  void keep_rows_up_to(std::int64_t seq) {
    run("DELETE FROM audit WHERE seq > " + std::to_string(seq),
        "DELETE FROM counterpoise.audit WHERE case_ref = $1 AND seq > " + std::to_string(seq));
  }
  void drop_revision(std::int64_t revision) {
    run("DELETE FROM revisions WHERE revision = " + std::to_string(revision),
        "DELETE FROM counterpoise.revisions WHERE case_ref = $1 AND revision = " + std::to_string(revision));
  }
  void unseal(std::int64_t revision) {
    const std::string columns =
        " SET sealed_seq = NULL, sealed_at = NULL, sealed_by = NULL, state_json = NULL, state_sha256 = NULL, "
        "report_file_name = NULL, report_bytes = NULL, report_sha256 = NULL WHERE ";
    run("UPDATE revisions" + columns + "revision = " + std::to_string(revision),
        "UPDATE counterpoise.revisions" + columns + "case_ref = $1 AND revision = " + std::to_string(revision));
  }
  void set_item_body(const std::string& id, const std::string& body) {
    run("UPDATE items SET body = " + sql_text(body) + " WHERE item_id = " + sql_text(id),
        "UPDATE counterpoise.items SET body = " + sql_text(body) + " WHERE case_ref = $1 AND item_id = " +
            sql_text(id));
  }
  void set_chain_head(std::int64_t seq, const std::string& hash) {
    const std::string head = sql_text(std::to_string(seq) + " " + hash);
    run("UPDATE meta SET value = " + head + " WHERE key = 'chain_head'",
        "UPDATE counterpoise.cases SET chain_head = " + head + " WHERE case_ref = $1");
  }
  void replace_row(const store::AuditRow& row) {
    const std::string set = " SET new_value = " + sql_text(*row.new_value) + ", hash = " + sql_text(row.hash);
    run("UPDATE audit" + set + " WHERE seq = " + std::to_string(row.seq),
        "UPDATE counterpoise.audit" + set + " WHERE case_ref = $1 AND seq = " + std::to_string(row.seq));
  }

 private:
  void run(const std::string& sqlite_sql, const std::string& postgres_sql) {
    if (backend_ == Backend::file) {
      store_test::raw_sql_behind_triggers(file_, sqlite_sql);
      return;
    }
    auto admin = store_test::administrator();
    admin.execute("BEGIN");
    admin.execute("SET LOCAL session_replication_role = replica");
    admin.run(postgres_sql.c_str(), {store::PgParam::text(reference_)});
    admin.execute("COMMIT");
  }

  Backend backend_;
  std::filesystem::path file_;
  std::string reference_;
};

std::string item_body(const store::CaseStore& case_store, const std::string& id) {
  for (const auto& [item_id, body] : case_store.state().items())
    if (item_id == id) return store::canonical_text(body);
  return "";
}

}  // namespace

TEST_CASE("a signed seal verifies with the key it records, and the store matches its report",
          "[store][seal]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under = store_test::store_for(backend);
  if (!under) return;
  auto case_store = under->create(store_test::sample_case(), store_test::kThwaite);
  set_lr(case_store, 15000);
  const auto key = key_of('\x11');
  const IssuedReport report = issue(case_store, key, "report-1.pdf");

  const auto& s = report.anchor.statement;
  CHECK(s.case_reference == "HV-2026-0117");
  CHECK(s.revision == 1);
  CHECK(s.chain_head_seq == 2);  // the edit before the seal
  CHECK(s.chain_head_hash == case_store.audit_rows()[1].hash);
  CHECK(s.public_key == key->public_key().hex());
  CHECK(key->public_key().verifies(s.signed_bytes(), platform::bytes_of_hex(report.anchor.signature, "signature")));

  const store::VerifyReport verified = case_store.verify();
  REQUIRE(verified.ok());
  REQUIRE(verified.seals.size() == 1);
  CHECK(verified.seals[0].public_key == key->public_key().hex());
  const auto info = case_store.latest_seal();
  REQUIRE(info);
  CHECK(info->signed_seal());
  CHECK(info->signature == report.anchor.signature);

  // The anchor read back from the report's bytes is the one printed, and the store matches it.
  CHECK(store::read_report_anchor(report.bytes, "report") == report.anchor);
  const store::AnchorCheck check = store::check_against_report(case_store, report.anchor, report.bytes);
  INFO(check.problem.value_or(""));
  CHECK(check.ok());
  // A report file changed after it was issued is not the report sealed.
  const auto changed = store::check_against_report(case_store, report.anchor, report.bytes + " ");
  REQUIRE_FALSE(changed.ok());
  CHECK_THAT(*changed.problem, Contains("is not the report sealed with revision 1"));

  // A second seal after more edits (a new revision, opened by a prepared row) also verifies.
  set_lr(case_store, 17000);
  const IssuedReport second = issue(case_store, key, "report-2.pdf");
  CHECK(second.anchor.statement.revision == 2);
  CHECK(store::check_against_report(case_store, second.anchor, second.bytes).ok());
  CHECK(store::check_against_report(case_store, report.anchor, report.bytes).ok());
  // Sealing twice in a row opens a revision with the prepared row and seals it.
  const IssuedReport third = issue(case_store, key, "report-3.pdf");
  CHECK(third.anchor.statement.revision == 3);
  CHECK(store::check_against_report(case_store, third.anchor, third.bytes).ok());
}

TEST_CASE("an unsigned seal verifies and is reported as unsigned", "[store][seal]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under = store_test::store_for(backend);
  if (!under) return;
  auto case_store = under->create(store_test::sample_case(), store_test::kThwaite);
  case_store.seal_revision(store_test::kThwaite, "report bytes", "r.pdf");
  const store::VerifyReport verified = case_store.verify();
  REQUIRE(verified.ok());
  REQUIRE(verified.seals.size() == 1);
  CHECK_FALSE(verified.seals[0].signed_seal());
  CHECK_FALSE(case_store.latest_seal()->signed_seal());
}

TEST_CASE("a seal prepared before the store moved on is refused and nothing is written", "[store][seal]") {
  store_test::TempDir dir;
  auto case_store = store::CaseStore::create(dir / "c.cpcase", store_test::sample_case(), store_test::kThwaite);
  const store::PreparedSeal prepared = case_store.prepare_seal(store_test::kThwaite, key_of('\x22'));
  set_lr(case_store, 15000);
  CHECK_THROWS_AS(case_store.seal_revision(prepared, "report", "r.pdf"), store::CaseChanged);
  CHECK_FALSE(case_store.latest_seal());
  CHECK(case_store.verify().ok());
}

TEST_CASE("a forged seal signature fails verify, even with the row's hash recomputed", "[store][seal]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under = store_test::store_for(backend);
  if (!under) return;
  std::filesystem::path file;
  {
    auto case_store = under->create(store_test::sample_case(), store_test::kThwaite);
    file = case_store.path();
    issue(case_store, key_of('\x33'), "r.pdf");
  }
  auto rows = under->open(store::OpenMode::read_only).audit_rows();
  store::AuditRow seal = rows.back();
  nlohmann::json value = nlohmann::json::parse(*seal.new_value);
  std::string signature = value["seal_signature"].get<std::string>();
  signature[10] = signature[10] == '0' ? '1' : '0';  // one hex digit of the signature changed
  value["seal_signature"] = signature;
  seal.new_value = store::canonical_text(value);
  seal.hash = store::audit_row_hash(seal);
  BehindTheProgram behind(backend, file, under->reference());
  behind.replace_row(seal);
  behind.set_chain_head(seal.seq, seal.hash);
  const store::VerifyReport verified = under->open(store::OpenMode::read_only).verify();
  REQUIRE_FALSE(verified.ok());
  CHECK(verified.problem->seq == seal.seq);
  CHECK_THAT(verified.problem->reason, Contains("signature does not verify"));
}

TEST_CASE("a seal re-signed with another key passes verify alone but not the check against the report",
          "[store][seal]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under = store_test::store_for(backend);
  if (!under) return;
  std::filesystem::path file;
  IssuedReport report;
  {
    auto case_store = under->create(store_test::sample_case(), store_test::kThwaite);
    file = case_store.path();
    report = issue(case_store, key_of('\x44'), "r.pdf");
  }
  // Someone with the store but not the examiner's key signs the same seal with a key of their own.
  const auto other = key_of('\x55');
  auto rows = under->open(store::OpenMode::read_only).audit_rows();
  store::AuditRow seal = rows.back();
  nlohmann::json value = nlohmann::json::parse(*seal.new_value);
  store::SealStatement statement = report.anchor.statement;
  statement.public_key = other->public_key().hex();
  const std::string signature = platform::hex_text(other->sign(statement.signed_bytes()));
  value["public_key"] = statement.public_key;
  value["seal_signature"] = signature;
  value["report_signature"] = platform::hex_text(other->sign(
      store::sealed_report_bytes_to_sign(signature, value["report_sha256"].get<std::string>())));
  seal.new_value = store::canonical_text(value);
  seal.hash = store::audit_row_hash(seal);
  BehindTheProgram behind(backend, file, under->reference());
  behind.replace_row(seal);
  behind.set_chain_head(seal.seq, seal.hash);
  const auto reopened = under->open(store::OpenMode::read_only);
  CHECK(reopened.verify().ok());  // a chain kept inside the store cannot tell: this is what the report is for
  const store::AnchorCheck check = store::check_against_report(reopened, report.anchor, report.bytes);
  REQUIRE_FALSE(check.ok());
  CHECK_THAT(*check.problem, Contains("states something else than the report: public_key"));
}

TEST_CASE("a store rewritten as a whole passes verify alone but not the check against the report",
          "[store][seal]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto original = store_test::store_for(backend);
  if (!original) return;
  IssuedReport report;
  {
    auto case_store = original->create(store_test::sample_case(), store_test::kThwaite);
    set_lr(case_store, 15000);
    report = issue(case_store, key_of('\x66'), "r.pdf");
  }
  // The rewrite: the same case built again with another value, every hash valid, sealed unsigned
  // (the examiner's key is not at hand) and then with a key of the rewriter's own.
  for (const bool with_own_key : {false, true}) {
    INFO(with_own_key);
    auto rewrite = store_test::store_for(backend);
    auto rewritten = rewrite->create(store_test::sample_case(), store_test::kThwaite);
    set_lr(rewritten, 1500);
    const IssuedReport forged = issue(rewritten, with_own_key ? key_of('\x77') : nullptr, "r.pdf");
    REQUIRE(rewritten.verify().ok());
    const store::AnchorCheck check = store::check_against_report(rewritten, report.anchor, report.bytes);
    REQUIRE_FALSE(check.ok());
    CHECK_THAT(*check.problem, Contains("differs from the one the report printed") &&
                                   Contains("rewritten or rows were removed"));
    // The rewrite matches only its own report, which is not the one issued.
    CHECK(store::check_against_report(rewritten, forged.anchor, forged.bytes).ok());
  }
}

TEST_CASE("dropped trailing edits before a seal, and a dropped sealed revision, pass verify alone but not "
          "the check against the report", "[store][seal]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under = store_test::store_for(backend);
  if (!under) return;
  std::filesystem::path file;
  IssuedReport first, second;
  std::string body_after_row_2;
  std::string hash_2, hash_3;
  {
    auto case_store = under->create(store_test::sample_case(), store_test::kThwaite);
    file = case_store.path();
    set_lr(case_store, 15000);  // row 2
    body_after_row_2 = item_body(case_store, "E2");
    first = issue(case_store, key_of('\x12'), "first.pdf");  // row 3 seals revision 1
    set_lr(case_store, 17000);                               // rows 4 (open revision 2) and 5
    second = issue(case_store, key_of('\x12'), "second.pdf");  // row 6 seals revision 2
    const auto rows = case_store.audit_rows();
    hash_2 = rows[1].hash;
    hash_3 = rows[2].hash;
  }
  BehindTheProgram behind(backend, file, under->reference());

  SECTION("the sealed revision 2 and the edit before it are dropped") {
    behind.keep_rows_up_to(3);
    behind.drop_revision(2);
    behind.set_item_body("E2", body_after_row_2);
    behind.set_chain_head(3, hash_3);
    const auto reopened = under->open(store::OpenMode::read_only);
    CHECK(reopened.verify().ok());  // the chain that is left is whole
    const auto check = store::check_against_report(reopened, second.anchor, second.bytes);
    REQUIRE_FALSE(check.ok());
    CHECK_THAT(*check.problem, Contains("holds no sealed revision 2"));
    // What the store still holds is anchored by the first report, which still matches: a report
    // covers the store up to its own seal, no further.
    CHECK(store::check_against_report(reopened, first.anchor, first.bytes).ok());
  }
  SECTION("everything after the edit of row 2 is dropped: the first seal and what followed") {
    behind.keep_rows_up_to(2);
    behind.drop_revision(2);
    behind.unseal(1);
    behind.set_item_body("E2", body_after_row_2);
    behind.set_chain_head(2, hash_2);
    const auto reopened = under->open(store::OpenMode::read_only);
    CHECK(reopened.verify().ok());
    for (const IssuedReport* report : {&first, &second}) {
      const auto check = store::check_against_report(reopened, report->anchor, report->bytes);
      REQUIRE_FALSE(check.ok());
      CHECK_THAT(*check.problem, Contains("holds no sealed revision"));
    }
  }
}

TEST_CASE("a report's seal altered in the report itself is found before the store is read", "[store][seal]") {
  store_test::TempDir dir;
  auto case_store = store::CaseStore::create(dir / "c.cpcase", store_test::sample_case(), store_test::kThwaite);
  IssuedReport report = issue(case_store, key_of('\x13'), "r.pdf");
  store::SealAnchor altered = report.anchor;
  altered.statement.state_sha256[0] = altered.statement.state_sha256[0] == 'a' ? 'b' : 'a';
  const auto check = store::check_against_report(case_store, altered, report.bytes);
  REQUIRE_FALSE(check.ok());
  CHECK(check.holds.empty());
  CHECK_THAT(*check.problem, Contains("report's seal signature does not verify"));
}
