// The report's network content without painting: for an item evaluated by a network, the
// drawing (nodes, arrows, proposition and observed nodes), the one-way sensitivity table (largest
// effects first, capped) and the appendix with one probability table per node.
#include <fstream>

#include <nlohmann/json.hpp>

#include "core/models/network/network_model.hpp"
#include "reports/report_model.hpp"
#include "reports/report_text.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

namespace {

bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

// The demo's network item as written in the file, read without the program's own readers.
nlohmann::json demo_network_item() {
  std::ifstream in(demo_dir() / "harwick-vale-network.json");
  const auto file = nlohmann::json::parse(in);
  for (const auto& item : file.at("items"))
    if (item.at("model") == "network") return item;
  FAIL("the demo has no network item");
  return {};
}

template <class T>
std::vector<const T*> blocks_of(const Section& s) {
  std::vector<const T*> out;
  for (const auto& b : s.blocks)
    if (const auto* x = std::get_if<T>(&b)) out.push_back(x);
  return out;
}

}  // namespace

TEST_CASE("network: the demo's report has the drawing, the sensitivity table and one CPT table per node") {
  const auto value = load_case(demo_dir() / "harwick-vale-network.json");
  const auto raw = demo_network_item();
  const std::string id = raw.at("id");
  for (const auto mode : {ReportMode::casework, ReportMode::training}) {
    const auto model = build_report_model(value, evaluation::evaluate_case(value), mode);
    const auto* section = model.find("network-" + id);
    REQUIRE(section);
    CHECK(section->heading == "The network behind item " + id);
    CHECK_FALSE(section->appendix);

    // The drawing: every node of the file, every parent -> child arrow, the proposition node and
    // the observed states as the file states them.
    const auto diagrams = blocks_of<NetworkDiagram>(*section);
    REQUIRE(diagrams.size() == 1);
    const auto& d = *diagrams[0];
    REQUIRE(d.nodes.size() == raw.at("nodes").size());
    std::size_t arrows = 0;
    for (std::size_t i = 0; i < d.nodes.size(); ++i) {
      const auto& node = raw.at("nodes")[i];
      CHECK(d.nodes[i].name == node.at("name").get<std::string>());
      CHECK(d.nodes[i].proposition == (node.at("name") == raw.at("proposition").at("node")));
      const auto& observed = raw.at("observed");
      CHECK(d.nodes[i].observed_state ==
            (observed.contains(d.nodes[i].name) ? observed.at(d.nodes[i].name).get<std::string>() : std::string()));
      if (node.contains("parents")) arrows += node.at("parents").size();
    }
    CHECK(d.edges.size() == arrows);
    for (const auto& e : d.edges) CHECK(d.nodes[e.parent].layer < d.nodes[e.child].layer);  // arrows point down

    // The sensitivity table: one row per entry of every table that can affect the LR, up to 15.
    const auto network = std::dynamic_pointer_cast<const models::network::NetworkModel>(value.find_item(id)->model);
    REQUIRE(network);
    const std::size_t entries = network->sensitivity().size();
    std::size_t stated_entries = 0;  // entries of the tables stated in the file (all of them can affect this LR)
    for (const auto& node : raw.at("nodes"))
      if (node.contains("cpt")) stated_entries += node.at("cpt").size() * node.at("states").size();
    CHECK(entries == stated_entries);
    const auto tables = blocks_of<Table>(*section);
    REQUIRE(tables.size() == 1);
    CHECK(tables[0]->header.size() == 7);
    CHECK(tables[0]->rows.size() == std::min<std::size_t>(entries, 15));
    CHECK(contains(section_text(model, section->id), "How sensitive the network's likelihood ratio is to each table entry"));

    // The appendix: one table per node, a row per parent-state combination, a column per state.
    const auto* appendix = model.find("network-tables");
    REQUIRE(appendix);
    CHECK(appendix->appendix);
    CHECK(appendix->heading == "Appendix A: Probability tables of the networks");
    const auto cpts = blocks_of<Table>(*appendix);
    REQUIRE(cpts.size() == raw.at("nodes").size());
    for (std::size_t i = 0; i < cpts.size(); ++i) {
      const auto& node = raw.at("nodes")[i];
      CHECK(cpts[i]->header.size() == 1 + node.at("states").size());
      if (node.contains("cpt")) CHECK(cpts[i]->rows.size() == node.at("cpt").size());
    }
    // Beta(14, 6) has mean 14 / (14 + 6) = 0.7 (Johnson, Kotz & Balakrishnan 1995, Continuous
    // Univariate Distributions vol. 2, ch. 25, the mean of the beta distribution).
    const std::string appendix_text = section_text(model, "network-tables");
    CHECK(contains(appendix_text, "Beta(14, 6), mean 0.7"));
    // The text rendering carries the drawing's nodes and arrows.
    const std::string text = render_text(model);
    CHECK(contains(text, "[Network]"));
    CHECK(contains(text, "Contact -> Fibres"));
  }
}

TEST_CASE("network: the sensitivity table puts the largest effects first and says how many rows were left out") {
  // A node with 20 states under one parent of 2: 40 entries, more than the 15 rows shown.
  std::string states, row;
  for (int i = 0; i < 20; ++i) {
    states += std::string(i ? ", " : "") + "\"s" + std::to_string(i) + "\"";
    row += std::string(i ? ", " : "") + "0.05";
  }
  const std::string items = R"({"id": "N1", "model": "network",
    "nodes": [{"name": "H", "states": ["yes", "no"]},
              {"name": "E", "states": [)" + states + R"(], "parents": ["H"],
               "cpt": [[)" + row + R"(], [)" + row + R"(]]}],
    "proposition": {"node": "H", "hp": "yes", "hd": "no"},
    "observed": {"E": "s0"}})";
  const auto value = case_from_json(case_text(items));
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const auto* section = model.find("network-N1");
  REQUIRE(section);
  const auto tables = blocks_of<Table>(*section);
  REQUIRE(tables.size() == 1);
  CHECK(tables[0]->rows.size() == 15);
  CHECK(contains(section_text(model, "network-N1"), "25 of the 40 entries"));
  // The observed state's own entries move the LR most: they range over 0.05 ± 10 %, while moving
  // another state's entry changes P(s0) only by the factor (1 − x) / (1 − 0.05), about ± 0.5 %
  // (proportional co-variation, Laskey 1995, Sensitivity analysis for probability assessments in
  // Bayesian networks, IEEE Trans. SMC 25:901). So the first rows are those of state s0.
  CHECK(tables[0]->rows[0][2] == "s0");
  CHECK(tables[0]->rows[1][2] == "s0");
}
