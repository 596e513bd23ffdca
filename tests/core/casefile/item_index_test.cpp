// The item index answers every lookup as Case::find_item, the linear scan it replaces where many
// items are looked up (report_model, the editor's point evaluation): the same item for every id
// of every demo case, nothing for an id the case lacks, and the first item of a repeated id.
#include "core/casefile/item_index.hpp"

#include <filesystem>

#include <catch2/catch.hpp>

#include "core/interchange/case_json.hpp"

using counterpoise::casefile::Case;
using counterpoise::casefile::Item;
using counterpoise::casefile::ItemIndex;

TEST_CASE("the index finds every item of each demo case, as the scan does", "[casefile][index]") {
  const std::filesystem::path demo_dir = COUNTERPOISE_DEMO_DIR;
  int cases = 0;
  for (const auto& entry : std::filesystem::directory_iterator(demo_dir)) {
    if (entry.path().extension() != ".json") continue;
    const auto read = counterpoise::interchange::read_case_file(entry.path());
    REQUIRE(read.value);
    const Case& value = *read.value;
    const ItemIndex index(value);
    for (const Item& item : value.items) {
      CHECK(index.find(item.id) == &item);
      CHECK(index.find(item.id) == value.find_item(item.id));
    }
    CHECK(index.find("no such item") == nullptr);
    CHECK(index.find("") == nullptr);
    ++cases;
  }
  CHECK(cases >= 5);
}

TEST_CASE("a repeated id finds the first item, as the scan does", "[casefile][index]") {
  Case value;
  value.items.resize(3);
  value.items[0].id = "E1";
  value.items[1].id = "E2";
  value.items[2].id = "E1";
  const ItemIndex index(value);
  CHECK(index.find("E1") == &value.items[0]);
  CHECK(index.find("E1") == value.find_item("E1"));
  CHECK(index.find("E2") == &value.items[1]);
}
