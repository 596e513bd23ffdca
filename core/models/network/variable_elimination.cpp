#include "core/models/network/variable_elimination.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <set>
#include <stdexcept>

namespace counterpoise::models::network {

namespace {

// Nodes that are findings, the kept variable, or an ancestor of one of them.
std::vector<bool> relevant_nodes(const Dag& dag, std::span<const Finding> findings, std::optional<std::size_t> kept) {
  std::vector<bool> relevant(dag.size(), false);
  std::vector<std::size_t> stack;
  for (const auto& f : findings) stack.push_back(f.node);
  if (kept) stack.push_back(*kept);
  while (!stack.empty()) {
    const std::size_t n = stack.back();
    stack.pop_back();
    if (relevant[n]) continue;
    relevant[n] = true;
    for (auto p : dag[n].parents) stack.push_back(p);
  }
  return relevant;
}

// Entries of the product formed by summing out `v` now: its state count times its neighbours'.
// Stops multiplying once past `cap` (every node has at least 2 states, so a high-degree
// candidate costs at most about log2(cap) steps) and returns a value above `cap`.
std::size_t product_entries(const Dag& dag, std::size_t v, const std::set<std::size_t>& nbrs, std::size_t cap) {
  std::size_t entries = dag[v].state_count;
  if (entries > cap) return entries;
  for (auto u : nbrs) {
    const std::size_t card = dag[u].state_count;
    if (entries > cap / card) return cap == std::numeric_limits<std::size_t>::max() ? cap : cap + 1;
    entries *= card;
  }
  return entries;
}

FactorScope scope_of(const Dag& dag, std::size_t v, const std::set<std::size_t>& nbrs) {
  FactorScope scope;
  scope.vars.assign(nbrs.begin(), nbrs.end());
  scope.vars.insert(std::upper_bound(scope.vars.begin(), scope.vars.end(), v), v);
  for (auto u : scope.vars) scope.log10_entries += std::log10(static_cast<double>(dag[u].state_count));
  return scope;
}

// Greedy min-fill order over the interaction graph of the reduced factors, among the variables
// whose product stays within `cap` entries; `refused` is set when none does.
std::vector<std::size_t> min_fill_order(const Dag& dag, const std::vector<std::size_t>& factor_nodes,
                                        const std::vector<bool>& observed, std::optional<std::size_t> kept,
                                        std::size_t cap, std::optional<FactorScope>& refused) {
  std::vector<std::set<std::size_t>> adjacent(dag.size());
  std::set<std::size_t> remaining;
  for (auto n : factor_nodes) {
    std::vector<std::size_t> scope;
    if (!observed[n]) scope.push_back(n);
    for (auto p : dag[n].parents)
      if (!observed[p]) scope.push_back(p);
    for (auto u : scope) {
      if (!kept || u != *kept) remaining.insert(u);
      for (auto v : scope)
        if (u != v) adjacent[u].insert(v);
    }
  }
  std::vector<std::size_t> order;
  while (!remaining.empty()) {
    std::optional<std::size_t> best;
    std::size_t best_fill = std::numeric_limits<std::size_t>::max();
    double best_weight = std::numeric_limits<double>::infinity();
    for (auto v : remaining) {
      if (product_entries(dag, v, adjacent[v], cap) > cap) continue;
      const std::vector<std::size_t> nbrs(adjacent[v].begin(), adjacent[v].end());
      std::size_t fill = 0;
      for (std::size_t i = 0; i < nbrs.size(); ++i)
        for (std::size_t j = i + 1; j < nbrs.size(); ++j)
          if (!adjacent[nbrs[i]].count(nbrs[j])) ++fill;
      double weight = static_cast<double>(dag[v].state_count);
      for (auto u : nbrs) weight *= static_cast<double>(dag[u].state_count);
      if (fill < best_fill || (fill == best_fill && weight < best_weight)) {
        best = v;
        best_fill = fill;
        best_weight = weight;
      }
    }
    if (!best) {  // every choice is over the cap: name the least of them
      for (auto v : remaining) {
        FactorScope scope = scope_of(dag, v, adjacent[v]);
        if (!refused || scope.log10_entries < refused->log10_entries) refused = std::move(scope);
      }
      return order;
    }
    const std::vector<std::size_t> nbrs(adjacent[*best].begin(), adjacent[*best].end());
    for (auto u : nbrs) {
      adjacent[u].erase(*best);
      for (auto w : nbrs)
        if (u != w) adjacent[u].insert(w);
    }
    adjacent[*best].clear();
    remaining.erase(*best);
    order.push_back(*best);
  }
  return order;
}

}  // namespace

std::size_t row_count(const Dag& dag, std::size_t node) {
  std::size_t rows = 1;
  for (auto p : dag[node].parents) rows *= dag[p].state_count;
  return rows;
}

double log10_cpt_entries(const Dag& dag, std::size_t node) {
  double entries = std::log10(static_cast<double>(dag[node].state_count));
  for (auto p : dag[node].parents) entries += std::log10(static_cast<double>(dag[p].state_count));
  return entries;
}

EliminationPlan plan_elimination(const Dag& dag, std::span<const Finding> findings, std::optional<std::size_t> kept,
                                 std::size_t max_factor_entries) {
  EliminationPlan plan;
  plan.findings.assign(findings.begin(), findings.end());
  plan.kept = kept;
  const auto relevant = relevant_nodes(dag, findings, kept);
  for (std::size_t n = 0; n < dag.size(); ++n) (relevant[n] ? plan.factor_nodes : plan.barren_nodes).push_back(n);
  std::vector<bool> observed(dag.size(), false);
  for (const auto& f : findings) observed[f.node] = true;
  plan.order = min_fill_order(dag, plan.factor_nodes, observed, kept, max_factor_entries, plan.refused);
  return plan;
}

EliminationResult run_elimination(const EliminationPlan& plan, const Dag& dag, const Log10Cpts& cpts) {
  if (plan.refused) throw std::logic_error("run_elimination: the plan was refused (a factor over the limit)");
  EliminationResult result;
  std::vector<Factor> pool;
  pool.reserve(plan.factor_nodes.size());
  for (auto n : plan.factor_nodes) {
    Factor phi;
    for (auto p : dag[n].parents) {
      phi.vars.push_back(p);
      phi.cards.push_back(dag[p].state_count);
    }
    phi.vars.push_back(n);
    phi.cards.push_back(dag[n].state_count);
    phi.log10_values = cpts[n];
    result.largest_factor_size = std::max(result.largest_factor_size, phi.size());
    for (const auto& f : plan.findings) phi = reduce(phi, f.node, f.state);
    pool.push_back(std::move(phi));
  }
  for (auto var : plan.order) {
    Factor product{{}, {}, {0.0}};
    std::vector<Factor> rest;
    rest.reserve(pool.size());
    for (auto& phi : pool) {
      if (phi.position(var) < phi.vars.size())
        product = multiply(product, phi);
      else
        rest.push_back(std::move(phi));
    }
    result.largest_factor_size = std::max(result.largest_factor_size, product.size());
    rest.push_back(sum_out(product, var));
    pool = std::move(rest);
  }
  // What is left is over the kept variable only (or over nothing).
  Factor product{{}, {}, {0.0}};
  if (plan.kept) product = Factor{{*plan.kept}, {dag[*plan.kept].state_count},
                                   std::vector<double>(dag[*plan.kept].state_count, 0.0)};
  for (const auto& phi : pool) product = multiply(product, phi);
  result.largest_factor_size = std::max(result.largest_factor_size, product.size());
  result.log10_values = std::move(product.log10_values);
  return result;
}

}  // namespace counterpoise::models::network
