// Shapley values (Shapley 1953, "A value for n-person games", Contributions to the Theory of
// Games II, Annals of Mathematics Studies 28, pp. 307-317): the value of player i is the average,
// over all n! orders in which the players join, of what i adds when it joins.
#include <algorithm>
#include <cmath>
#include <numeric>
#include <vector>

#include <catch2/catch.hpp>

#include "core/comparison/shapley_values.hpp"

using counterpoise::comparison::exact_shapley_values;
using counterpoise::comparison::sampled_shapley_values;
using counterpoise::comparison::shapley_values;

namespace {

// The definition itself, independently of the subset formula the code uses: every order of the
// players, each player's marginal contribution when it joins, averaged.
std::vector<double> shapley_by_orders(int players, const std::function<double(std::uint64_t)>& v) {
  std::vector<int> order(static_cast<std::size_t>(players));
  std::iota(order.begin(), order.end(), 0);
  std::vector<double> sums(order.size(), 0.0);
  int orders = 0;
  do {
    std::uint64_t mask = 0;
    for (int p : order) {
      const double before = v(mask);
      mask |= std::uint64_t{1} << p;
      sums[static_cast<std::size_t>(p)] += v(mask) - before;
    }
    ++orders;
  } while (std::next_permutation(order.begin(), order.end()));
  for (double& s : sums) s /= orders;
  return sums;
}

}  // namespace

TEST_CASE("the glove game: one left glove and two right gloves", "[comparison][shapley]") {
  // Player 0 holds a left glove, players 1 and 2 a right glove each; a coalition is worth 1 when it
  // can make a pair. Shapley values (2/3, 1/6, 1/6): player 0 completes a pair in 4 of the 6
  // orders, each right glove in 1 (common textbook example; e.g. Osborne & Rubinstein 1994,
  // A Course in Game Theory, ch. 14 — from memory for the chapter).
  const std::vector<double> table = {0, 0, 0, 1, 0, 1, 0, 1};  // v(mask): bit 0 and (bit 1 or bit 2)
  const auto values = exact_shapley_values(3, table);
  // Tolerance: a few rounding steps of weights 1/3 and 1/6.
  CHECK(values[0] == Approx(2.0 / 3.0).epsilon(1e-15));
  CHECK(values[1] == Approx(1.0 / 6.0).epsilon(1e-15));
  CHECK(values[2] == Approx(1.0 / 6.0).epsilon(1e-15));
}

TEST_CASE("a 3-input transfer LR: Shapley values agree with all 6 orders worked out", "[comparison][shapley]") {
  // The log10 LR of the transfer formula LR = t0 + P0 tn / (P1 Sn gamma) (Evett 1986 as in
  // core/models/transfer — from memory), with t0, tn and gamma changed (invented values); the
  // inputs interact, so the shares differ from the one-at-a-time effects.
  const double p0 = 0.6, p1 = 0.3, sn = 0.2;
  const double t0[2] = {0.1, 0.4}, tn[2] = {0.3, 0.05}, gamma[2] = {0.05, 0.5};
  const auto v = [&](std::uint64_t mask) {
    const int a = mask & 1 ? 1 : 0, b = mask & 2 ? 1 : 0, c = mask & 4 ? 1 : 0;
    return std::log10(t0[a] + p0 * tn[b] / (p1 * sn * gamma[c]));
  };
  std::vector<double> table(8);
  for (std::uint64_t m = 0; m < 8; ++m) table[m] = v(m);
  const auto values = exact_shapley_values(3, table);
  const auto expected = shapley_by_orders(3, v);
  for (int i = 0; i < 3; ++i) CHECK(values[static_cast<std::size_t>(i)] == Approx(expected[static_cast<std::size_t>(i)]).margin(1e-13));
  // Efficiency: the values add up to v(N) - v(∅) (Shapley 1953, axiom 2), to 1e-12.
  CHECK(std::abs(values[0] + values[1] + values[2] - (v(7) - v(0))) < 1e-12);
  // The interaction is real: t0's share is not its effect alone.
  CHECK(std::abs(values[0] - (v(1) - v(0))) > 0.01);
}

TEST_CASE("an additive game gives each player its own effect", "[comparison][shapley]") {
  // Shapley 1953: the value is additive, and a player's value in a one-player-matters game is
  // that player's worth; so for v(S) = sum of w_i over S, phi_i = w_i.
  const std::vector<double> w = {1.5, -0.25, 3.0, 0.0, -2.0};
  const auto v = [&](std::uint64_t mask) {
    double s = 0.0;
    for (std::size_t i = 0; i < w.size(); ++i) s += mask & (std::uint64_t{1} << i) ? w[i] : 0.0;
    return s;
  };
  const auto result = shapley_values(5, v);
  CHECK(result.exact);
  for (std::size_t i = 0; i < w.size(); ++i) CHECK(result.values[i] == Approx(w[i]).margin(1e-14));
}

TEST_CASE("beyond 12 players the values are sampled, still add up exactly", "[comparison][shapley]") {
  // 14 players, a game with interactions (a weighted majority plus a product term); the exact
  // values by the subset formula are computable here (2^14 coalitions), so the estimate is
  // checked against them.
  const int n = 14;
  const auto v = [&](std::uint64_t mask) {
    double weight = 0.0;
    for (int i = 0; i < n; ++i) weight += mask & (std::uint64_t{1} << i) ? (i + 1) : 0.0;
    const double pair = (mask & 1) && (mask & 2) ? 5.0 : 0.0;
    return std::log10(1.0 + weight) + pair;
  };
  const auto sampled = shapley_values(n, v);
  CHECK_FALSE(sampled.exact);
  CHECK(sampled.orders == counterpoise::comparison::kSampledShapleyOrders);
  double sum = 0.0;
  for (double x : sampled.values) sum += x;
  CHECK(std::abs(sum - (v((1u << n) - 1) - v(0))) < 1e-12);
  // The exact values by the same formula on 14 players, computed here through the 12-player
  // limit's formula by hand: weights |S|!(n-|S|-1)!/n!.
  std::vector<double> exact(static_cast<std::size_t>(n), 0.0);
  std::vector<double> weight(static_cast<std::size_t>(n));
  for (int s = 0; s < n; ++s) weight[static_cast<std::size_t>(s)] = std::exp(std::lgamma(s + 1) + std::lgamma(n - s) - std::lgamma(n + 1));
  for (std::uint64_t mask = 0; mask < (1u << n); ++mask)
    for (int i = 0; i < n; ++i)
      if (!(mask & (std::uint64_t{1} << i)))
        exact[static_cast<std::size_t>(i)] += weight[static_cast<std::size_t>(std::popcount(mask))] * (v(mask | (std::uint64_t{1} << i)) - v(mask));
  // Tolerance: 2 000 orders of a game whose marginals are at most 5.1; the pair players' shares
  // (about 2.5) are estimated to a few hundredths (several standard errors).
  for (int i = 0; i < n; ++i) CHECK(sampled.values[static_cast<std::size_t>(i)] == Approx(exact[static_cast<std::size_t>(i)]).margin(0.05));
}

TEST_CASE("Shapley values refuse a bad game", "[comparison][shapley]") {
  CHECK_THROWS_AS(exact_shapley_values(13, std::vector<double>(1u << 13)), std::invalid_argument);
  CHECK_THROWS_AS(exact_shapley_values(2, std::vector<double>(3)), std::invalid_argument);
  CHECK_THROWS_AS(sampled_shapley_values(65, [](std::uint64_t) { return 0.0; }, 10, 1), std::invalid_argument);
  CHECK_THROWS_AS(sampled_shapley_values(3, [](std::uint64_t) { return 0.0; }, 0, 1), std::invalid_argument);
}
