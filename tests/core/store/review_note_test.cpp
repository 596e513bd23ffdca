// Review notes: a declared reviewer records agree / disagree / comment on a sealed revision,
// without changing it; the notes are listed for the history, the editor and the report.
#include "core/store/review_note.hpp"

#include <catch2/catch.hpp>

#include "core/store/case_store.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::InvalidValue;
using nlohmann::json;
using store_test::kPryce;
using store_test::kThwaite;
using store_test::TempDir;

TEST_CASE("a declared reviewer's note on a sealed revision changes neither case nor revision",
          "[store][review]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
  store.declare_reviewer(kThwaite, kPryce);
  const RevisionInfo sealed = store.seal_revision(kThwaite, "report bytes", "r1.pdf");
  const std::string state = store.export_canonical();

  const std::int64_t seq = store.add_review_note(kPryce, 1, ReviewVerdict::agree, "");
  CHECK(store.add_review_note(kPryce, 1, ReviewVerdict::comment,
                              "The E2 interval should cite the laboratory's validation file.") ==
        seq + 1);
  CHECK(store.current_revision() == 1);  // no new revision was opened
  CHECK(store.latest_seal()->sealed_seq == sealed.sealed_seq);
  CHECK(store.export_canonical() == state);
  CHECK(store.sealed_report_bytes(1) == "report bytes");

  const auto notes = store.review_notes();
  REQUIRE(notes.size() == 2);
  CHECK(notes[0].seq == seq);
  CHECK(notes[0].revision == 1);
  CHECK(notes[0].reviewer == "Dr Owen Pryce");
  CHECK(notes[0].account == operating_system_account());
  CHECK(notes[0].verdict == ReviewVerdict::agree);
  CHECK(notes[1].verdict == ReviewVerdict::comment);
  CHECK_THAT(notes[1].note, Contains("validation file"));

  // An edit after the notes opens revision 2; a note on revision 1 is still allowed.
  store.set_field(kThwaite, EntityRef::item("E2"), "lr", json(1.2e4));
  CHECK(store.current_revision() == 2);
  store.add_review_note(kPryce, 1, ReviewVerdict::disagree, "E2's LR was revised after review.");
  CaseStore view = CaseStore::open(path, OpenMode::read_only);
  CHECK(view.review_notes().size() == 3);
  CHECK(view.verify().ok());
}

TEST_CASE("review notes are refused from anyone not declared, on open revisions, and without a reason",
          "[store][review]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
  store.declare_reviewer(kThwaite, kPryce);
  const std::string before = store_test::file_digest(path);
  // Revision 1 is not sealed yet.
  CHECK_THROWS_WITH(store.add_review_note(kPryce, 1, ReviewVerdict::agree, ""),
                    Contains("not a sealed revision"));
  store.seal_revision(kThwaite, "report", "r1.pdf");
  const std::string sealed = store_test::file_digest(path);
  CHECK(sealed != before);
  CHECK_THROWS_WITH(store.add_review_note(kThwaite, 1, ReviewVerdict::agree, ""),
                    Contains("not a declared reviewer"));
  CHECK_THROWS_WITH(store.add_review_note(kPryce, 2, ReviewVerdict::agree, ""),
                    Contains("not a sealed revision"));
  CHECK_THROWS_AS(store.add_review_note(kPryce, 0, ReviewVerdict::agree, ""), InvalidValue);
  CHECK_THROWS_WITH(store.add_review_note(kPryce, 1, ReviewVerdict::disagree, "  "),
                    Contains("needs a note saying why"));
  CHECK_THROWS_WITH(store.add_review_note(kPryce, 1, ReviewVerdict::comment, "a\x1b[2Jb"),
                    Contains("control character"));
  CHECK_THROWS_WITH(
      store.add_review_note(kPryce, 1, ReviewVerdict::comment, std::string(kMaxReviewNoteBytes + 1, 'a')),
      Contains("longer than"));
  CHECK(store_test::file_digest(path) == sealed);
  CHECK(store.review_notes().empty());
}

TEST_CASE("verdict names read back, a review row that does not fit fails verify",
          "[store][review][verify]") {
  for (ReviewVerdict v : {ReviewVerdict::agree, ReviewVerdict::disagree, ReviewVerdict::comment})
    CHECK(review_verdict_from_name(review_verdict_name(v)) == v);
  CHECK_FALSE(review_verdict_from_name("approve").has_value());

  TempDir dir;
  const auto path = dir / "case.cpcase";
  {
    CaseStore store = CaseStore::create(path, store_test::sample_case(), kThwaite);
    store.declare_reviewer(kThwaite, kPryce);
    store.seal_revision(kThwaite, "report", "r1.pdf");
    store.add_review_note(kPryce, 1, ReviewVerdict::agree, "");  // row 4
  }
  // The note's author rewritten to the examiner, with the row's hash and the head recomputed.
  AuditRow row = CaseStore::open(path, OpenMode::read_only).audit_rows().back();
  row.examiner = "Dr Imogen Thwaite";
  row.hash = audit_row_hash(row);
  store_test::raw_sql_behind_triggers(path, "UPDATE audit SET examiner = "
                            "'Dr Imogen Thwaite', hash = '" + row.hash + "' WHERE seq = 4; "
                            "UPDATE meta SET value = '4 " + row.hash + "' WHERE key = 'chain_head'");
  const VerifyReport report = CaseStore::open(path, OpenMode::read_only).verify();
  REQUIRE_FALSE(report.ok());
  CHECK(report.problem->seq == 4);
  CHECK_THAT(report.problem->reason, Contains("not a declared reviewer"));
}
