// A sealed revision of a case store compared with its parent lists exactly the audited edits
// between them: one difference per member an audited edit changed, and no other.
#include <map>
#include <set>
#include <tuple>

#include <catch2/catch.hpp>

#include "core/comparison/case_comparison.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/case_store.hpp"
#include "tests/core/comparison/comparison_test_support.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

using Place = std::tuple<std::string, std::string, std::string>;  // section, item id, member

comparison::CaseVersion sealed_version(const store::CaseStore& stored, std::int64_t revision) {
  const json document = reading::parse_json_text(stored.sealed_state_text(revision), "revision");
  return comparison_test::version_of(document, "r" + std::to_string(revision), stored.path().parent_path());
}

// Where an audited edit changed the case, in the comparison's terms.
std::optional<Place> place_of(const store::AuditRow& row) {
  if (row.action == store::action::set_field)
    return row.entity == "item" ? Place{"items", row.key, row.field} : Place{row.key, "", row.field};
  if (row.action == store::action::add_item || row.action == store::action::remove_item)
    return Place{"items", row.key, ""};
  return std::nullopt;  // opening a revision, sealing, declaring a reviewer: not a change of content
}

}  // namespace

TEST_CASE("a sealed revision compared with its parent lists exactly the audited edits", "[comparison][store]") {
  store_test::TempDir dir;
  auto stored = store::CaseStore::create(dir / "case.cpcase", store_test::sample_case(), store_test::kThwaite);
  stored.seal_revision(store_test::kThwaite, "report of revision 1", "report-1.pdf");
  // Revision 2: edits of an input, an item's wording, a proposition, an item added and one removed.
  stored.set_field(store_test::kThwaite, store::EntityRef::item("E1"), "p_given_hp", json(0.9));
  stored.set_field(store_test::kThwaite, store::EntityRef::item("E3"), "title", json("Fibres on the window sill"));
  stored.set_field(store_test::kThwaite, store::EntityRef::section("propositions"), "hd",
                   json("The glass on the jacket came from a bottle broken in the street."));
  stored.add_item(store_test::kThwaite, json::parse(R"({"id": "E4", "model": "reported-lr", "lr": 15})"));
  stored.remove_item(store_test::kThwaite, "E2");
  // An edit undone within the revision changes nothing between the sealed states.
  stored.set_field(store_test::kThwaite, store::EntityRef::item("E3"), "p_given_hd", json(0.02));
  stored.set_field(store_test::kThwaite, store::EntityRef::item("E3"), "p_given_hd", json(0.013));
  stored.seal_revision(store_test::kThwaite, "report of revision 2", "report-2.pdf");

  std::multiset<Place> audited;
  for (const auto& row : stored.audit_rows()) {
    if (row.revision != 2) continue;
    if (auto place = place_of(row)) audited.insert(*place);
  }
  const auto c = comparison::compare_cases(sealed_version(stored, 1), sealed_version(stored, 2));
  std::multiset<Place> listed;
  for (const auto& d : c.differences) listed.insert(Place{d.path.section, d.path.item_id, d.path.field});
  // The audited places less the one edited and restored (E3's P(E|Hd), two rows).
  std::multiset<Place> expected = audited;
  expected.erase(Place{"items", "E3", "p_given_hd"});
  CHECK(listed == expected);
  CHECK(listed.size() == 5);
  CHECK(c.a.sha256 == stored.revisions()[0].state_sha256);
  CHECK(c.b.sha256 == stored.revisions()[1].state_sha256);
}
