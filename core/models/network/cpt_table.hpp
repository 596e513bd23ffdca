#pragma once
// The CPTs of a network in tabular form for the report's appendix and the editor: one table per
// node, one row per combination of parent states (first parent slowest), the entries as stated
// and their means (the values the point LR uses). No formula; layout only.

#include <string>
#include <vector>

#include "core/models/network/network_definition.hpp"

namespace counterpoise::models::network {

struct CptTableRow {
  std::vector<std::string> parent_states;  // one per parent, in the node's parent order
  std::vector<std::string> entries;        // as stated: "0.8", "Beta(2, 8)", "complement", ...
  std::vector<double> means;               // the mean of each entry
  std::string form;                        // "point", "complement" or "dirichlet"
};

struct CptTable {
  std::string node;
  std::vector<std::string> parents;
  std::vector<std::string> states;  // column headings
  bool stated = true;               // false: a root proposition node given without a table (uniform)
  bool affects_lr = true;           // false: a barren node, whose table cannot change the LR
  std::vector<CptTableRow> rows;
};

// One table per node, in node order. `affects_lr` is filled by the caller that knows the plan
// (NetworkModel::cpt_tables); here it is true for every node. Never throws.
std::vector<CptTable> cpt_tables(const Network& network);

}  // namespace counterpoise::models::network
