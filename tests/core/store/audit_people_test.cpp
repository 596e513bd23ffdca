// Who is recorded: every audit row names the examiner and the operating-system account; only the
// report's examiner or a reviewer the examiner declared may seal, and the seal names both.
#include <catch2/catch.hpp>

#include "core/platform/sha256.hpp"
#include "core/store/audit_log.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using counterpoise::platform::sha256_hex;
using Catch::Matchers::Contains;
using counterpoise::validation::InvalidValue;
using nlohmann::json;
using store_test::kPryce;
using store_test::kThwaite;
using store_test::TempDir;

namespace {
const ExaminerName kMorgan{"Dr Ifan Morgan"};  // invented: neither examiner nor reviewer
}  // namespace

TEST_CASE("every audit row records the declared examiner and the operating-system account",
          "[store][examiner]") {
  TempDir dir;
  CaseStore store = CaseStore::create(dir / "case.cpcase", store_test::sample_case(), kThwaite);
  store.set_field(kPryce, EntityRef::item("E1"), "p_given_hp", json(0.9));
  store.seal_revision(kThwaite, "report", "r1.pdf");
  store.set_field(kThwaite, EntityRef::item("E1"), "p_given_hp", json(0.8));
  const auto rows = store.audit_rows();
  REQUIRE(rows.size() == 5);  // import, set, seal, open-revision, set
  const std::vector<std::string> names = {"Dr Imogen Thwaite", "Dr Owen Pryce",
                                          "Dr Imogen Thwaite", "Dr Imogen Thwaite",
                                          "Dr Imogen Thwaite"};
  for (std::size_t i = 0; i < rows.size(); ++i) {
    CHECK(rows[i].examiner == names[i]);
    CHECK(rows[i].account == operating_system_account());
  }
  CHECK(store.account() == operating_system_account());
  CHECK(CaseStore::open(dir / "case.cpcase", OpenMode::read_only).verify().ok());
}

TEST_CASE("the row hash covers the account as one more member of the canonical object",
          "[store][examiner]") {
  // docs/case-store.md, "Hash chain": "account" joins the sorted members when the row has one.
  AuditRow row;
  row.seq = 3;
  row.revision = 1;
  row.at = "2026-12-02T09:15:00.000Z";
  row.examiner = "Dr Owen Pryce";
  row.account = "opryce";
  row.action = "set";
  row.entity = "item";
  row.key = "E2";
  row.field = "lr";
  row.old_value = "20000";
  row.new_value = "15000";
  row.prev_hash = std::string(64, 'b');
  const json content = {{"account", "opryce"}, {"action", "set"},        {"at", row.at},
                        {"entity", "item"},    {"examiner", row.examiner}, {"field", "lr"},
                        {"key", "E2"},         {"new", "15000"},         {"old", "20000"},
                        {"prev", row.prev_hash}, {"revision", 1},        {"seq", 3}};
  CHECK(audit_row_hash(row) == sha256_hex(canonical_text(content)));
  AuditRow other_account = row;
  other_account.account = "root";
  CHECK(audit_row_hash(other_account) != audit_row_hash(row));
}

TEST_CASE("only the report's examiner or a declared reviewer seals, the seal names both",
          "[store][examiner]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
  const std::string before = store_test::file_digest(path);

  CHECK_THROWS_WITH(store.seal_revision(kPryce, "report", "r1.pdf"),
                    Contains("Dr Owen Pryce is neither the report's examiner (Dr Imogen Thwaite) "
                             "nor a declared reviewer"));
  CHECK_THROWS_AS(store.sealer_role(kMorgan), InvalidValue);
  // Only the case's examiner declares reviewers; not the examiner, not twice.
  CHECK_THROWS_WITH(store.declare_reviewer(kPryce, kMorgan),
                    Contains("only the case's examiner declares its reviewers"));
  CHECK_THROWS_WITH(store.declare_reviewer(kThwaite, kThwaite), Contains("cannot be declared"));
  CHECK(store_test::file_digest(path) == before);  // nothing refused was written

  CHECK(store.declare_reviewer(kThwaite, kPryce) == 2);
  CHECK_THROWS_WITH(store.declare_reviewer(kThwaite, kPryce), Contains("already"));
  CHECK(store.reviewers() == std::vector<std::string>{"Dr Owen Pryce"});
  CHECK(store.sealer_role(kThwaite) == kSealerIsExaminer);
  CHECK(store.sealer_role(kPryce) == kSealerIsReviewer);

  const RevisionInfo sealed = store.seal_revision(kPryce, "report", "r1.pdf");
  CHECK(sealed.sealed_by == "Dr Owen Pryce");
  CHECK(sealed.report_examiner == "Dr Imogen Thwaite");
  CHECK(sealed.sealer_role == "reviewer");
  const json seal = json::parse(*store.audit_rows().back().new_value);
  CHECK(seal["report_examiner"] == "Dr Imogen Thwaite");
  CHECK(seal["sealer_role"] == "reviewer");

  // The reviewers are read back from the file, and verify accepts the whole chain.
  CaseStore view = CaseStore::open(path, OpenMode::read_only);
  CHECK(view.reviewers() == std::vector<std::string>{"Dr Owen Pryce"});
  CHECK(view.verify().ok());
}

TEST_CASE("a case that names no examiner cannot be sealed", "[store][examiner]") {
  TempDir dir;
  json document = store_test::sample_case();
  document["case"].erase("examiner");
  CaseStore store = CaseStore::create(dir / "case.cpcase", document, kThwaite);
  try {
    store.seal_revision(kThwaite, "report", "r1.pdf");
    FAIL("sealed without a report examiner");
  } catch (const InvalidValue& e) {
    CHECK(e.where().item == "case");
    CHECK(e.where().field == "examiner");
  }
  CHECK_THROWS_AS(store.declare_reviewer(kThwaite, kPryce), InvalidValue);
  CHECK(store.audit_rows().size() == 1);
}

namespace {

// The rows of a small chain, built and hashed as the store does, for replay checks.
struct ChainBuilder {
  std::vector<AuditRow> rows;
  AuditRow& add(std::string examiner, std::string action, std::string field,
                std::optional<std::string> new_value, std::int64_t revision = 1) {
    AuditRow row;
    row.seq = static_cast<std::int64_t>(rows.size()) + 1;
    row.revision = revision;
    row.at = "2026-12-02T10:00:00.000Z";
    row.examiner = std::move(examiner);
    row.account = "vfl-lab";
    row.action = std::move(action);
    row.entity = "case";
    row.field = std::move(field);
    row.new_value = std::move(new_value);
    row.prev_hash = rows.empty() ? kGenesisHash : rows.back().hash;
    row.hash = audit_row_hash(row);
    rows.push_back(row);
    return rows.back();
  }
  // Replays every row but the last, then returns what the last one throws ("" if it fits).
  std::string last_row_misfit() const {
    AuditReplay replay;
    for (std::size_t i = 0; i + 1 < rows.size(); ++i) replay.apply(rows[i]);
    try {
      replay.apply(rows.back());
    } catch (const InvalidValue& e) {
      return e.what();
    }
    return "";
  }
};

std::string seal_value(const json& document, const std::string& report_examiner,
                       const std::string& role) {
  return canonical_text(json{{"report_examiner", report_examiner},
                             {"report_file_name", "r1.pdf"},
                             {"report_sha256", sha256_hex("report")},
                             {"revision", 1},
                             {"sealer_role", role},
                             {"state_sha256", sha256_hex(canonical_text(document))}});
}

}  // namespace

TEST_CASE("replay refuses seals and declarations by the wrong people, and rows without accounts",
          "[store][examiner][verify]") {
  const json document = store_test::sample_case();
  ChainBuilder chain;
  chain.add("Dr Imogen Thwaite", action::import_case, "import", canonical_text(document));

  SECTION("a seal by someone never declared") {
    chain.add("Dr Owen Pryce", action::seal, "seal",
              seal_value(document, "Dr Imogen Thwaite", "reviewer"));
    CHECK_THAT(chain.last_row_misfit(), Contains("nor a declared reviewer"));
  }
  SECTION("a seal that names another report examiner") {
    chain.add("Dr Imogen Thwaite", action::seal, "seal",
              seal_value(document, "Dr Owen Pryce", "examiner"));
    CHECK_THAT(chain.last_row_misfit(), Contains("does not name the report's examiner"));
  }
  SECTION("a reviewer declared by a reviewer") {
    chain.add("Dr Owen Pryce", action::declare_reviewer, "reviewer",
              canonical_text(json("Dr Ifan Morgan")));
    CHECK_THAT(chain.last_row_misfit(), Contains("not the case's examiner"));
  }
  SECTION("a row without an account after rows with one") {
    AuditRow& row = chain.add("Dr Imogen Thwaite", action::declare_reviewer, "reviewer",
                              canonical_text(json("Dr Owen Pryce")));
    row.account.reset();
    CHECK_THAT(chain.last_row_misfit(), Contains("records no operating-system account"));
  }
  SECTION("a declared reviewer's seal fits") {
    chain.add("Dr Imogen Thwaite", action::declare_reviewer, "reviewer",
              canonical_text(json("Dr Owen Pryce")));
    chain.add("Dr Owen Pryce", action::seal, "seal",
              seal_value(document, "Dr Imogen Thwaite", "reviewer"));
    CHECK(chain.last_row_misfit().empty());
  }
}
