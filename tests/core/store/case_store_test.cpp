#include "core/store/case_store.hpp"

#include <regex>

#include <catch2/catch.hpp>
#include <sys/stat.h>

#include "core/platform/sha256.hpp"
#include "core/store/canonical_json.hpp"
#include "tests/core/store/store_test_support.hpp"

using store_test::kThwaite;
using namespace counterpoise::store;
using counterpoise::platform::sha256_hex;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using nlohmann::json;
using store_test::raw_sql;
using store_test::TempDir;

TEST_CASE("import then export reproduces the canonical JSON exactly", "[store]") {
  TempDir dir;
  const json document = store_test::sample_case();
  {
    CaseStore store = CaseStore::create(dir / "case.cpcase", document, kThwaite);
    CHECK(store.export_canonical() == canonical_text(document));
  }
  CaseStore reopened = CaseStore::open(dir / "case.cpcase", OpenMode::read_only);
  CHECK(reopened.export_canonical() == canonical_text(document));
  const auto rows = reopened.audit_rows();
  REQUIRE(rows.size() == 1);
  CHECK(rows[0].action == "import");
  CHECK(rows[0].entity == "case");
  CHECK(rows[0].field == "import");
  CHECK(rows[0].new_value == canonical_text(document));
  CHECK_FALSE(rows[0].old_value.has_value());
  CHECK(rows[0].examiner == "Dr Imogen Thwaite");
  CHECK(rows[0].prev_hash == std::string(64, '0'));
  CHECK(std::regex_match(rows[0].at, std::regex(R"(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z)")));
  CHECK(reopened.verify().ok());
  CHECK(is_case_file(dir / "case.cpcase"));
}

TEST_CASE("a new case file is readable by its owner only, whatever the umask", "[store]") {
  TempDir dir;
  const mode_t previous = ::umask(0);
  CaseStore::create(dir / "case.cpcase", store_test::sample_case(), kThwaite);
  ::umask(previous);
  struct stat info {};
  REQUIRE(::stat((dir / "case.cpcase").c_str(), &info) == 0);
  CHECK((info.st_mode & 0777) == 0600);
  // No temporary or journal file is left beside it.
  CHECK(std::distance(std::filesystem::directory_iterator(dir.path()),
                      std::filesystem::directory_iterator()) == 1);
}

TEST_CASE("create refuses an existing file and a document that is not a case", "[store]") {
  TempDir dir;
  store_test::write_bytes(dir / "taken.cpcase", "keep me");
  CHECK_THROWS_WITH(CaseStore::create(dir / "taken.cpcase", store_test::sample_case(), kThwaite),
                    Contains("already exists"));
  CHECK(store_test::file_bytes(dir / "taken.cpcase") == "keep me");
  CHECK_THROWS_AS(CaseStore::create(dir / "bad.cpcase", json::parse(R"({"items": 3})"), kThwaite),
                  InvalidValue);
  CHECK_FALSE(std::filesystem::exists(dir / "bad.cpcase"));
  StoreOptions refuse;
  refuse.validate = [](const json&) {
    throw InvalidValue({"E1", "p_given_hp"}, "probability above 1");
  };
  CHECK_THROWS_WITH(CaseStore::create(dir / "refused.cpcase", store_test::sample_case(), kThwaite, refuse),
                    Contains("probability above 1"));
  CHECK_FALSE(std::filesystem::exists(dir / "refused.cpcase"));
  CHECK_THROWS_AS(CaseStore::create(dir / "no-such-folder" / "x.cpcase", store_test::sample_case(), kThwaite),
                  FileError);
}

TEST_CASE("every edit writes one audit row naming entity, field, old and new value", "[store]") {
  TempDir dir;
  CaseStore store =
      CaseStore::create(dir / "case.cpcase", store_test::sample_case(), kThwaite);
  CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.9)) == 2);
  CHECK(store.set_field(kThwaite, EntityRef::section("propositions"), "level", json("activity")) == 3);
  CHECK(store.add_item(kThwaite, json{{"id", "E4"}, {"model", "reported-lr"}, {"lr", 12.5}}, 1) == 4);
  CHECK(store.move_item(kThwaite, "E4", 3) == 5);
  CHECK(store.remove_item(kThwaite, "E2") == 6);
  CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "title", std::nullopt) == 7);

  const auto rows = store.audit_rows();
  REQUIRE(rows.size() == 7);
  CHECK(rows[1].action == "set");
  CHECK(rows[1].entity == "item");
  CHECK(rows[1].key == "E1");
  CHECK(rows[1].field == "p_given_hp");
  CHECK(rows[1].old_value == "0.95");
  CHECK(rows[1].new_value == "0.9");
  CHECK(rows[2].old_value == "\"source\"");
  CHECK(rows[3].action == "add");
  CHECK(rows[3].new_value ==
        R"({"item":{"id":"E4","lr":12.5,"model":"reported-lr"},"position":1})");
  CHECK(rows[4].old_value == "1");
  CHECK(rows[4].new_value == "3");
  CHECK(rows[5].action == "remove");
  CHECK(rows[6].new_value == std::nullopt);
  for (std::size_t i = 1; i < rows.size(); ++i) {
    CHECK(rows[i].prev_hash == rows[i - 1].hash);
    CHECK(rows[i].hash == audit_row_hash(rows[i]));
    CHECK(rows[i].revision == 1);
  }

  json expected = store_test::sample_case();
  expected["items"][0]["p_given_hp"] = 0.9;
  expected["items"][0].erase("title");
  expected["propositions"]["level"] = "activity";
  expected["items"].erase(1);
  expected["items"].push_back(json{{"id", "E4"}, {"model", "reported-lr"}, {"lr", 12.5}});
  CHECK(store.export_canonical() == canonical_text(expected));
  store = CaseStore::open(dir / "case.cpcase", OpenMode::read_only);
  CHECK(store.export_canonical() == canonical_text(expected));
  CHECK(store.verify().ok());
}

TEST_CASE("an edit that does not apply or is refused writes nothing", "[store]") {
  TempDir dir;
  StoreOptions options;
  options.validate = store_test::refuse_probability_above_one;
  CaseStore store = CaseStore::create(dir / "case.cpcase", store_test::sample_case(), kThwaite, options);
  const std::string before = store_test::file_digest(dir / "case.cpcase");
  CHECK_THROWS_WITH(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(1.5)),
                    Contains("at most 1"));
  CHECK_THROWS_AS(store.set_field(kThwaite, EntityRef::item("E9"), "title", json("x")), InvalidValue);
  CHECK_THROWS_AS(store.set_field(kThwaite, EntityRef::item("E1"), "id", json("E7")), InvalidValue);
  CHECK_THROWS_AS(store.add_item(kThwaite, json{{"id", "E1"}}), InvalidValue);
  CHECK_THROWS_AS(store.move_item(kThwaite, "E1", 3), InvalidValue);
  CHECK_THROWS_AS(store.remove_item(kThwaite, "E9"), InvalidValue);
  CHECK(store_test::file_digest(dir / "case.cpcase") == before);
  CHECK(store.audit_rows().size() == 1);
  CHECK(store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.5)) == 2);  // still usable

  CaseStore view = CaseStore::open(dir / "case.cpcase", OpenMode::read_only);
  CHECK_THROWS_AS(view.set_field(kThwaite, EntityRef::item("E1"), "title", json("x")), std::logic_error);
}

TEST_CASE("sealing stores state and report with their digests, later edits open a new revision",
          "[store]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
  store.set_field(kThwaite, EntityRef::item("E2"), "lr", json(1.5e4));
  CHECK_FALSE(store.latest_seal().has_value());
  // Sized from the literal: report bytes may hold NUL, so the length cannot come from strlen.
  static constexpr char kReportBytes[] = "%PDF-1.7 invented report bytes\0\x01\x02";
  const std::string report(kReportBytes, sizeof kReportBytes - 1);
  // A declared reviewer may seal; the seal row names the sealer and the report's examiner.
  store.declare_reviewer(kThwaite, store_test::kPryce);
  const RevisionInfo sealed =
      store.seal_revision(store_test::kPryce, report, "HV-2026-0117-report.pdf");
  CHECK(sealed.revision == 1);
  CHECK(sealed.sealed());
  CHECK(sealed.sealed_by == "Dr Owen Pryce");
  CHECK(sealed.sealed_by_account == operating_system_account());
  CHECK(sealed.report_examiner == "Dr Imogen Thwaite");
  CHECK(sealed.sealer_role == "reviewer");
  CHECK(sealed.report_sha256 == sha256_hex(report));
  CHECK(sealed.state_sha256 == sha256_hex(store.export_canonical()));
  CHECK(store.sealed_report_bytes(1) == report);
  CHECK(store.sealed_state_text(1) == store.export_canonical());
  CHECK(store.latest_seal()->revision == 1);
  CHECK_THROWS_AS(store.sealed_report_bytes(2), InvalidValue);

  const std::string sealed_state = store.export_canonical();
  store.set_field(kThwaite, EntityRef::item("E2"), "lr", json(1.6e4));
  CHECK(store.current_revision() == 2);
  const auto rows = store.audit_rows();
  REQUIRE(rows.size() == 6);  // import, set, declare-reviewer, seal, open-revision, set
  CHECK(rows[2].action == "declare-reviewer");
  CHECK(rows[2].revision == 1);  // an annotation: no new revision
  CHECK(rows[3].action == "seal");
  CHECK(rows[3].examiner == "Dr Owen Pryce");
  CHECK(rows[4].action == "open-revision");
  CHECK(rows[4].old_value == "1");
  CHECK(rows[4].new_value == "2");
  CHECK(rows[5].revision == 2);
  CHECK(store.sealed_state_text(1) == sealed_state);  // the sealed state did not follow the edit
  const auto revisions = store.revisions();
  REQUIRE(revisions.size() == 2);
  CHECK(revisions[0].sealed());
  CHECK_FALSE(revisions[1].sealed());
  CHECK(store.verify().ok());

  // Sealing twice without edits in between seals a new (identical) revision.
  store.seal_revision(kThwaite, "second", "r2.pdf");
  const RevisionInfo third = store.seal_revision(kThwaite, "third", "r3.pdf");
  CHECK(third.revision == 3);
  CHECK(third.state_sha256 == store.revisions()[1].state_sha256);
  CHECK(store.verify().ok());

  // The file itself refuses changes to sealed rows and to audit rows (triggers).
  CHECK_THROWS_WITH(raw_sql(path, "UPDATE revisions SET report_bytes = x'00' WHERE revision = 1"),
                    Contains("sealed revision is read-only"));
  CHECK_THROWS_WITH(raw_sql(path, "DELETE FROM revisions WHERE revision = 1"),
                    Contains("sealed revision is read-only"));
  CHECK_THROWS_WITH(raw_sql(path, "UPDATE audit SET examiner = 'x' WHERE seq = 2"),
                    Contains("append-only"));
  CHECK_THROWS_WITH(raw_sql(path, "DELETE FROM audit WHERE seq = 6"), Contains("append-only"));
}

TEST_CASE("verify finds every edit made behind the program's back", "[store][verify]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  const auto prepare = [&] {
    std::filesystem::remove(path);
    CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
    store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.9));   // row 2
    store.add_item(kThwaite, json{{"id", "E4"}, {"model", "assigned"}});         // row 3
    store.seal_revision(kThwaite, "report", "report.pdf");                       // row 4
    store.set_field(kThwaite, EntityRef::item("E3"), "p_given_hd", json(0.02));  // rows 5 (open) and 6
  };
  const auto verify = [&] { return CaseStore::open(path, OpenMode::read_only).verify(); };
  // Changes the protective triggers would refuse are made past them, and the triggers put back
  // as they were (store_test::raw_sql_behind_triggers): only verify can find these.

  prepare();
  REQUIRE(verify().ok());
  CHECK(verify().rows_checked == 6);

  SECTION("an item row changed") {
    raw_sql(
        path,
        R"(UPDATE items SET body = '{"id":"E1","model":"assigned","p_given_hp":0.99}' WHERE item_id = 'E1')");
    const auto report = verify();
    REQUIRE_FALSE(report.ok());
    CHECK_THAT(report.problem->reason, Contains("item \"E1\" differs"));
  }
  SECTION("an item moved") {
    raw_sql(path, "UPDATE items SET position = 9 WHERE item_id = 'E2'");
    CHECK_THAT(verify().problem->reason, Contains("item \"E2\""));
  }
  SECTION("a section row added") {
    raw_sql(path, R"(INSERT INTO sections VALUES ('notes', '"x"'))");
    CHECK_THAT(verify().problem->reason, Contains("section \"notes\" is not in the audit"));
  }
  SECTION("an audit value changed") {
    store_test::raw_sql_behind_triggers(path, "UPDATE audit SET new_value = '0.8' WHERE seq = 2");
    const auto report = verify();
    REQUIRE_FALSE(report.ok());
    CHECK(report.problem->seq == 2);
    CHECK_THAT(report.problem->reason, Contains("hash does not match"));
  }
  SECTION("an audit row changed and its hash recomputed") {
    // Whoever rewrites a row must rewrite every later link: the next row then does not fit.
    CaseStore view = CaseStore::open(path, OpenMode::read_only);
    AuditRow row = view.audit_rows()[1];
    row.examiner = "Someone Else";
    const std::string hash = audit_row_hash(row);
    store_test::raw_sql_behind_triggers(path, "UPDATE audit SET examiner = 'Someone Else', hash = '" +
                      hash + "' WHERE seq = 2");
    const auto report = verify();
    REQUIRE_FALSE(report.ok());
    CHECK(report.problem->seq == 3);
    CHECK_THAT(report.problem->reason, Contains("link to the previous row"));
  }
  SECTION("a middle audit row deleted") {
    store_test::raw_sql_behind_triggers(path, "DELETE FROM audit WHERE seq = 3");
    const auto report = verify();
    CHECK(report.problem->seq == 3);
    CHECK_THAT(report.problem->reason, Contains("missing"));
  }
  SECTION("the last audit row deleted") {
    store_test::raw_sql_behind_triggers(path, "DELETE FROM audit WHERE seq = 6");
    const auto report = verify();
    REQUIRE_FALSE(report.ok());
    CHECK(report.problem->seq == 5);
    CHECK_THAT(report.problem->reason, Contains("rows were removed"));
  }
  SECTION("a sealed report replaced") {
    store_test::raw_sql_behind_triggers(path,
            "UPDATE revisions SET report_bytes = x'00' WHERE revision = 1");
    const auto report = verify();
    CHECK(report.problem->seq == 4);
    CHECK_THAT(report.problem->reason, Contains("sealed revision 1"));
  }
  SECTION("a sealed state replaced together with its digest") {
    const std::string forged = R"({"items":[]})";
    store_test::raw_sql_behind_triggers(path, "UPDATE revisions SET state_json = '" + forged +
                      "', state_sha256 = '" + sha256_hex(forged) + "' WHERE revision = 1");
    CHECK(verify().problem->seq == 4);
  }
  SECTION("a change behind the back, then an edit of the same field through the program") {
    raw_sql(
        path,
        R"(UPDATE items SET body = '{"id":"E3","model":"assigned","p_given_hd":0.5}' WHERE item_id = 'E3')");
    const std::string tampered = store_test::file_digest(path);
    // The program refuses to write over the change, so verify still names the changed item and
    // not the examiner's next row.
    CHECK_THROWS_AS(CaseStore::open(path, OpenMode::edit), CaseFailsVerification);
    CHECK(store_test::file_digest(path) == tampered);
    const auto report = verify();
    REQUIRE_FALSE(report.ok());
    CHECK(report.problem->seq == 6);
    CHECK_THAT(report.problem->reason, Contains("item \"E3\" differs"));
  }
}

TEST_CASE("the row hash is SHA-256 of the canonical JSON of the row's content", "[store][verify]") {
  // The definition in docs/case-store.md, recomputed the slow way with nlohmann::json.
  AuditRow row;
  row.seq = 7;
  row.revision = 2;
  row.at = "2026-12-01T21:47:02.123Z";
  row.examiner = "Dr Imogen Thwaite \xc3\xa9";
  row.action = "set";
  row.entity = "item";
  row.key = "E1";
  row.field =
      "p_given\x01\t\\hp";  // control characters and a backslash: escaped as nlohmann::json does
  row.old_value = "0.95";
  row.new_value = "{\"a\":\"q\\\"uote\"}";
  row.prev_hash = std::string(64, 'a');
  const json content = {{"action", row.action},
                        {"at", row.at},
                        {"entity", row.entity},
                        {"examiner", row.examiner},
                        {"field", row.field},
                        {"key", row.key},
                        {"new", *row.new_value},
                        {"old", *row.old_value},
                        {"prev", row.prev_hash},
                        {"revision", 2},
                        {"seq", 7}};
  CHECK(audit_row_hash(row) == sha256_hex(canonical_text(content)));
  row.old_value.reset();
  json absent = content;
  absent["old"] = nullptr;
  CHECK(audit_row_hash(row) == sha256_hex(canonical_text(absent)));
}
