// The history names the fields of a case in words. The conditional notation P(E|Hp) and the
// names Hp/Hd are the trade's own (common practice); the rest is the project's wording. The
// demo cases check that no JSON key of a real case reaches a person as a key.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

#include <nlohmann/json.hpp>

#include "core/casefile/field_names.hpp"

using namespace counterpoise::casefile;

TEST_CASE("an item's field is named in words with the item's id") {
  CHECK(change_place_words("item", "E4", "p_given_hp") == "P(E|Hp) of E4");
  CHECK(change_place_words("item", "E2", "p_given_hd") == "P(E|Hd) of E2");
  CHECK(change_place_words("item", "E1", "source_data") == "source of the data of E1");
  CHECK(change_place_words("item", "E3", "") == "item E3");
}

TEST_CASE("a nested field keeps its path in brackets") {
  CHECK(field_words("profile.TH01") == "questioned profile (TH01)");
  CHECK(field_words("interval[0]") == "interval of the reported LR ([0])");
}

TEST_CASE("a section's field names the section") {
  CHECK(change_place_words("section", "propositions", "hp") == "Hp (propositions)");
  CHECK(change_place_words("section", "case", "reference") == "reference (case details)");
  CHECK(change_place_words("section", "mode", "") == "mode (casework or training)");
  CHECK(change_place_words("case", "", "import") == "the whole case");
}

TEST_CASE("an unknown key is shown, with spaces, rather than dropped") {
  CHECK(field_words("some_new_field") == "some new field");
  CHECK_FALSE(has_field_words("some_new_field"));
  CHECK(action_words("set") == "changed");
  CHECK(action_words("something-else") == "something-else");
}

TEST_CASE("every field of the demo cases has its words") {
  const std::filesystem::path demo_dir = COUNTERPOISE_DEMO_DIR;
  int checked = 0;
  for (const auto& entry : std::filesystem::directory_iterator(demo_dir)) {
    if (entry.path().extension() != ".json") continue;
    std::ifstream in(entry.path());
    const auto document = nlohmann::json::parse(in);
    for (const auto& item : document.at("items")) {
      for (auto it = item.begin(); it != item.end(); ++it) {
        if (it.key() == "id") continue;
        INFO(entry.path().filename().string() << ": item field " << it.key());
        CHECK(has_field_words(it.key()));
        ++checked;
      }
    }
    for (const char* section : {"case", "propositions", "priors"}) {
      if (!document.contains(section) || !document[section].is_object()) continue;
      for (auto it = document[section].begin(); it != document[section].end(); ++it) {
        INFO(entry.path().filename().string() << ": " << section << " field " << it.key());
        CHECK(has_field_words(it.key()));
        ++checked;
      }
    }
  }
  CHECK(checked > 50);
}
