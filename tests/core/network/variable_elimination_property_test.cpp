// Property test: variable elimination agrees with brute-force enumeration of the joint
// distribution (the definition of a Bayesian network's joint as the product of its CPTs).
#include <catch2/catch.hpp>

#include <cmath>
#include <iomanip>
#include <random>
#include <sstream>

#include "core/models/network/factor.hpp"
#include "network_test_support.hpp"

using nlohmann::json;

namespace {

struct RandomNetwork {
  std::vector<std::size_t> cards;
  std::vector<std::vector<std::size_t>> parents;
  std::vector<std::vector<double>> cpts;  // rows × states, first parent slowest
  std::size_t proposition = 0;
  std::vector<std::pair<std::size_t, std::size_t>> findings;
};

RandomNetwork make_random(std::mt19937_64& rng, std::size_t max_nodes, std::size_t max_states) {
  RandomNetwork net;
  std::uniform_int_distribution<std::size_t> node_count(2, max_nodes);
  std::uniform_int_distribution<std::size_t> state_count(2, max_states);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  const std::size_t n = node_count(rng);
  for (std::size_t i = 0; i < n; ++i) {
    net.cards.push_back(state_count(rng));
    std::vector<std::size_t> parents;
    for (std::size_t j = 0; j < i; ++j)
      if (parents.size() < 3 && unit(rng) < 0.4) parents.push_back(j);
    std::shuffle(parents.begin(), parents.end(), rng);  // parent order need not follow node order
    std::size_t rows = 1;
    for (auto p : parents) rows *= net.cards[p];
    std::vector<double> cpt;
    for (std::size_t r = 0; r < rows; ++r) {
      std::vector<double> row;
      double sum = 0.0;
      for (std::size_t s = 0; s < net.cards[i]; ++s) {
        row.push_back(0.01 + unit(rng));
        sum += row.back();
      }
      // The last entry takes the rest so the row sums to 1 within the reader's tolerance.
      double rest = 1.0;
      for (std::size_t s = 0; s + 1 < row.size(); ++s) {
        row[s] /= sum;
        rest -= row[s];
      }
      row.back() = rest;
      cpt.insert(cpt.end(), row.begin(), row.end());
    }
    net.parents.push_back(parents);
    net.cpts.push_back(cpt);
  }
  net.proposition = std::uniform_int_distribution<std::size_t>(0, n - 1)(rng);
  for (std::size_t i = 0; i < n; ++i)
    if (i != net.proposition && unit(rng) < 0.5)
      net.findings.emplace_back(i, std::uniform_int_distribution<std::size_t>(0, net.cards[i] - 1)(rng));
  if (net.findings.empty()) {
    const std::size_t i = net.proposition == 0 ? 1 : 0;
    net.findings.emplace_back(i, 0);
  }
  return net;
}

json to_case_json(const RandomNetwork& net) {
  json nodes = json::array();
  for (std::size_t i = 0; i < net.cards.size(); ++i) {
    json states = json::array(), parents = json::array(), cpt = json::array();
    for (std::size_t s = 0; s < net.cards[i]; ++s) states.push_back("s" + std::to_string(s));
    for (auto p : net.parents[i]) parents.push_back("X" + std::to_string(p));
    for (std::size_t r = 0; r * net.cards[i] < net.cpts[i].size(); ++r)
      cpt.push_back(std::vector<double>(net.cpts[i].begin() + static_cast<long>(r * net.cards[i]),
                                        net.cpts[i].begin() + static_cast<long>((r + 1) * net.cards[i])));
    nodes.push_back({{"name", "X" + std::to_string(i)}, {"states", states}, {"parents", parents}, {"cpt", cpt}});
  }
  json observed = json::object();
  for (const auto& [node, state] : net.findings) observed["X" + std::to_string(node)] = "s" + std::to_string(state);
  return {{"id", "R"}, {"model", "network"}, {"nodes", nodes}, {"observed", observed},
          {"proposition", {{"node", "X" + std::to_string(net.proposition)}, {"hp", "s0"}, {"hd", "s1"}}}};
}

// P(findings | H = s0) and P(findings | H = s1) by summing the product of CPT entries over
// every joint assignment (the definition of the network's joint distribution).
std::pair<double, double> brute_force(const RandomNetwork& net) {
  const std::size_t n = net.cards.size();
  std::vector<std::size_t> x(n, 0);
  double joint[2] = {0, 0}, prior[2] = {0, 0};
  while (true) {
    double p = 1.0;
    for (std::size_t i = 0; i < n; ++i) {
      std::size_t row = 0;
      for (auto q : net.parents[i]) row = row * net.cards[q] + x[q];
      p *= net.cpts[i][row * net.cards[i] + x[i]];
    }
    const std::size_t h = x[net.proposition];
    if (h < 2) {
      prior[h] += p;
      bool consistent = true;
      for (const auto& [node, state] : net.findings) consistent = consistent && x[node] == state;
      if (consistent) joint[h] += p;
    }
    std::size_t i = 0;
    while (i < n && ++x[i] == net.cards[i]) x[i++] = 0;
    if (i == n) break;
  }
  return {joint[0] / prior[0], joint[1] / prior[1]};
}

void check_against_brute_force(std::uint64_t seed, std::size_t max_nodes, std::size_t max_states) {
  std::mt19937_64 rng(seed);
  const RandomNetwork net = make_random(rng, max_nodes, max_states);
  const auto [p_hp, p_hd] = brute_force(net);
  const auto result = network_test::read_model(to_case_json(net))->evaluate();
  const double ve_hp = std::pow(10.0, *result.log10_p_given_hp);
  const double ve_hd = std::pow(10.0, *result.log10_p_given_hd);
  std::ostringstream info;
  info << std::setprecision(17) << "seed " << seed << " nodes " << net.cards.size() << " VE " << ve_hp << ", "
       << ve_hd << " enumeration " << p_hp << ", " << p_hd;
  INFO(info.str());
  // 1e-12 relative: the brute force adds up to 4096 products in plain doubles, VE works in log10.
  CHECK(std::fabs(ve_hp - p_hp) <= 1e-12 * p_hp);
  CHECK(std::fabs(ve_hd - p_hd) <= 1e-12 * p_hd);
}

}  // namespace

TEST_CASE("VE equals enumeration on random binary networks of up to 12 nodes") {
  const auto seed = GENERATE(range<std::uint64_t>(1, 101));
  check_against_brute_force(seed, 12, 2);
}

TEST_CASE("VE equals enumeration on random networks of up to 8 nodes with up to 4 states") {
  const auto seed = GENERATE(range<std::uint64_t>(1001, 1051));
  check_against_brute_force(seed, 8, 4);
}

TEST_CASE("factor product and sum-out on a hand example") {
  using namespace counterpoise::models::network;
  // phi1(A, B) = [1, 2, 3, 4] (A slowest), phi2(B, C) = [5, 6, 7, 8]; by hand:
  // sum_B phi1(A,B) phi2(B,C) = A=0: (1·5 + 2·7, 1·6 + 2·8) = (19, 22); A=1: (3·5 + 4·7, 3·6 + 4·8) = (43, 50).
  auto lg = [](std::vector<double> v) {
    for (auto& x : v) x = std::log10(x);
    return v;
  };
  const Factor a{{0, 1}, {2, 2}, lg({1, 2, 3, 4})};
  const Factor b{{1, 2}, {2, 2}, lg({5, 6, 7, 8})};
  const Factor product = multiply(a, b);
  REQUIRE(product.vars == std::vector<std::size_t>{0, 1, 2});
  const Factor summed = sum_out(product, 1);
  REQUIRE(summed.vars == std::vector<std::size_t>{0, 2});
  const std::vector<double> expected{19, 22, 43, 50};
  for (std::size_t i = 0; i < 4; ++i) CHECK(std::pow(10.0, summed.log10_values[i]) == Approx(expected[i]).epsilon(1e-14));
  const Factor reduced = reduce(a, 0, 1);  // phi1(A = 1, B) = [3, 4]
  CHECK(std::pow(10.0, reduced.log10_values[0]) == Approx(3.0).epsilon(1e-15));
  CHECK(std::pow(10.0, reduced.log10_values[1]) == Approx(4.0).epsilon(1e-15));
}
