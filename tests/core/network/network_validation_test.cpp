// Every documented error of the network reader (network_definition.hpp, cpt_row.hpp,
// network_model.hpp) has a throw test naming the node, row or field.
#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"
#include "network_test_support.hpp"

using nlohmann::json;
using counterpoise::validation::InconsistentSizes;
using counterpoise::validation::InvalidValue;
using network_test::read_model;

namespace {

json base() {
  return json::parse(R"({"id": "N1", "model": "network",
    "nodes": [{"name": "H", "states": ["hp", "hd"], "parents": [], "cpt": [[0.5, 0.5]]},
              {"name": "F", "states": ["present", "absent"], "parents": ["H"], "cpt": [[0.8, 0.2], [0.05, 0.95]]}],
    "proposition": {"node": "H", "hp": "hp", "hd": "hd"},
    "observed": {"F": "present"}})");
}

template <class E>
void check_throws(const json& item, const std::string& fragment) {
  INFO(item.dump());
  CHECK_THROWS_AS(read_model(item), E);
  CHECK_THROWS_WITH(read_model(item), Catch::Contains(fragment));
}

}  // namespace

TEST_CASE("the base network reads") { CHECK_NOTHROW(read_model(base())); }

TEST_CASE("structure errors") {
  SECTION("a cycle is named") {
    auto item = base();
    item["nodes"].push_back({{"name", "A"}, {"states", {"y", "n"}}, {"parents", {"B"}}, {"cpt", {{0.5, 0.5}, {0.5, 0.5}}}});
    item["nodes"].push_back({{"name", "B"}, {"states", {"y", "n"}}, {"parents", {"A"}}, {"cpt", {{0.5, 0.5}, {0.5, 0.5}}}});
    check_throws<InvalidValue>(item, "the parents form a cycle: B -> A -> B");
  }
  SECTION("unknown parent") {
    auto item = base();
    item["nodes"][1]["parents"] = {"Q"};
    check_throws<InvalidValue>(item, "no node called \"Q\"");
  }
  SECTION("own parent") {
    auto item = base();
    item["nodes"][1]["parents"] = {"F"};
    check_throws<InvalidValue>(item, "its own parent");
  }
  SECTION("repeated parent") {
    auto item = base();
    item["nodes"][1]["parents"] = {"H", "H"};
    check_throws<InvalidValue>(item, "duplicate parent");
  }
  SECTION("duplicate node name") {
    auto item = base();
    item["nodes"][1]["name"] = "H";
    check_throws<InvalidValue>(item, "duplicate node name \"H\"");
  }
  SECTION("empty node name") {
    auto item = base();
    item["nodes"][1]["name"] = "";
    check_throws<InvalidValue>(item, "must not be empty");
  }
  SECTION("duplicate state") {
    auto item = base();
    item["nodes"][1]["states"] = {"present", "present"};
    check_throws<InvalidValue>(item, "duplicate state name \"present\"");
  }
  SECTION("one state only") {
    auto item = base();
    item["nodes"][1]["states"] = {"present"};
    check_throws<InvalidValue>(item, "at least 2 states");
  }
  SECTION("no nodes") {
    auto item = base();
    item["nodes"] = json::array();
    check_throws<InvalidValue>(item, "non-empty array of nodes");
  }
  SECTION("unknown field in the item") {
    auto item = base();
    item["node"] = 1;
    check_throws<InvalidValue>(item, "unknown field");
  }
  SECTION("unknown field in a node") {
    auto item = base();
    item["nodes"][1]["cpts"] = 1;
    check_throws<InvalidValue>(item, "cpts");
  }
}

TEST_CASE("CPT shape errors name node and row") {
  SECTION("wrong number of rows") {
    auto item = base();
    item["nodes"][1]["cpt"] = {{0.8, 0.2}};
    check_throws<InconsistentSizes>(item, "node F has 1 CPT rows; its parents' states give 2");
  }
  SECTION("wrong row length") {
    auto item = base();
    item["nodes"][1]["cpt"][1] = {0.05, 0.9, 0.05};
    check_throws<InconsistentSizes>(item, "row 2 (H=hd) has 3 entries; the node has 2 states");
  }
  SECTION("missing CPT on a non-proposition node") {
    auto item = base();
    item["nodes"][1].erase("cpt");
    check_throws<InvalidValue>(item, "nodes.F.cpt");
  }
}

TEST_CASE("CPT row errors") {
  SECTION("a point row must sum to 1 within 1e-9") {
    auto item = base();
    item["nodes"][1]["cpt"][1] = {0.05, 0.96};
    check_throws<InvalidValue>(item, "row 2 (H=hd) sums to 1.01, not 1");
    item["nodes"][1]["cpt"][1] = {0.05, 0.95 + 5e-10};  // inside the tolerance
    CHECK_NOTHROW(read_model(item));
  }
  SECTION("entry outside [0, 1]") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = {1.2, -0.2};
    check_throws<InvalidValue>(item, "outside [0, 1]");
  }
  SECTION("uncertain entries need a complement") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = {{{"beta", {8, 2}}}, 0.0};
    check_throws<InvalidValue>(item, "no \"complement\" entry");
  }
  SECTION("two complements") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = {"complement", "complement"};
    check_throws<InvalidValue>(item, "more than one \"complement\"");
  }
  SECTION("other text") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = {"rest", 0.2};
    check_throws<InvalidValue>(item, "only text allowed");
  }
  SECTION("two uncertain entries") {
    auto item = base();
    item["nodes"][1]["states"] = {"a", "b", "c"};
    item["nodes"][1]["cpt"] = {{{{"beta", {8, 2}}}, {{"interval", {0.01, 0.1}}}, "complement"}, {0.1, 0.1, 0.8}};
    check_throws<InvalidValue>(item, "more than one uncertain entry");
  }
  SECTION("entries that can sum above 1") {
    auto item = base();
    item["nodes"][1]["states"] = {"a", "b", "c"};
    item["nodes"][1]["cpt"] = {{{{"beta", {8, 2}}}, 0.2, "complement"}, {0.1, 0.1, 0.8}};
    check_throws<InvalidValue>(item, "can sum to 1.2, above 1");
  }
  SECTION("a bad assignment inside a row") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = {{{"beta", {0, 2}}}, "complement"};
    check_throws<InvalidValue>(item, "nodes.F.cpt[0][0]");
  }
  SECTION("Dirichlet parameters must be positive and one per state") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = {{"dirichlet", {3, 0}}};
    check_throws<InvalidValue>(item, "greater than 0");
    item["nodes"][1]["cpt"][0] = {{"dirichlet", {3, 1, 1}}};
    check_throws<InconsistentSizes>(item, "has 3 entries");
  }
  SECTION("row counts must be whole and non-negative, prior positive") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = {{"counts", {3, -1}}};
    check_throws<InvalidValue>(item, "nodes.F.cpt[0].counts[1]");
    item["nodes"][1]["cpt"][0] = {{"counts", {3, 1}}, {"prior", 0}};
    check_throws<InvalidValue>(item, "prior");
  }
  SECTION("a row that is neither array nor object") {
    auto item = base();
    item["nodes"][1]["cpt"][0] = 0.8;
    check_throws<InvalidValue>(item, "must be an array of entries");
  }
}

TEST_CASE("proposition errors") {
  SECTION("unknown node") {
    auto item = base();
    item["proposition"]["node"] = "X";
    check_throws<InvalidValue>(item, "no node called \"X\"");
  }
  SECTION("unknown state") {
    auto item = base();
    item["proposition"]["hp"] = "guilty";
    check_throws<InvalidValue>(item, "node H has no state \"guilty\"");
  }
  SECTION("a state in both") {
    auto item = base();
    item["proposition"]["hd"] = {"hd", "hp"};
    check_throws<InvalidValue>(item, "in both hp and hd");
  }
  SECTION("the proposition node is observed") {
    auto item = base();
    item["observed"]["H"] = "hp";
    check_throws<InvalidValue>(item, "cannot be observed");
  }
  SECTION("a proposition with probability zero") {
    auto item = base();
    item["nodes"][0]["cpt"] = {{1.0, 0.0}};
    item["nodes"][1]["parents"] = json::array();
    item["nodes"][1]["cpt"] = {{0.8, 0.2}};
    // H now has no children; give H a parent so its table matters.
    item["nodes"].push_back({{"name", "P"}, {"states", {"a", "b"}}, {"cpt", {{0.5, 0.5}}}});
    item["nodes"][0]["parents"] = {"P"};
    item["nodes"][0]["cpt"] = {{1.0, 0.0}, {1.0, 0.0}};
    check_throws<InvalidValue>(item, "Hd (H = hd) probability zero");
  }
}

TEST_CASE("findings errors") {
  SECTION("unknown observed node") {
    auto item = base();
    item["observed"]["G"] = "present";
    check_throws<InvalidValue>(item, "no node called \"G\"");
  }
  SECTION("unknown observed state") {
    auto item = base();
    item["observed"]["F"] = "maybe";
    check_throws<InvalidValue>(item, "node F has no state \"maybe\"");
  }
  SECTION("nothing observed") {
    auto item = base();
    item["observed"] = json::object();
    check_throws<InvalidValue>(item, "at least one node must be observed");
  }
  SECTION("findings impossible under both propositions") {
    auto item = base();
    item["nodes"][1]["cpt"] = {{0.0, 1.0}, {0.0, 1.0}};
    check_throws<InvalidValue>(item, "probability zero under both propositions");
  }
}

TEST_CASE("covers") {
  auto item = base();
  item["covers"] = {"E3", "E4"};
  const auto model = read_model(item);
  CHECK(model->covers() == std::vector<std::string>{"E3", "E4"});
  CHECK(model->evaluate().detail.at("covers") == json({"E3", "E4"}));
  item["covers"] = {"E3", "E3"};
  check_throws<InvalidValue>(item, "duplicate item id \"E3\"");
  item["covers"] = {"N1"};
  check_throws<InvalidValue>(item, "cannot cover its own id N1");
}

TEST_CASE("reading and writing round-trip") {
  auto item = base();
  item["nodes"][1]["states"] = {"a", "b", "c"};
  item["nodes"][1]["cpt"] = {{{{"beta", {8, 2}}}, 0.0, "complement"}, {{"counts", {3, 1, 0}}, {"prior", 0.5}}};
  item["nodes"][1]["description"] = "fibres on the jumper";
  item["observed"]["F"] = "a";
  item["covers"] = {"E3"};
  const auto first = read_model(item);
  json again = first->to_json();
  again["id"] = "N1";
  again["model"] = "network";
  const auto second = read_model(again);
  CHECK(second->to_json() == first->to_json());
  CHECK(second->evaluate().lr.log10() == first->evaluate().lr.log10());
}
