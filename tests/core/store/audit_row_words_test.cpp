// The history in words: a review note shows its verdict, reviewer, note and revision, a seal its
// report, a declared reviewer the name; a change names its field in words and keeps its values.
#include "core/store/audit_row_words.hpp"

#include <catch2/catch.hpp>

#include <vector>

#include "core/store/case_store.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::store;
using nlohmann::json;
using store_test::kPryce;
using store_test::kThwaite;
using store_test::TempDir;

TEST_CASE("review, reviewer and seal rows are told in words, changes keep their values", "[store][history]") {
  TempDir dir;
  CaseStore store = CaseStore::create(dir / "case.cpcase", store_test::sample_case(), kThwaite);
  store.declare_reviewer(kThwaite, kPryce);
  store.seal_revision(kThwaite, "report bytes", "r1.pdf");
  store.add_review_note(kPryce, 1, ReviewVerdict::disagree, "E2's interval should cite the validation file.");
  store.add_review_note(kPryce, 1, ReviewVerdict::agree, "");
  store.set_field(kThwaite, EntityRef::item("E2"), "lr", json(1.2e4));
  const auto rows = store.audit_rows();
  // The rows of one action, in order.
  const auto of_action = [&](const char* name) {
    std::vector<AuditRow> found;
    for (const auto& row : rows)
      if (row.action == name) found.push_back(row);
    return found;
  };
  const auto& last = rows.back();

  const AuditRowWords reviewer = audit_row_words(of_action(action::declare_reviewer).at(0));
  CHECK(reviewer.action == "declared a reviewer");
  CHECK(reviewer.new_value == "Dr Owen Pryce");  // the name, not its JSON text

  const AuditRowWords seal = audit_row_words(of_action(action::seal).at(0));
  CHECK(seal.action == "sealed");
  CHECK(seal.place == "revision 1");
  CHECK(seal.new_value.find("report r1.pdf") == 0);

  const auto reviews = of_action(action::review);
  REQUIRE(reviews.size() == 2);
  const AuditRowWords disagree = audit_row_words(reviews[0]);
  CHECK(disagree.who == "Dr Owen Pryce (reviewer)");
  CHECK(disagree.action == "review note");
  CHECK(disagree.place == "sealed revision 1");
  CHECK(disagree.old_value.empty());
  CHECK(disagree.new_value == "disagree: \u201c" "E2's interval should cite the validation file.\u201d");
  CHECK(disagree.new_value.find('{') == std::string::npos);  // no JSON

  CHECK(audit_row_words(reviews[1]).new_value == "agree");

  const AuditRowWords change = audit_row_words(last);
  CHECK(change.action == "changed");
  CHECK(change.place == "reported LR of E2");
  CHECK(change.new_value == *last.new_value);  // the stored value, as stored

  // A review row that does not read is shown as stored and says so; it never throws.
  AuditRow broken = reviews[0];
  broken.new_value = "{\"verdict\":\"shrug\"}";
  const AuditRowWords shown = audit_row_words(broken);
  CHECK(shown.action == "review note (does not read)");
  CHECK(shown.new_value == "{\"verdict\":\"shrug\"}");
}
