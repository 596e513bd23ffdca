#include "core/store/case_state.hpp"

#include <catch2/catch.hpp>

#include "core/store/canonical_json.hpp"
#include "core/validation/input_error.hpp"
#include "tests/core/store/store_test_support.hpp"

using counterpoise::store::canonical_text;
using counterpoise::store::CaseState;
using counterpoise::store::EntityRef;
using counterpoise::validation::InvalidValue;
using nlohmann::json;

TEST_CASE("a case splits into sections and items and back without loss", "[store][state]") {
  const json document = store_test::sample_case();
  const CaseState state = CaseState::from_document(document);
  CHECK(state.sections().size() == 5);  // format, version, case, propositions, priors
  REQUIRE(state.items().size() == 3);
  CHECK(state.items()[1].first == "E2");
  CHECK(canonical_text(state.to_document()) == canonical_text(document));
}

TEST_CASE("documents the store cannot key are refused", "[store][state]") {
  CHECK_THROWS_AS(CaseState::from_document(json::array()), InvalidValue);
  CHECK_THROWS_AS(CaseState::from_document(json::parse(R"({"case": {}})")),
                  InvalidValue);  // no items
  CHECK_THROWS_AS(CaseState::from_document(json::parse(R"({"items": {"id": "E1"}})")),
                  InvalidValue);  // not array
  CHECK_THROWS_AS(CaseState::from_document(json::parse(R"({"items": [3]})")),
                  InvalidValue);  // not object
  CHECK_THROWS_AS(CaseState::from_document(json::parse(R"({"items": [{"id": 7}]})")),
                  InvalidValue);  // id type
  CHECK_THROWS_AS(CaseState::from_document(json::parse(R"({"items": [{"id": ""}]})")),
                  InvalidValue);
  CHECK_THROWS_WITH(
      CaseState::from_document(json::parse(R"({"items": [{"id": "E1"}, {"id": "E1"}]})")),
      Catch::Matchers::Contains("two items have the id"));
  CHECK_NOTHROW(CaseState::from_document(json::parse(R"({"items": []})")));
}

TEST_CASE("edits change one entity and check their target", "[store][state]") {
  CaseState state = CaseState::from_document(store_test::sample_case());
  state.set_value(EntityRef::item("E1"), "p_given_hp", json(0.9));
  CHECK(state.value_at(EntityRef::item("E1"), "p_given_hp") == json(0.9));
  state.set_value(EntityRef::item("E1"), "title", std::nullopt);
  CHECK_FALSE(state.value_at(EntityRef::item("E1"), "title").has_value());
  state.set_value(EntityRef::section("notes"), "", json("new section"));
  CHECK(state.sections().count("notes") == 1);
  state.set_value(EntityRef::section("propositions"), "level", json("activity"));
  CHECK(state.value_at(EntityRef::section("propositions"), "level") == json("activity"));

  CHECK_THROWS_AS(state.set_value(EntityRef::item("E9"), "title", json("x")), InvalidValue);
  CHECK_THROWS_AS(state.set_value(EntityRef::item("E1"), "id", json("E7")), InvalidValue);
  CHECK_THROWS_AS(state.set_value(EntityRef::item("E1"), "", json{{"id", "E7"}}), InvalidValue);
  CHECK_THROWS_AS(state.set_value(EntityRef::section("items"), "", json::array()), InvalidValue);
  CHECK_THROWS_AS(state.set_value(EntityRef::section("version"), "major", json(1)),
                  InvalidValue);  // not an object

  state.add_item(json{{"id", "E4"}, {"model", "assigned"}}, 0);
  CHECK(state.items()[0].first == "E4");
  CHECK_THROWS_AS(state.add_item(json{{"id", "E4"}}, 0), InvalidValue);
  CHECK_THROWS_AS(state.add_item(json{{"id", "E5"}}, 9), InvalidValue);
  state.move_item("E4", 3);
  CHECK(state.items()[3].first == "E4");
  CHECK(*state.item_position("E1") == 0);
  CHECK_THROWS_AS(state.move_item("E4", 4), InvalidValue);
  CHECK(state.remove_item("E2")["lr"] == json(2.0e4));
  CHECK_THROWS_AS(state.remove_item("E2"), InvalidValue);
  CHECK(state.items().size() == 3);
}
