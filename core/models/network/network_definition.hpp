#pragma once
// A discrete Bayesian network as the case file states it: nodes with named states, parents and
// conditional probability tables (CPTs), the node (and states) that carry the propositions, and
// the observed findings. The joint distribution factorises as prod_i P(X_i | parents(X_i))
// (Pearl 1988, Probabilistic Reasoning in Intelligent Systems, section 3.3; Koller & Friedman
// 2009, Probabilistic Graphical Models, definition 3.8 — from memory for the numbers).
// A CPT has one row per combination of parent states, the first parent's state varying slowest.

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/network/cpt_row.hpp"
#include "core/models/network/variable_elimination.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::models::network {

struct Node {
  std::string name;
  std::string description;  // optional free text, kept for the report and round trips
  std::vector<std::string> states;
  std::vector<std::size_t> parents;  // indices into Network::nodes, in the order given
  std::vector<CptRow> cpt;           // row_count rows
  bool cpt_given = true;             // false: a root proposition node given without a table (uniform)
  bool parents_given = true;         // false: "parents" was left out (a root), so it is not written back
};

// The propositions as states of one node: Hp is "node in hp_states", Hd is "node in hd_states".
struct PropositionStates {
  std::size_t node = 0;
  std::vector<std::size_t> hp_states;
  std::vector<std::size_t> hd_states;
};

struct Network {
  std::vector<Node> nodes;
  PropositionStates proposition;
  std::vector<Finding> findings;    // observed nodes, in node order
  std::vector<std::string> covers;  // ids of other items whose findings this network evaluates

  // Index of the node called `name`, or nullopt.
  std::optional<std::size_t> find_node(std::string_view name) const;
  // The structure (state counts and parents) for inference and layout.
  Dag dag() const;
  // The state index of each parent for CPT row `row` of `node` (first parent slowest).
  std::vector<std::size_t> parent_states_of_row(std::size_t node, std::size_t row) const;
  // "H=hd, C=yes" for row `row` of `node`; "(no parents)" for a root.
  std::string row_label(std::size_t node, std::size_t row) const;
  // The mean CPTs as log10 values (the point evaluation).
  Log10Cpts mean_log10_cpts() const;
};

// Reads the network fields ("nodes", "proposition", "observed", "covers") of `item`. `item_id`
// is the item's own id (a network may not cover itself). Throws validation::InvalidValue naming
// item and field for: missing or mistyped fields; an empty or duplicate node name; fewer than 2
// states, an empty or duplicate state; an unknown, repeated or self parent; a cycle (named,
// "A -> B -> A"); a missing CPT (except on a root proposition node); a bad CPT row (cpt_row.hpp);
// an unknown proposition node or state, a state in both hp and hd, an observed proposition node;
// an unknown observed node or state, no findings observed; a repeated or own id in covers.
// Throws validation::InconsistentSizes when a CPT's row count is not the product of the
// parents' state counts or a row's length is not the node's state count (naming node and row).
Network read_network(const nlohmann::json& item, const std::string& item_id, const validation::Location& where);

// The fields that read_network reads back to the same network.
nlohmann::json network_to_json(const Network& network);

}  // namespace counterpoise::models::network
