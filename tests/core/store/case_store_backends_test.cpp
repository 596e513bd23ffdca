// The case store's behaviour, written once and run against both back ends (the SQLite file and
// the PostgreSQL database): the same edits give the same audit rows, hashed by the same
// definition (docs/case-store.md, "Hash chain"), and verify the same way.

#include <catch2/catch.hpp>
#include <openssl/evp.h>

#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "tests/core/store/store_backends.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::InvalidValue;
using nlohmann::json;
using store_test::Backend;
using store_test::kPryce;
using store_test::kThwaite;

namespace {

// SHA-256 (FIPS 180-4) through OpenSSL's EVP interface directly, beside the store's own helper.
std::string openssl_sha256_hex(const std::string& bytes) {
  unsigned char digest[EVP_MAX_MD_SIZE];
  unsigned int length = 0;
  EVP_Digest(bytes.data(), bytes.size(), digest, &length, EVP_sha256(), nullptr);
  static const char* hex = "0123456789abcdef";
  std::string out;
  for (unsigned int i = 0; i < length; ++i) {
    out += hex[digest[i] >> 4];
    out += hex[digest[i] & 15];
  }
  return out;
}

// The row's hash by the documented definition: SHA-256 of the row's members as one JSON object
// with sorted keys and no white space (nlohmann::json keeps object members sorted and dump()
// writes no white space).
std::string documented_row_hash(const AuditRow& row) {
  json content = {
      {"action", row.action}, {"at", row.at},   {"entity", row.entity},  {"examiner", row.examiner},
      {"field", row.field},   {"key", row.key}, {"prev", row.prev_hash}, {"revision", row.revision},
      {"seq", row.seq}};
  content["old"] = row.old_value ? json(*row.old_value) : json(nullptr);
  content["new"] = row.new_value ? json(*row.new_value) : json(nullptr);
  if (row.account) content["account"] = *row.account;
  return openssl_sha256_hex(content.dump());
}

// What an audit row says, without who and when: equal across back ends for the same edits.
std::vector<std::string> row_contents(const std::vector<AuditRow>& rows) {
  std::vector<std::string> out;
  for (const AuditRow& row : rows)
    out.push_back(std::to_string(row.seq) + " r" + std::to_string(row.revision) + " " +
                  row.examiner + " " + row.action + " " + row.entity + " " + row.key + " " +
                  row.field + " " + row.old_value.value_or("(absent)") + " -> " +
                  row.new_value.value_or("(absent)"));
  return out;
}

// The same sequence of edits on either back end (the one in case_store_test.cpp's audit test).
void make_edits(CaseStore& store) {
  CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.9)) == 2);
  CHECK(store.set_field(kThwaite, EntityRef::section("propositions"), "level", json("activity")) ==
        3);
  CHECK(store.add_item(kThwaite, json{{"id", "E4"}, {"model", "reported-lr"}, {"lr", 12.5}}, 1) ==
        4);
  CHECK(store.move_item(kThwaite, "E4", 3) == 5);
  CHECK(store.remove_item(kThwaite, "E2") == 6);
  CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "title", std::nullopt) == 7);
}

json edited_case() {
  json expected = store_test::sample_case();
  expected["items"][0]["p_given_hp"] = 0.9;
  expected["items"][0].erase("title");
  expected["propositions"]["level"] = "activity";
  expected["items"].erase(1);
  expected["items"].push_back(json{{"id", "E4"}, {"model", "reported-lr"}, {"lr", 12.5}});
  return expected;
}

}  // namespace

TEST_CASE("both back ends: import, edits and export keep the case and chain every row",
          "[store][backends]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under_test = store_test::store_for(backend);
  if (!under_test) return;
  {
    CaseStore store = under_test->create(store_test::sample_case(), kThwaite);
    CHECK(store.export_canonical() == canonical_text(store_test::sample_case()));
    make_edits(store);
    CHECK(store.export_canonical() == canonical_text(edited_case()));
  }
  CaseStore view = under_test->open(OpenMode::read_only);
  CHECK(view.export_canonical() == canonical_text(edited_case()));
  const std::vector<AuditRow> rows = view.audit_rows();
  REQUIRE(rows.size() == 7);
  CHECK(rows[0].action == "import");
  CHECK(rows[0].prev_hash == std::string(64, '0'));
  CHECK(rows[3].new_value ==
        R"({"item":{"id":"E4","lr":12.5,"model":"reported-lr"},"position":1})");
  for (std::size_t i = 0; i < rows.size(); ++i) {
    CAPTURE(i);
    CHECK(rows[i].hash == documented_row_hash(rows[i]));
    if (i > 0) CHECK(rows[i].prev_hash == rows[i - 1].hash);
    // The account is who the back end knows: the OS account for a file, the database role.
    CHECK(rows[i].account ==
          (backend == Backend::file ? operating_system_account() : store_test::kExaminerRole));
  }
  const VerifyReport report = view.verify();
  CHECK(report.ok());
  CHECK(report.rows_checked == 7);
  CHECK(report.revisions == 1);
}

TEST_CASE("both back ends write the same audit rows for the same edits", "[store][backends]") {
  auto file = store_test::store_for(Backend::file);
  auto database = store_test::store_for(Backend::database);
  if (!database) return;
  CaseStore in_file = file->create(store_test::sample_case(), kThwaite);
  CaseStore in_database = database->create(store_test::sample_case(), kThwaite);
  make_edits(in_file);
  make_edits(in_database);
  CHECK(row_contents(in_file.audit_rows()) == row_contents(in_database.audit_rows()));
  CHECK(in_file.export_canonical() == in_database.export_canonical());
}

TEST_CASE("both back ends: a refused edit writes nothing and a read-only store never writes",
          "[store][backends]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under_test = store_test::store_for(backend);
  if (!under_test) return;
  StoreOptions options;
  options.validate = store_test::refuse_probability_above_one;
  CaseStore store = under_test->create(store_test::sample_case(), kThwaite, options);
  CHECK_THROWS_WITH(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(1.5)),
                    Contains("at most 1"));
  CHECK_THROWS_AS(store.set_field(kThwaite, EntityRef::item("E9"), "title", json("x")),
                  InvalidValue);
  CHECK_THROWS_AS(store.add_item(kThwaite, json{{"id", "E1"}}), InvalidValue);
  CHECK_THROWS_AS(store.remove_item(kThwaite, "E9"), InvalidValue);
  CHECK(under_test->open(OpenMode::read_only).audit_rows().size() == 1);
  CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.5)) == 2);
  CaseStore view = under_test->open(OpenMode::read_only);
  CHECK_THROWS_AS(view.set_field(kThwaite, EntityRef::item("E1"), "title", json("x")),
                  std::logic_error);
  CHECK(view.verify().ok());
}

TEST_CASE("both back ends: sealing keeps the report's exact bytes and opens a new revision",
          "[store][backends]") {
  const Backend backend = GENERATE(Backend::file, Backend::database);
  INFO(store_test::backend_name(backend));
  auto under_test = store_test::store_for(backend);
  if (!under_test) return;
  CaseStore store = under_test->create(store_test::sample_case(), kThwaite);
  // Every byte value, NUL and 0xff included: a report is bytes, not text.
  std::string report = "%PDF-1.7 invented report ";
  for (int b = 0; b < 256; ++b) report += static_cast<char>(b);
  store.declare_reviewer(kThwaite, kPryce);
  const RevisionInfo sealed = store.seal_revision(kPryce, report, "HV-2026-0117-report.pdf");
  CHECK(sealed.revision == 1);
  CHECK(sealed.sealed_by == "Dr Owen Pryce");
  CHECK(sealed.sealer_role == "reviewer");
  CHECK(sealed.report_examiner == "Dr Imogen Thwaite");
  CHECK(sealed.report_sha256 == openssl_sha256_hex(report));
  CHECK(sealed.state_sha256 == openssl_sha256_hex(store.export_canonical()));
  const std::string sealed_state = store.export_canonical();
  store.set_field(kThwaite, EntityRef::item("E2"), "lr", json(1.6e4));
  CHECK(store.current_revision() == 2);
  CHECK(store.add_review_note(kPryce, 1, ReviewVerdict::agree, "") > 0);

  CaseStore view = under_test->open(OpenMode::read_only);
  CHECK(view.sealed_report_bytes(1) == report);
  CHECK(view.sealed_state_text(1) == sealed_state);
  CHECK_THROWS_AS(view.sealed_report_bytes(2), InvalidValue);
  const auto revisions = view.revisions();
  REQUIRE(revisions.size() == 2);
  CHECK(revisions[0].sealed());
  CHECK_FALSE(revisions[1].sealed());
  CHECK(view.latest_seal()->revision == 1);
  CHECK(view.reviewers() == std::vector<std::string>{"Dr Owen Pryce"});
  REQUIRE(view.review_notes().size() == 1);
  CHECK(view.review_notes()[0].revision == 1);
  const auto rows = view.audit_rows();
  REQUIRE(rows.size() == 6);  // import, declare-reviewer, seal, open-revision, set, review
  CHECK(rows[2].action == "seal");
  CHECK(rows[3].action == "open-revision");
  CHECK(rows[5].action == "review");
  CHECK(view.verify().ok());
}
