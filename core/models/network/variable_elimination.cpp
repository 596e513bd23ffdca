#include "core/models/network/variable_elimination.hpp"

#include <algorithm>
#include <limits>
#include <set>

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

// Greedy min-fill order over the interaction graph of the reduced factors.
std::vector<std::size_t> min_fill_order(const Dag& dag, const std::vector<std::size_t>& factor_nodes,
                                        const std::vector<bool>& observed, std::optional<std::size_t> kept) {
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
    std::size_t best = *remaining.begin();
    std::size_t best_fill = std::numeric_limits<std::size_t>::max();
    double best_weight = std::numeric_limits<double>::infinity();
    for (auto v : remaining) {
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
    const std::vector<std::size_t> nbrs(adjacent[best].begin(), adjacent[best].end());
    for (auto u : nbrs) {
      adjacent[u].erase(best);
      for (auto w : nbrs)
        if (u != w) adjacent[u].insert(w);
    }
    adjacent[best].clear();
    remaining.erase(best);
    order.push_back(best);
  }
  return order;
}

// Entries of the largest table that eliminating in `order` forms, found on the tables' variable
// sets alone, as run_elimination forms them (reduced CPTs, then one product per summed variable).
double largest_table_entries(const Dag& dag, const std::vector<std::size_t>& factor_nodes,
                             const std::vector<bool>& observed, const std::vector<std::size_t>& order,
                             std::optional<std::size_t> kept) {
  const auto entries = [&](const std::set<std::size_t>& scope) {
    double n = 1;
    for (auto v : scope) n *= static_cast<double>(dag[v].state_count);
    return n;
  };
  double largest = 1;
  std::vector<std::set<std::size_t>> pool;
  for (auto n : factor_nodes) {
    std::set<std::size_t> full(dag[n].parents.begin(), dag[n].parents.end());
    full.insert(n);
    largest = std::max(largest, entries(full));  // the CPT before the findings reduce it
    std::set<std::size_t> scope;
    for (auto v : full)
      if (!observed[v]) scope.insert(v);
    pool.push_back(std::move(scope));
  }
  for (auto var : order) {
    std::set<std::size_t> product;
    std::vector<std::set<std::size_t>> rest;
    for (auto& scope : pool) {
      if (scope.count(var)) product.insert(scope.begin(), scope.end());
      else rest.push_back(std::move(scope));
    }
    largest = std::max(largest, entries(product));
    product.erase(var);
    rest.push_back(std::move(product));
    pool = std::move(rest);
  }
  std::set<std::size_t> last;
  if (kept) last.insert(*kept);
  for (const auto& scope : pool) last.insert(scope.begin(), scope.end());
  return std::max(largest, entries(last));
}

}  // namespace

std::size_t row_count(const Dag& dag, std::size_t node) {
  std::size_t rows = 1;
  for (auto p : dag[node].parents) rows *= dag[p].state_count;
  return rows;
}

EliminationPlan plan_elimination(const Dag& dag, std::span<const Finding> findings, std::optional<std::size_t> kept) {
  EliminationPlan plan;
  plan.findings.assign(findings.begin(), findings.end());
  plan.kept = kept;
  const auto relevant = relevant_nodes(dag, findings, kept);
  for (std::size_t n = 0; n < dag.size(); ++n) (relevant[n] ? plan.factor_nodes : plan.barren_nodes).push_back(n);
  std::vector<bool> observed(dag.size(), false);
  for (const auto& f : findings) observed[f.node] = true;
  plan.order = min_fill_order(dag, plan.factor_nodes, observed, kept);
  plan.largest_factor_entries = largest_table_entries(dag, plan.factor_nodes, observed, plan.order, kept);
  return plan;
}

EliminationResult run_elimination(const EliminationPlan& plan, const Dag& dag, const Log10Cpts& cpts) {
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
