#pragma once
// Exact inference by variable elimination: the sum-product algorithm of Koller & Friedman
// (2009), Probabilistic Graphical Models, Algorithm 9.1 (Sum-Product-VE), with the evidence
// reduced into the factors first (their section 9.3.2) and the elimination order chosen greedily
// by the min-fill cost, ties broken by min-weight then by node index (their Algorithm 9.4,
// Greedy-Ordering, and section 9.4.3.2 — from memory for the algorithm and section numbers).
// Before elimination, barren nodes — variables that are neither findings nor the kept variable
// nor ancestors of them — are removed: their CPTs sum to 1 and cannot change the result
// (Shachter 1986, Evaluating influence diagrams, Operations Research 34:871 — from memory).
// All factor values are log10 (factor.hpp), so results down to 1e-300 and below are exact.
// The plan bounds the size of every factor before anything is allocated: the product formed when
// a variable is summed out ranges over that variable and its neighbours in the interaction graph
// at that step (Koller & Friedman 2009, Theorem 9.6, the induced graph's cliques are the scopes
// of the intermediate factors — from memory for the theorem number), so the ordering knows each
// size as it chooses, and a step whose product would exceed the limit is never chosen.

#include <cstddef>
#include <limits>
#include <optional>
#include <span>
#include <vector>

#include "core/models/network/factor.hpp"

namespace counterpoise::models::network {

// The structure of a network: for each node its state count and its parents (node indices).
struct DagNode {
  std::size_t state_count = 2;
  std::vector<std::size_t> parents;
};
using Dag = std::vector<DagNode>;

// log10 CPT values per node: rows (parent configurations, first parent slowest) × states.
using Log10Cpts = std::vector<std::vector<double>>;

// An observed node and its observed state.
struct Finding {
  std::size_t node = 0;
  std::size_t state = 0;
};

// The variables of one factor and its number of entries, as log10 (it may be far beyond any
// integer type: a factor over 200 binary variables has 2^200 entries).
struct FactorScope {
  std::vector<std::size_t> vars;  // ascending
  double log10_entries = 0.0;
};

// What to compute, fixed by the structure alone so it can be reused for many sets of CPTs.
struct EliminationPlan {
  std::vector<std::size_t> factor_nodes;  // nodes whose CPT enters (not barren), ascending
  std::vector<std::size_t> barren_nodes;  // nodes left out, ascending
  std::vector<std::size_t> order;         // the variables summed out, in order
  std::vector<Finding> findings;
  std::optional<std::size_t> kept;        // variable not summed out (the proposition node)
  // Set when every variable left to sum out would form a product of more entries than the
  // limit: the smallest such product. The order is then incomplete and the plan must not run.
  std::optional<FactorScope> refused;
};

// The plan for sum over all but `kept` of prod CPTs with `findings` fixed. Nodes and findings
// must be valid indices for `dag` (the network reader checks them); the result is deterministic.
// Each step sums out the variable of least fill-in among those whose product has at most
// `max_factor_entries` entries; when there is none, the plan is `refused` (nothing is allocated).
// The CPTs themselves are not bounded here (the reader bounds them: cpt_entries).
EliminationPlan plan_elimination(const Dag& dag, std::span<const Finding> findings, std::optional<std::size_t> kept,
                                 std::size_t max_factor_entries = std::numeric_limits<std::size_t>::max());

struct EliminationResult {
  // log10 P(findings, kept = k) for each state k of the kept variable (one entry if none kept).
  std::vector<double> log10_values;
  std::size_t largest_factor_size = 0;  // entries of the largest factor formed
};

// Runs `plan` on `cpts` (one vector per node of `dag`, of rows × states entries). Throws
// std::logic_error for a refused plan (a caller checks `refused` first).
EliminationResult run_elimination(const EliminationPlan& plan, const Dag& dag, const Log10Cpts& cpts);

// Number of rows of node `node`'s CPT: the product of its parents' state counts. Only for a
// node whose CPT was read (cpt_entries within a limit), so it cannot overflow.
std::size_t row_count(const Dag& dag, std::size_t node);

// The entries of node `node`'s CPT (rows × states) as log10, which cannot overflow.
double log10_cpt_entries(const Dag& dag, std::size_t node);

}  // namespace counterpoise::models::network
