#include "core/models/network/network_definition.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

#include "core/models/network/factor_limit.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::models::network {

using nlohmann::json;
using validation::InconsistentSizes;
using validation::InvalidValue;
using validation::Location;

namespace {

Location at_field(const Location& where, const std::string& field) { return Location{where.item, field}; }

std::vector<std::string> read_names(const json& value, const Location& at, const std::string& what) {
  const auto names = reading::read_string_array(value, at);
  std::set<std::string> seen;
  for (std::size_t i = 0; i < names.size(); ++i) {
    const Location entry = at_field(at, at.field + "[" + std::to_string(i) + "]");
    if (names[i].empty()) throw InvalidValue(entry, what + " must not be empty");
    if (!seen.insert(names[i]).second) throw InvalidValue(entry, "duplicate " + what + " \"" + names[i] + "\"");
  }
  return names;
}

std::size_t state_index(const Node& node, const std::string& state, const Location& at) {
  const auto it = std::find(node.states.begin(), node.states.end(), state);
  if (it == node.states.end()) {
    std::string list;
    for (const auto& s : node.states) list += (list.empty() ? "" : ", ") + s;
    throw InvalidValue(at, "node " + node.name + " has no state \"" + state + "\" (states: " + list + ")");
  }
  return static_cast<std::size_t>(it - node.states.begin());
}

// Throws naming a cycle when the parent relation is not acyclic.
void check_acyclic(const Network& network, const Location& where) {
  enum class Mark { none, active, done };
  std::vector<Mark> mark(network.nodes.size(), Mark::none);
  std::vector<std::size_t> path;
  // Iterative depth-first search over parent links; a parent still active closes a cycle.
  for (std::size_t start = 0; start < network.nodes.size(); ++start) {
    if (mark[start] != Mark::none) continue;
    std::vector<std::pair<std::size_t, std::size_t>> stack{{start, 0}};
    mark[start] = Mark::active;
    path = {start};
    while (!stack.empty()) {
      auto& [node, next] = stack.back();
      const auto& parents = network.nodes[node].parents;
      if (next == parents.size()) {
        mark[node] = Mark::done;
        stack.pop_back();
        path.pop_back();
        continue;
      }
      const std::size_t parent = parents[next++];
      if (mark[parent] == Mark::active) {
        // path runs child -> parent; the cycle in the direction of the arrows is its reverse.
        const auto from = std::find(path.begin(), path.end(), parent);
        std::vector<std::size_t> cycle(from, path.end());
        std::reverse(cycle.begin(), cycle.end());
        std::string text;
        for (auto n : cycle) text += network.nodes[n].name + " -> ";
        text += network.nodes[cycle.front()].name;
        throw InvalidValue(at_field(where, "nodes"), "the parents form a cycle: " + text);
      }
      if (mark[parent] == Mark::none) {
        mark[parent] = Mark::active;
        path.push_back(parent);
        stack.emplace_back(parent, 0);
      }
    }
  }
}

// Throws when node `index`'s CPT (rows × states) has more entries than one table may: the row
// count of a node with many parents can exceed any integer (64 binary parents wrap to 0 rows).
void check_cpt_size(const Network& network, const Dag& dag, std::size_t index, const Location& at) {
  const std::size_t limit = factor_limit_entries();
  std::size_t entries = dag[index].state_count;
  bool over = entries > limit;
  for (auto p : dag[index].parents) {
    if (over || entries > limit / dag[p].state_count) {
      over = true;
      break;
    }
    entries *= dag[p].state_count;
  }
  if (!over) return;
  FactorScope scope{dag[index].parents, log10_cpt_entries(dag, index)};
  scope.vars.push_back(index);
  std::sort(scope.vars.begin(), scope.vars.end());
  throw InvalidValue(at, factor_refusal_text(network, "node " + network.nodes[index].name +
                                                          "'s CPT would be a table (one row per combination of its "
                                                          "parents' states)",
                                             scope, limit));
}

void read_cpt(Network& network, const Dag& dag, std::size_t index, const json& node_json, const Location& where) {
  Node& node = network.nodes[index];
  const std::string field = "nodes." + node.name + ".cpt";
  const json* cpt = reading::find_member(node_json, "cpt");
  if (!cpt) {
    if (node.parents.empty() && network.proposition.node == index) {
      node.cpt_given = false;
      node.cpt.push_back(PointRow{std::vector<double>(node.states.size(), 1.0 / static_cast<double>(node.states.size()))});
      return;
    }
    throw InvalidValue(at_field(where, field), "missing field (every node except a root proposition node needs a CPT)");
  }
  if (!cpt->is_array())
    throw InvalidValue(at_field(where, field), "a CPT is an array of rows, found " + reading::json_type_name(*cpt));
  check_cpt_size(network, dag, index, at_field(where, field));
  const std::size_t rows = row_count(dag, index);
  if (cpt->size() != rows) {
    std::string shape;
    for (auto p : node.parents)
      shape += (shape.empty() ? "" : " × ") + std::to_string(network.nodes[p].states.size());
    throw InconsistentSizes(at_field(where, field),
                            "node " + node.name + " has " + std::to_string(cpt->size()) + " CPT rows; its parents' states give " +
                                std::to_string(rows) + (shape.empty() ? " (no parents)" : " (" + shape + ")"));
  }
  for (std::size_t r = 0; r < rows; ++r) {
    const Location at = at_field(where, field + "[" + std::to_string(r) + "]");
    // Rows are counted from 1 for the reader (the file's index is r).
    const std::string label = "row " + std::to_string(r + 1) + " (" + network.row_label(index, r) + ")";
    node.cpt.push_back(read_cpt_row((*cpt)[r], node.states.size(), at, label));
  }
}

std::vector<std::size_t> read_proposition_states(const Node& node, const json& value, const Location& at) {
  std::vector<std::string> names;
  if (value.is_string())
    names.push_back(value.get<std::string>());
  else if (value.is_array())
    names = reading::read_string_array(value, at);
  else
    throw InvalidValue(at, "a state name or an array of state names is required, found " + reading::json_type_name(value));
  if (names.empty()) throw InvalidValue(at, "at least one state is required");
  std::vector<std::size_t> states;
  for (const auto& name : names) {
    const auto s = state_index(node, name, at);
    if (std::find(states.begin(), states.end(), s) != states.end())
      throw InvalidValue(at, "state \"" + name + "\" is listed twice");
    states.push_back(s);
  }
  return states;
}

}  // namespace

std::optional<std::size_t> Network::find_node(std::string_view name) const {
  for (std::size_t i = 0; i < nodes.size(); ++i)
    if (nodes[i].name == name) return i;
  return std::nullopt;
}

Dag Network::dag() const {
  Dag dag;
  for (const auto& n : nodes) dag.push_back({n.states.size(), n.parents});
  return dag;
}

std::vector<std::size_t> Network::parent_states_of_row(std::size_t node, std::size_t row) const {
  const auto& parents = nodes[node].parents;
  std::vector<std::size_t> states(parents.size(), 0);
  for (std::size_t i = parents.size(); i-- > 0;) {
    const std::size_t card = nodes[parents[i]].states.size();
    states[i] = row % card;
    row /= card;
  }
  return states;
}

std::string Network::row_label(std::size_t node, std::size_t row) const {
  const auto& parents = nodes[node].parents;
  if (parents.empty()) return "no parents";
  const auto states = parent_states_of_row(node, row);
  std::string text;
  for (std::size_t i = 0; i < parents.size(); ++i)
    text += (i ? ", " : "") + nodes[parents[i]].name + "=" + nodes[parents[i]].states[states[i]];
  return text;
}

Log10Cpts Network::mean_log10_cpts() const {
  Log10Cpts cpts;
  for (const auto& n : nodes) {
    std::vector<double> values;
    for (const auto& row : n.cpt) {
      const auto log10_row = mean_log10_row(row);
      values.insert(values.end(), log10_row.begin(), log10_row.end());
    }
    cpts.push_back(std::move(values));
  }
  return cpts;
}

Network read_network(const json& item, const std::string& item_id, const Location& where) {
  Network network;
  const json& nodes_json = reading::require_member(item, "nodes", where);
  if (!nodes_json.is_array() || nodes_json.empty())
    throw InvalidValue(where.with_field("nodes"), "a non-empty array of nodes is required");
  // Pass 1: names and states, so parents may be listed in any order. Names are looked up in an
  // index while reading (Network::find_node scans, which would make reading quadratic in nodes).
  std::map<std::string, std::size_t, std::less<>> index_of;
  for (std::size_t i = 0; i < nodes_json.size(); ++i) {
    const Location at = at_field(where, "nodes[" + std::to_string(i) + "]");
    const json& nj = nodes_json[i];
    reading::check_known_members(nj, {"name", "description", "states", "parents", "cpt"}, at);
    Node node;
    node.name = reading::read_string(reading::require_member(nj, "name", at), at.with_field("name"));
    if (node.name.empty()) throw InvalidValue(at.with_field("name"), "a node name must not be empty");
    if (!index_of.emplace(node.name, i).second)
      throw InvalidValue(at.with_field("name"), "duplicate node name \"" + node.name + "\"");
    const Location named = at_field(where, "nodes." + node.name);
    node.description = reading::read_string_or(nj, "description", named);
    node.states = read_names(reading::require_member(nj, "states", named), named.with_field("states"), "state name");
    if (node.states.size() < 2)
      throw InvalidValue(named.with_field("states"), "a node needs at least 2 states, found " +
                                                        std::to_string(node.states.size()));
    network.nodes.push_back(std::move(node));
  }
  // Pass 2: parents.
  for (std::size_t i = 0; i < nodes_json.size(); ++i) {
    Node& node = network.nodes[i];
    const Location at = at_field(where, "nodes." + node.name + ".parents");
    const json* parents = reading::find_member(nodes_json[i], "parents");
    node.parents_given = parents != nullptr;
    if (!parents) continue;
    for (const auto& name : read_names(*parents, at, "parent")) {
      const auto p = index_of.find(name);
      if (p == index_of.end()) throw InvalidValue(at, "no node called \"" + name + "\"");
      if (p->second == i) throw InvalidValue(at, "node " + node.name + " cannot be its own parent");
      node.parents.push_back(p->second);
    }
  }
  check_acyclic(network, where);
  // The proposition, before the CPTs: a root proposition node may omit its table.
  const Location prop_at = where.with_field("proposition");
  const json& prop = reading::require_member(item, "proposition", where);
  reading::check_known_members(prop, {"node", "hp", "hd"}, prop_at);
  const std::string prop_name =
      reading::read_string(reading::require_member(prop, "node", prop_at), prop_at.with_field("node"));
  const auto prop_node = network.find_node(prop_name);
  if (!prop_node) throw InvalidValue(prop_at.with_field("node"), "no node called \"" + prop_name + "\"");
  network.proposition.node = *prop_node;
  const Node& pn = network.nodes[*prop_node];
  network.proposition.hp_states =
      read_proposition_states(pn, reading::require_member(prop, "hp", prop_at), prop_at.with_field("hp"));
  network.proposition.hd_states =
      read_proposition_states(pn, reading::require_member(prop, "hd", prop_at), prop_at.with_field("hd"));
  for (auto s : network.proposition.hp_states)
    if (std::count(network.proposition.hd_states.begin(), network.proposition.hd_states.end(), s))
      throw InvalidValue(prop_at.with_field("hd"), "state \"" + pn.states[s] +
                                                       "\" is in both hp and hd; the propositions must exclude each other");
  const Dag dag = network.dag();  // once: the states and parents are all read
  for (std::size_t i = 0; i < nodes_json.size(); ++i) read_cpt(network, dag, i, nodes_json[i], where);
  // Findings.
  const Location obs_at = where.with_field("observed");
  const json& observed = reading::require_member(item, "observed", where);
  reading::require_object(observed, obs_at);
  if (observed.empty()) throw InvalidValue(obs_at, "at least one node must be observed (the findings)");
  for (auto it = observed.begin(); it != observed.end(); ++it) {
    const Location at = obs_at.with_field(it.key());
    const auto found = index_of.find(it.key());
    if (found == index_of.end()) throw InvalidValue(at, "no node called \"" + it.key() + "\"");
    const std::optional<std::size_t> n = found->second;
    if (*n == network.proposition.node)
      throw InvalidValue(at, "the proposition node " + it.key() + " cannot be observed; the findings are evaluated "
                                                                  "given the propositions");
    network.findings.push_back({*n, state_index(network.nodes[*n], reading::read_string(it.value(), at), at)});
  }
  std::sort(network.findings.begin(), network.findings.end(),
            [](const Finding& a, const Finding& b) { return a.node < b.node; });
  if (const json* covers = reading::find_member(item, "covers")) {
    const Location at = where.with_field("covers");
    network.covers = read_names(*covers, at, "item id");
    if (std::find(network.covers.begin(), network.covers.end(), item_id) != network.covers.end())
      throw InvalidValue(at, "a network item cannot cover its own id " + item_id);
  }
  return network;
}

json network_to_json(const Network& network) {
  json nodes = json::array();
  for (const auto& n : network.nodes) {
    json node = {{"name", n.name}, {"states", n.states}};
    if (!n.description.empty()) node["description"] = n.description;
    json parents = json::array();
    for (auto p : n.parents) parents.push_back(network.nodes[p].name);
    if (n.parents_given || !n.parents.empty()) node["parents"] = parents;
    if (n.cpt_given) {
      json cpt = json::array();
      for (const auto& row : n.cpt) cpt.push_back(row_to_json(row));
      node["cpt"] = cpt;
    }
    nodes.push_back(std::move(node));
  }
  const Node& pn = network.nodes[network.proposition.node];
  auto states_json = [&pn](const std::vector<std::size_t>& states) {
    if (states.size() == 1) return json(pn.states[states.front()]);
    json list = json::array();
    for (auto s : states) list.push_back(pn.states[s]);
    return list;
  };
  json observed = json::object();
  for (const auto& f : network.findings) observed[network.nodes[f.node].name] = network.nodes[f.node].states[f.state];
  json out = {{"nodes", nodes},
              {"proposition",
               {{"node", pn.name}, {"hp", states_json(network.proposition.hp_states)},
                {"hd", states_json(network.proposition.hd_states)}}},
              {"observed", observed}};
  if (!network.covers.empty()) out["covers"] = network.covers;
  return out;
}

}  // namespace counterpoise::models::network
