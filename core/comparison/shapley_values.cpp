#include "core/comparison/shapley_values.hpp"

#include <algorithm>
#include <bit>
#include <numeric>
#include <random>
#include <stdexcept>
#include <unordered_map>

namespace counterpoise::comparison {

namespace {

// |S|! (n - |S| - 1)! / n! for |S| = 0 .. n-1, built as a ratio so no factorial overflows:
// w(0) = 1/n and w(s+1) = w(s) · (s+1) / (n-s-1).
std::vector<double> coalition_weights(int players) {
  std::vector<double> weights(static_cast<std::size_t>(players));
  if (players == 0) return weights;
  weights[0] = 1.0 / players;
  for (int s = 0; s + 1 < players; ++s) weights[s + 1] = weights[s] * (s + 1) / (players - s - 1);
  return weights;
}

// The game's values, each coalition computed once.
class CachedGame {
 public:
  explicit CachedGame(const CoalitionValue& value) : value_(value) {}
  double operator()(std::uint64_t mask) {
    const auto found = cache_.find(mask);
    if (found != cache_.end()) return found->second;
    const double v = value_(mask);
    cache_.emplace(mask, v);
    return v;
  }

 private:
  const CoalitionValue& value_;
  std::unordered_map<std::uint64_t, double> cache_;
};

// Adds each player's marginal contribution along `order` to `sums`.
void add_marginals(const std::vector<int>& order, CachedGame& game, std::vector<double>& sums) {
  std::uint64_t mask = 0;
  double before = game(mask);
  for (const int player : order) {
    mask |= std::uint64_t{1} << player;
    const double after = game(mask);
    sums[static_cast<std::size_t>(player)] += after - before;
    before = after;
  }
}

}  // namespace

std::vector<double> exact_shapley_values(int players, const std::vector<double>& value_by_mask) {
  if (players < 0 || players > kExactShapleyPlayers)
    throw std::invalid_argument("exact Shapley values are computed for 0 to 12 players");
  const std::uint64_t coalitions = std::uint64_t{1} << players;
  if (value_by_mask.size() != coalitions)
    throw std::invalid_argument("the game needs one value per coalition (2^players)");
  const auto weights = coalition_weights(players);
  std::vector<double> values(static_cast<std::size_t>(players), 0.0);
  for (int i = 0; i < players; ++i) {
    const std::uint64_t bit = std::uint64_t{1} << i;
    double sum = 0.0;
    for (std::uint64_t mask = 0; mask < coalitions; ++mask) {
      if (mask & bit) continue;
      const int size = std::popcount(mask);
      sum += weights[static_cast<std::size_t>(size)] * (value_by_mask[mask | bit] - value_by_mask[mask]);
    }
    values[static_cast<std::size_t>(i)] = sum;
  }
  return values;
}

std::vector<double> sampled_shapley_values(int players, const CoalitionValue& value, int orders, std::uint64_t seed) {
  if (players < 0 || players > kMaxShapleyPlayers)
    throw std::invalid_argument("a game has 0 to 64 players");
  if (orders < 1) throw std::invalid_argument("at least one order must be sampled");
  CachedGame game(value);
  std::vector<double> sums(static_cast<std::size_t>(players), 0.0);
  std::vector<int> order(static_cast<std::size_t>(players));
  std::iota(order.begin(), order.end(), 0);
  std::mt19937_64 rng(seed);
  for (int k = 0; k < orders; ++k) {
    std::shuffle(order.begin(), order.end(), rng);
    add_marginals(order, game, sums);
    // The reverse order balances the estimate (antithetic orders); it costs little more, since
    // most of its coalitions are already known.
    std::vector<int> reversed(order.rbegin(), order.rend());
    add_marginals(reversed, game, sums);
  }
  for (double& s : sums) s /= 2.0 * orders;
  return sums;
}

ShapleyValues shapley_values(int players, const CoalitionValue& value) {
  if (players < 0 || players > kMaxShapleyPlayers) throw std::invalid_argument("a game has 0 to 64 players");
  if (players <= kExactShapleyPlayers) {
    std::vector<double> table(std::size_t{1} << players);
    for (std::uint64_t mask = 0; mask < table.size(); ++mask) table[mask] = value(mask);
    return ShapleyValues{exact_shapley_values(players, table), true, 0};
  }
  // A fixed seed: the same two versions give the same shares every time.
  constexpr std::uint64_t kOrderSeed = 20530101;
  return ShapleyValues{sampled_shapley_values(players, value, kSampledShapleyOrders, kOrderSeed), false,
                       kSampledShapleyOrders};
}

}  // namespace counterpoise::comparison
