// Benchmark of the network model: a 30-node network whose nodes have 2 to 4 states and up to 3
// parents (target: the point LR under 10 ms on one core), plus the one-way sensitivity table and
// 10,000 Monte Carlo draws with every row of the findings' parents uncertain. The network is
// generated from a fixed seed; its numbers mean nothing.
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <random>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/network/network_model.hpp"

using nlohmann::json;
using namespace counterpoise::models;
using Clock = std::chrono::steady_clock;

namespace {

double ms_since(Clock::time_point start) {
  return std::chrono::duration<double, std::milli>(Clock::now() - start).count();
}

json make_network(std::mt19937_64& rng, std::size_t nodes, bool uncertain) {
  std::uniform_int_distribution<std::size_t> states(2, 4);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::vector<std::size_t> cards;
  json list = json::array();
  json observed = json::object();
  for (std::size_t i = 0; i < nodes; ++i) {
    cards.push_back(i == 0 ? 2 : states(rng));
    json names = json::array(), parents = json::array(), cpt = json::array();
    for (std::size_t s = 0; s < cards[i]; ++s) names.push_back("s" + std::to_string(s));
    std::size_t rows = 1;
    // Parents among the previous 8 nodes: a long, locally dense network, like a case model.
    for (std::size_t j = i > 8 ? i - 8 : 0; j < i; ++j)
      if (parents.size() < 3 && unit(rng) < 0.35) {
        parents.push_back("X" + std::to_string(j));
        rows *= cards[j];
      }
    for (std::size_t r = 0; r < rows; ++r) {
      std::vector<double> row(cards[i]);
      double sum = 0.0;
      for (auto& p : row) sum += (p = 0.05 + unit(rng));
      double rest = 1.0;
      for (std::size_t s = 0; s + 1 < row.size(); ++s) rest -= (row[s] /= sum);
      row.back() = rest;
      if (uncertain && cards[i] == 2)
        cpt.push_back(json::array({json{{"beta", {row[0] * 50, row[1] * 50}}}, "complement"}));
      else if (uncertain)
        cpt.push_back(json{{"dirichlet", [&] {
                              std::vector<double> a;
                              for (double p : row) a.push_back(p * 50);
                              return a;
                            }()}});
      else
        cpt.push_back(row);
    }
    list.push_back({{"name", "X" + std::to_string(i)}, {"states", names}, {"parents", parents}, {"cpt", cpt}});
    if (i >= 20 && i % 2 == 0) observed["X" + std::to_string(i)] = "s0";
  }
  return {{"id", "B1"}, {"model", "network"}, {"nodes", list}, {"observed", observed},
          {"proposition", {{"node", "X0"}, {"hp", "s0"}, {"hd", "s1"}}}};
}

}  // namespace

int main() {
  std::mt19937_64 rng(30);
  const json point_item = make_network(rng, 30, false);
  std::mt19937_64 rng_u(30);
  const json uncertain_item = make_network(rng_u, 30, true);
  const ReadContext context{{}, {"B1", ""}};

  auto start = Clock::now();
  const auto model = std::dynamic_pointer_cast<const network::NetworkModel>(network::read_network_model(point_item, context));
  const double read_ms = ms_since(start);

  constexpr int kRuns = 200;
  std::vector<double> times;
  PointResult result;
  for (int i = 0; i < kRuns; ++i) {
    start = Clock::now();
    result = model->evaluate();
    times.push_back(ms_since(start));
  }
  std::sort(times.begin(), times.end());

  start = Clock::now();
  const auto rows = model->sensitivity();
  const double sensitivity_ms = ms_since(start);

  const auto uncertain = network::read_network_model(uncertain_item, context);
  std::vector<double> draws(10000);
  std::mt19937_64 draw_rng(2024);
  start = Clock::now();
  uncertain->draw_log10_lr(draw_rng, draws);
  const double draws_ms = ms_since(start);
  std::sort(draws.begin(), draws.end());

  std::printf("network: 30 nodes, %zu findings, largest factor %zu entries, %zu barren nodes\n",
              model->network().findings.size(), result.detail.at("largest_factor_size").get<std::size_t>(),
              result.detail.at("barren_nodes").size());
  std::printf("read + plan:            %8.3f ms\n", read_ms);
  std::printf("point LR (median of %d): %8.3f ms   (min %.3f, max %.3f; target < 10 ms)  log10 LR = %.6f\n", kRuns,
              times[times.size() / 2], times.front(), times.back(), result.lr.log10());
  std::printf("sensitivity, %zu entries: %8.1f ms\n", rows.size(), sensitivity_ms);
  std::printf("10,000 MC draws:        %8.1f ms   log10 LR 5/50/95 %%: %.4f %.4f %.4f\n", draws_ms,
              draws[draws.size() / 20], draws[draws.size() / 2], draws[draws.size() * 19 / 20]);
  return 0;
}
