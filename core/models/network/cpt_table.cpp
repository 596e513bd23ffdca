#include "core/models/network/cpt_table.hpp"

namespace counterpoise::models::network {

std::vector<CptTable> cpt_tables(const Network& network) {
  std::vector<CptTable> tables;
  for (std::size_t n = 0; n < network.nodes.size(); ++n) {
    const Node& node = network.nodes[n];
    CptTable table{node.name, {}, node.states, node.cpt_given, true, {}};
    for (auto p : node.parents) table.parents.push_back(network.nodes[p].name);
    for (std::size_t r = 0; r < node.cpt.size(); ++r) {
      CptTableRow row;
      const auto states = network.parent_states_of_row(n, r);
      for (std::size_t i = 0; i < node.parents.size(); ++i)
        row.parent_states.push_back(network.nodes[node.parents[i]].states[states[i]]);
      row.entries = describe_entries(node.cpt[r]);
      row.means = mean_row(node.cpt[r]);
      row.form = form_name(node.cpt[r]);
      table.rows.push_back(std::move(row));
    }
    tables.push_back(std::move(table));
  }
  return tables;
}

}  // namespace counterpoise::models::network
